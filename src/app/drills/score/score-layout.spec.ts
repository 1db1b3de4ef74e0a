import { cursorBox, stepPosition, type ScoreLayout } from './score-layout';

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
