import {
  cursorBox,
  fitToWidth,
  positionAtPoint,
  stepPosition,
  systemBands,
  type ScoreLayout,
} from './score-layout';

const bars = [
  {
    bar: 1,
    beats: [
      { beat: 1, x: 100, width: 50 },
      { beat: 2, x: 150, width: 60 },
    ],
  },
  {
    bar: 2,
    beats: [
      { beat: 1, x: 300, width: 40 },
      { beat: 2, x: 340, width: 40 },
    ],
  },
];

describe('stepPosition', () => {
  it('steps beat by beat across bar lines and wraps around the loop', () => {
    expect(stepPosition(bars, { bar: 1, beat: 2 }, 1)).toEqual({ bar: 2, beat: 1 });
    expect(stepPosition(bars, { bar: 2, beat: 2 }, 1)).toEqual({ bar: 1, beat: 1 });
    expect(stepPosition(bars, { bar: 1, beat: 1 }, -1)).toEqual({ bar: 2, beat: 2 });
  });

  it('starts at the first beat going forwards and the last going back', () => {
    expect(stepPosition(bars, null, 1)).toEqual({ bar: 1, beat: 1 });
    expect(stepPosition(bars, null, -1)).toEqual({ bar: 2, beat: 2 });
  });
});

describe('cursorBox', () => {
  const layout: ScoreLayout = {
    width: 800,
    height: 300,
    bars: bars.map((b) => ({
      ...b,
      system: 0,
      x: 90,
      width: 300,
      topLineY: 100,
      bottomLineY: 140,
      systemTop: 0,
      systemBottom: 240,
    })),
  };

  it('covers the beat from above the tuplets to below the feet', () => {
    expect(cursorBox(layout, { bar: 2, beat: 1 })).toEqual({
      x: 300,
      y: 40,
      width: 40,
      height: 160,
    });
  });

  it('is null off the score', () => {
    expect(cursorBox(layout, { bar: 9, beat: 1 })).toBeNull();
    expect(cursorBox(layout, null)).toBeNull();
  });
});

describe('fitToWidth', () => {
  const barsEndingAt = (...rights: number[]) => rights.map((right) => ({ x: 0, width: right }));

  it('leaves a score that fits as it is', () => {
    expect(fitToWidth({ bars: barsEndingAt(300, 700) }, 800)).toEqual({
      contentWidth: 800,
      scale: 1,
    });
  });

  it('scales a bar that runs past the edge back inside the width', () => {
    // Rightmost bar line at 838, plus the 12 px margin: 850 drawn into 800.
    const fit = fitToWidth({ bars: barsEndingAt(400, 838) }, 800);
    expect(fit.contentWidth).toBe(850);
    expect(fit.scale).toBeCloseTo(800 / 850, 6);
    expect(fit.contentWidth * fit.scale).toBeCloseTo(800, 6);
  });

  it('never shrinks below the readable floor (the score scrolls instead)', () => {
    expect(fitToWidth({ bars: barsEndingAt(988) }, 360).scale).toBe(0.75);
  });
});

describe('positionAtPoint', () => {
  const layout = {
    bars: [
      { ...bars[0]!, x: 60, width: 240, systemTop: 20, systemBottom: 220 },
      { ...bars[1]!, x: 300, width: 100, systemTop: 20, systemBottom: 220 },
    ],
  };

  it('finds the beat under a click, bar by bar', () => {
    expect(positionAtPoint(layout, 120, 100)).toEqual({ bar: 1, beat: 1 });
    expect(positionAtPoint(layout, 205, 100)).toEqual({ bar: 1, beat: 2 });
    expect(positionAtPoint(layout, 345, 30)).toEqual({ bar: 2, beat: 2 });
  });

  it("gives the clef area to the bar's first beat and the room after the last beat to it", () => {
    expect(positionAtPoint(layout, 70, 100)).toEqual({ bar: 1, beat: 1 });
    expect(positionAtPoint(layout, 250, 100)).toEqual({ bar: 1, beat: 2 });
  });

  it('is null outside the staves (margins, the tension plots under a system)', () => {
    expect(positionAtPoint(layout, 30, 100)).toBeNull();
    expect(positionAtPoint(layout, 120, 230)).toBeNull();
    expect(positionAtPoint(layout, 120, 10)).toBeNull();
  });
});

describe('systemBands', () => {
  it('cuts the drawing into one strip per system that stack back without gaps', () => {
    const bands = systemBands({
      height: 700,
      bars: [
        { system: 0, systemTop: 40 },
        { system: 0, systemTop: 40 },
        { system: 1, systemTop: 340 },
        { system: 2, systemTop: 600 },
      ],
    });
    expect(bands).toEqual([
      { system: 0, top: 0, height: 340 },
      { system: 1, top: 340, height: 260 },
      { system: 2, top: 600, height: 100 },
    ]);
    expect(bands.reduce((sum, band) => sum + band.height, 0)).toBe(700);
  });

  it('is empty before anything is drawn', () => {
    expect(systemBands({ height: 0, bars: [] })).toEqual([]);
  });
});
