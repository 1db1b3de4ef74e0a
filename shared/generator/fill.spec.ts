import fc from 'fast-check';
import { describe, expect, it } from 'vitest';
import { canonicalCard } from './canonical';
import { createFillContext, initialFill, variantOf, type FillContext } from './fill';
import { beatsOf, createGrid } from './grid';
import { collectObligations } from './obligations';
import { parseRuleCard } from './parse';
import { createRng } from './random';

function contextOf(raw: unknown): FillContext {
  const card = canonicalCard(parseRuleCard(raw));
  const grid = createGrid(card.bars, beatsOf(card.subdivision, card.meter.beats));
  return createFillContext(card, grid, collectObligations(card, grid));
}

const cardArb = fc.record({
  meter: fc.record({ beats: fc.integer({ min: 1, max: 7 }), unit: fc.constant(4) }),
  bars: fc.integer({ min: 1, max: 4 }),
  subdivision: fc.integer({ min: 1, max: 8 }),
  tempo: fc.integer({ min: 40, max: 300 }),
  voices: fc.constant(['kick', 'snare', 'hihat', 'tomFloor']),
  ostinato: fc.constant({ voice: 'hihat', slots: [0] }),
  density: fc.integer({ min: 0, max: 10 }).map((n) => n / 10),
  rules: fc.constantFrom(
    [],
    [{ kind: 'linear', maxOverlaps: 1 }],
    [{ kind: 'backbeat', voice: 'snare', beats: [1] }],
  ),
});

describe('fill', () => {
  // The pick weights per bar and lean are worked out once per drill and shared by every fill and
  // variant: a fill that wrote to them would skew every later draw of that drill.
  it('leaves the shared pick weights untouched, so a fill repeats exactly with the same seed', () => {
    fc.assert(
      fc.property(
        cardArb,
        fc.string({ maxLength: 8 }),
        fc.double({ min: 0, max: 1 }),
        (raw, seed, lean) => {
          const ctx = contextOf(raw);
          const first = Array.from({ length: ctx.grid.bars }, (_, bar) =>
            initialFill(ctx, bar, createRng(seed), lean),
          );
          const cached = ctx.weightsByLean.map((byLean) => [...(byLean.get(lean) ?? [])]);
          const rng = createRng(`${seed}-variants`);
          for (const f of first) for (let k = 0; k < 6; k++) variantOf(ctx, f, rng, k % 2);
          expect(ctx.weightsByLean.map((byLean) => [...(byLean.get(lean) ?? [])])).toEqual(cached);
          const again = Array.from({ length: ctx.grid.bars }, (_, bar) =>
            initialFill(ctx, bar, createRng(seed), lean),
          );
          expect(again).toEqual(first);
          const fresh = contextOf(raw);
          const elsewhere = Array.from({ length: ctx.grid.bars }, (_, bar) =>
            initialFill(fresh, bar, createRng(seed), lean),
          );
          expect(elsewhere).toEqual(first);
        },
      ),
      { numRuns: 200 },
    );
  });

  it('never changes the fill a variant is made from', () => {
    const ctx = contextOf({
      meter: { beats: 4, unit: 4 },
      bars: 2,
      subdivision: 4,
      tempo: 100,
      voices: ['kick', 'snare', 'hihat'],
      ostinato: { voice: 'hihat', slots: [0, 2] },
      density: 0.5,
      rules: [],
    });
    const rng = createRng('variants');
    const from = initialFill(ctx, 1, rng, 0.5);
    const before = JSON.stringify(from);
    const variants = Array.from({ length: 50 }, (_, k) => variantOf(ctx, from, rng, (k % 3) / 2));
    expect(JSON.stringify(from)).toBe(before);
    expect(variants.some((v) => JSON.stringify(v) !== before)).toBe(true);
  });
});
