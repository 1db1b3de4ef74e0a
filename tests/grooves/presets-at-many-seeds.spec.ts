import { beforeAll, describe, expect, it } from 'vitest';
import { generateDrill, parseRuleCard, type Drill } from '../../shared/generator/index';
import { BUILT_IN_PRESETS } from '../../shared/generator/presets/index';
import { readCard } from '../oracle/card';
import { planOf } from '../oracle/plan';
import { cardReach, measuredTension } from '../oracle/tension';

/**
 * What a teacher handing out presets needs: every preset generates at any seed (no refusal in
 * 1 000 seeds), leaves room to vary, and hits its tension targets on the card's own scale.
 */

const SEEDS = Number(process.env['GROOVE_SEEDS'] ?? 1000);

// A card that an earlier engine refused at some seeds although it can hold: linear, a tension
// curve and a ride ostinato on a fine 8/8 grid.
const EIGHT_EIGHT_CARD = {
  meter: { beats: 8, unit: 8 },
  subdivision: 8,
  bars: 2,
  tempo: 20,
  voices: ['kick', 'snare', 'ride'],
  ostinato: { voice: 'ride', slots: [0, 2, 4, 6] },
  density: 1,
  rules: [
    { kind: 'linear', maxOverlaps: 0 },
    { kind: 'tension', curve: [0.1, 0.9] },
  ],
};

const CARDS: [string, unknown][] = [
  ...BUILT_IN_PRESETS.map((p): [string, unknown] => [p.id, p.card]),
  ['eight-eight-linear-tension', EIGHT_EIGHT_CARD],
];

/**
 * Targets are read on the card's reach as the independent oracle works it out (tests/oracle:
 * its own Longuet-Higgins & Lee measure, H. C. Longuet-Higgins and C. S. Lee, "The rhythmic
 * interpretation of monophonic music", Music Perception 1(4), 1984; its own reading of the slots
 * a card leaves open to fills; the exact range by its own dynamic programme, checked against
 * trying every pattern): each bar re-measured by the oracle, placed on that reach, 0 = the
 * calmest bar the card allows, 1 = the tensest.
 */
function relative(reach: { least: number; most: number }, tension: number): number {
  return reach.most > reach.least ? (tension - reach.least) / (reach.most - reach.least) : 0;
}

/** Each card's drills at SEEDS seeds, made once and shared by the describes below. */
const made = new Map<string, Drill[]>();
function drillsOf(id: string, raw: unknown): Drill[] {
  let drills = made.get(id);
  if (!drills) {
    const card = parseRuleCard(raw);
    drills = Array.from({ length: SEEDS }, (_, i) => generateDrill(card, `groove-${i}`));
    made.set(id, drills);
  }
  return drills;
}

describe.each(CARDS)('%s', (id, raw) => {
  let drills: Drill[] = [];
  beforeAll(() => {
    drills = drillsOf(id, raw);
  }, 120_000);

  it(`generates at every one of ${SEEDS} seeds and varies between them`, () => {
    expect(drills).toHaveLength(SEEDS);
    const distinct = new Set(drills.slice(0, 20).map((d) => JSON.stringify(d.bars)));
    expect(distinct.size).toBeGreaterThan(1);
    expect(drills[0]?.variety).toBe('many');
  });
});

const TENSION_CARDS = CARDS.filter(([, raw]) =>
  parseRuleCard(raw).rules.some((r) => r.kind === 'tension'),
);

describe.each(TENSION_CARDS)('%s, tension', (id, raw) => {
  const card = parseRuleCard(raw);
  const plan = planOf(readCard(raw, card));
  const curve = card.rules.flatMap((r) => (r.kind === 'tension' ? [r.curve] : []))[0] ?? [];
  const targetOf = (bar: number): number => curve[(bar - 1) % curve.length] ?? 0;
  let drills: Drill[] = [];
  beforeAll(() => {
    drills = drillsOf(id, raw);
  }, 120_000);

  it('reports the reach the oracle works out on its own', () => {
    const reach = cardReach(plan);
    expect(drills.length).toBe(SEEDS);
    for (const drill of drills) expect(drill.tensionReach).toEqual(reach);
  });

  it('keeps the mean distance from the tension targets ≤ 0.1, measured by the oracle', () => {
    const reach = cardReach(plan);
    expect(reach.most).toBeGreaterThan(reach.least);
    let total = 0;
    let count = 0;
    for (const drill of drills) {
      for (const bar of drill.bars) {
        const measured = measuredTension(plan, bar);
        expect(bar.tension, `seed ${drill.seed} bar ${bar.bar}`).toBe(measured);
        total += Math.abs(relative(reach, measured) - targetOf(bar.bar));
        count++;
      }
    }
    expect(count).toBe(SEEDS * card.bars);
    expect(total / count).toBeLessThanOrEqual(0.1);
  });

  // A target reads the same on the page as in the drill: each bar's tension on the measure's own
  // scale (what the drill page prints) sits, on average over the seeds, within 0.1 of the
  // target, so a card's tensest bar is not capped far below what the teacher asked (common
  // practice: a build a student can hear needs room to grow; issue 8's goal of 0.1).
  it('measures each bar within 0.1 of its target on the measure’s own scale, on average', () => {
    for (const b of Array.from({ length: card.bars }, (_, i) => i + 1)) {
      let sum = 0;
      for (const drill of drills) sum += measuredTension(plan, drill.bars[b - 1]!);
      const mean = sum / drills.length;
      expect(
        Math.abs(mean - targetOf(b)),
        `bar ${b}: mean ${mean.toFixed(3)} against target ${targetOf(b)}`,
      ).toBeLessThanOrEqual(0.1);
    }
  });

  // The curve is heard, not only measured: a build adds notes toward its peak and the release
  // thins out to a clear landing (common practice). Notes are the bar's hits besides the time.
  const notes = (bar: Drill['bars'][number]): number =>
    bar.hits.filter((h) => h.source !== 'ostinato').length;
  const bars = Array.from({ length: card.bars }, (_, i) => i + 1);
  const peak = bars.reduce((a, b) => (targetOf(b) > targetOf(a) ? b : a));
  const release = bars.reduce((a, b) => (targetOf(b) < targetOf(a) ? b : a));

  it('plays more notes in its tensest bar than in its calmest, at every seed', () => {
    expect(targetOf(peak)).toBeGreaterThan(targetOf(release));
    for (const drill of drills)
      expect(
        notes(drill.bars[peak - 1]!),
        `seed ${drill.seed}: bar ${peak} (target ${targetOf(peak)}) against bar ${release}`,
      ).toBeGreaterThan(notes(drill.bars[release - 1]!));
  });

  // The peak does not sound thinner than the build that leads to it (common practice: a build
  // keeps adding until it lets go). The search may miss at a few seeds; at most 1 in 12.
  it('plays no fewer notes at its peak than in the bar before it, at nearly every seed', () => {
    const before = peak > 1 ? peak - 1 : card.bars;
    if (targetOf(before) >= targetOf(peak)) return;
    const thinner = drills.filter(
      (drill) => notes(drill.bars[peak - 1]!) < notes(drill.bars[before - 1]!),
    );
    expect(
      thinner.length,
      `seeds ${thinner.map((d) => d.seed).join(', ')}: bar ${peak} thinner than bar ${before}`,
    ).toBeLessThanOrEqual(drills.length / 12);
  });

  it('grows busier with the target: the mean number of notes rises with each higher target', () => {
    const targets = [...new Set(bars.map(targetOf))].sort((a, b) => a - b);
    const mean = targets.map((t) => {
      const mine = bars.filter((b) => targetOf(b) === t);
      let sum = 0;
      for (const drill of drills) for (const b of mine) sum += notes(drill.bars[b - 1]!);
      return sum / (mine.length * drills.length);
    });
    for (let k = 1; k < mean.length; k++)
      expect(mean[k], `target ${targets[k]} against ${targets[k - 1]}`).toBeGreaterThan(
        mean[k - 1]!,
      );
  });
});

describe('a card with no room', () => {
  it('says it allows one drill', () => {
    const card = parseRuleCard({ ostinato: { voice: 'hihat', slots: [0, 2] }, density: 0 });
    const a = generateDrill(card, 'one');
    expect(a.variety).toBe('single');
    expect(JSON.stringify(generateDrill(card, 'two').bars)).toBe(JSON.stringify(a.bars));
  });
});
