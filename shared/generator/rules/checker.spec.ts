import { describe, expect, it } from 'vitest';
import {
  checkDrill,
  generateDrill,
  parseRuleCard,
  type Drill,
  type DrillBar,
  type DrillHit,
} from '../index';

const card = parseRuleCard({
  bars: 2,
  tempo: 100,
  voices: ['kick', 'snare', 'hihat', 'tomFloor'],
  ostinato: { voice: 'hihat', slots: [0, 2] },
  density: 0.4,
  rules: [
    { kind: 'backbeat', voice: 'snare', beats: [2, 4] },
    { kind: 'avoidDownbeat', voice: 'kick', resolveEvery: 2 },
    { kind: 'fillHoles', voices: ['snare'], ghost: 0.5, accent: 0 },
    { kind: 'tension', curve: [0.2, 0.8] },
  ],
});
const drill = generateDrill(card, 'checked');

/** The drill with bar 1's hits replaced. */
function withHits(hits: (list: DrillHit[]) => DrillHit[], bar = 0): Drill {
  const bars: DrillBar[] = drill.bars.map((b, i) =>
    i === bar ? { ...b, hits: hits(b.hits.slice()) } : b,
  );
  return { ...drill, bars };
}
const codes = (d: Drill) => checkDrill(card, d).map((v) => v.code);

describe('checkDrill', () => {
  it('accepts what the generator makes', () => {
    expect(checkDrill(card, drill)).toEqual([]);
  });

  it('catches unsorted and repeated hits', () => {
    expect(codes(withHits((h) => h.reverse()))).toContain('order');
    expect(codes(withHits((h) => [h[0]!, ...h]))).toContain('order');
  });

  it('catches hits outside the grid', () => {
    expect(codes(withHits((h) => [...h, { ...h[h.length - 1]!, beat: 4, slot: 4 }]))).toContain(
      'grid',
    );
  });

  it('catches a missing backbeat and a dishonest source', () => {
    expect(codes(withHits((h) => h.filter((x) => x.source !== 'backbeat')))).toContain('backbeat');
    expect(
      codes(
        withHits((h) => h.map((x) => (x.source === 'backbeat' ? { ...x, source: 'fill' } : x))),
      ),
    ).toContain('backbeat');
  });

  it('catches a kick on an avoided downbeat', () => {
    const kick: DrillHit = {
      beat: 1,
      slot: 0,
      voice: 'kick',
      dynamic: 'normal',
      hand: null,
      source: 'fill',
    };
    const d = withHits(
      (h) =>
        [...h, kick].sort(
          (a, b) => a.beat - b.beat || a.slot - b.slot || (a.voice < b.voice ? -1 : 1),
        ),
      1,
    );
    expect(codes(d)).toContain('avoidDownbeat');
  });

  it('catches one hand on two voices, three hands, and feet with hands', () => {
    const same = withHits((h) =>
      h.map((x) => (x.beat === 2 && x.slot === 0 && x.hand ? { ...x, hand: 'R' } : x)),
    );
    expect(codes(same)).toContain('hands');
    const tom: DrillHit = {
      beat: 2,
      slot: 0,
      voice: 'tomFloor',
      dynamic: 'normal',
      hand: 'R',
      source: 'fill',
    };
    const three = withHits((h) =>
      [...h, tom].sort(
        (a, b) => a.beat - b.beat || a.slot - b.slot || (a.voice < b.voice ? -1 : 1),
      ),
    );
    expect(codes(three)).toContain('hands');
    expect(
      codes(withHits((h) => h.map((x) => (x.voice === 'kick' ? { ...x, hand: 'R' } : x)))),
    ).toContain('hands');
  });

  it('catches one hand playing faster than the single-hand limit', () => {
    const fast = parseRuleCard({
      tempo: 240,
      bars: 1,
      voices: ['snare'],
      density: 0,
      rules: [
        { kind: 'backbeat', voice: 'snare', beats: [1, 2, 3, 4] },
        { kind: 'backbeat', voice: 'snare', beats: [1, 2, 3, 4], shift: 1 },
      ],
    });
    const d = generateDrill(fast, 'fast');
    expect(checkDrill(fast, d)).toEqual([]);
    const oneHand = {
      ...d,
      bars: d.bars.map((b) => ({ ...b, hits: b.hits.map((x) => ({ ...x, hand: 'R' as const })) })),
    };
    expect(checkDrill(fast, oneHand).map((v) => v.code)).toContain('hands');
  });

  it('catches a wrong stored tension and a broken rank order', () => {
    const wrong = { ...drill, bars: drill.bars.map((b) => ({ ...b, tension: b.tension + 0.5 })) };
    expect(codes(wrong)).toContain('tension');
    const flipped = {
      ...drill,
      bars: [drill.bars[1]!, drill.bars[0]!].map((b, i) => ({ ...b, bar: i + 1 })),
    };
    expect(
      checkDrill(card, flipped).some((v) => v.code === 'tension' && /less tense/.test(v.message)),
    ).toBe(true);
  });

  it('catches a wrong share of ghost notes', () => {
    const ghostly = parseRuleCard({
      bars: 1,
      voices: ['snare', 'hihat'],
      ostinato: { voice: 'hihat', slots: [0, 2] },
      density: 1,
      rules: [{ kind: 'fillHoles', voices: ['snare'], ghost: 0.5, accent: 0 }],
    });
    const d = generateDrill(ghostly, 'ghost');
    expect(
      d.bars[0]!.hits.filter((x) => x.source === 'fill' && x.dynamic === 'ghost'),
    ).toHaveLength(4);
    const loud = {
      ...d,
      bars: d.bars.map((b) => ({
        ...b,
        hits: b.hits.map((x) => ({ ...x, dynamic: 'accent' as const })),
      })),
    };
    expect(checkDrill(ghostly, loud).map((v) => v.code)).toContain('fillHoles');
  });
});

describe('checkDrill: the fill leaves its quiet places empty', () => {
  it('catches a fill kick on the beat an early backbeat left', () => {
    const early = parseRuleCard({
      bars: 1,
      tempo: 80,
      voices: ['kick', 'snare', 'hihat'],
      ostinato: { voice: 'hihat', slots: [0, 2] },
      density: 0.25,
      rules: [{ kind: 'backbeat', voice: 'snare', beats: [2, 4], shift: -1 }],
    });
    const made = generateDrill(early, 'quiet');
    expect(checkDrill(early, made)).toEqual([]);
    const bar = made.bars[0]!;
    expect(bar.hits.some((h) => h.beat === 2 && h.slot === 0 && h.voice === 'kick')).toBe(false);
    const kick: DrillHit = {
      beat: 2,
      slot: 0,
      voice: 'kick',
      dynamic: 'normal',
      hand: null,
      source: 'fill',
    };
    const hits = [...bar.hits, kick].sort((a, b) => a.beat - b.beat || a.slot - b.slot);
    const broken = { ...made, bars: [{ ...bar, hits }] };
    const found = checkDrill(early, broken).filter((v) => v.message.includes('moved backbeat'));
    expect(found.length).toBe(1);
  });
});

describe('checkDrill: busy feet', () => {
  it('catches a fill that gives the kick three notes within a beat', () => {
    const plain = parseRuleCard({
      bars: 1,
      tempo: 80,
      voices: ['kick', 'snare', 'hihat'],
      ostinato: { voice: 'hihat', slots: [0, 2] },
      density: 0,
      rules: [{ kind: 'backbeat', voice: 'snare', beats: [2, 4] }],
    });
    const made = generateDrill(plain, 'feet');
    expect(checkDrill(plain, made)).toEqual([]);
    const bar = made.bars[0]!;
    // Beat 1 holds the anchor kick; the fill adds the "e" and the "&": 1-e-& on one foot.
    const fill = (slot: number): DrillHit => ({
      beat: 1,
      slot,
      voice: 'kick',
      dynamic: 'normal',
      hand: null,
      source: 'fill',
    });
    const hits = [...bar.hits, fill(1), fill(2)].sort(
      (a, b) => a.beat - b.beat || a.slot - b.slot || a.voice.localeCompare(b.voice),
    );
    const found = checkDrill(plain, { ...made, bars: [{ ...bar, hits }] });
    expect(found.filter((v) => v.code === 'feet' && v.message.includes('three notes'))).not.toEqual(
      [],
    );
  });
});

describe('checkDrill: fill steps', () => {
  it('catches a fill kick between its steps', () => {
    const eighths = parseRuleCard({
      bars: 2,
      tempo: 80,
      voices: ['kick', 'snare', 'hihat'],
      ostinato: { voice: 'hihat', slots: [0, 2] },
      fillStep: { kick: 2 },
      density: 0.6,
      rules: [{ kind: 'backbeat', voice: 'snare', beats: [2, 4] }],
    });
    const made = generateDrill(eighths, 'steps');
    expect(checkDrill(eighths, made)).toEqual([]);
    const bar = made.bars[0]!;
    const beat = 3;
    const kick: DrillHit = {
      beat,
      slot: 1,
      voice: 'kick',
      dynamic: 'normal',
      hand: null,
      source: 'fill',
    };
    const hits = [...bar.hits.filter((h) => !(h.beat === beat && h.slot === 1)), kick].sort(
      (a, b) => a.beat - b.beat || a.slot - b.slot || (a.voice < b.voice ? -1 : 1),
    );
    const broken = { ...made, bars: [{ ...bar, hits }, ...made.bars.slice(1)] };
    const found = checkDrill(eighths, broken).filter((v) => v.message.includes('fill steps'));
    expect(found.length).toBe(1);
  });

  it('refuses a step for a voice the card does not play', () => {
    expect(() =>
      parseRuleCard({ voices: ['kick', 'snare', 'hihat'], fillStep: { tomFloor: 2 } }),
    ).toThrow(/fill steps name the floor tom/);
    expect(() => parseRuleCard({ fillStep: { kick: 0 } })).toThrow(/fill step must be between/i);
  });
});
