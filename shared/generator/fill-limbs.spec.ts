import fc from 'fast-check';
import { describe, expect, it } from 'vitest';
import { canonicalCard } from './canonical';
import { isHandVoice } from './drill';
import { createFillContext, initialFill, metricalStrength, variantOf } from './fill';
import { beatsOf, createGrid } from './grid';
import { collectObligations } from './obligations';
import { parseRuleCard } from './parse';
import { createRng } from './random';

/** Fast cards where a fill could easily outrun the limbs: up to 32nds at up to 300 BPM. */
const fastCard = fc.record({
  meter: fc.record({ beats: fc.integer({ min: 2, max: 5 }), unit: fc.constant(4) }),
  bars: fc.integer({ min: 1, max: 3 }),
  subdivision: fc.integer({ min: 4, max: 8 }),
  tempo: fc.integer({ min: 120, max: 300 }),
  voices: fc.constant(['kick', 'snare', 'hihat', 'tomHigh']),
  ostinato: fc.constant({ voice: 'hihat', slots: [0] }),
  density: fc.integer({ min: 5, max: 10 }).map((n) => n / 10),
  rules: fc.constant([{ kind: 'fillHoles', voices: ['snare', 'tomHigh'], ghost: 0.5, accent: 0 }]),
});

describe('fills within the limbs’ rates', () => {
  // Rates as docs/engine.md states them, recomputed here in seconds (not with the engine's
  // thresholds): one hand single strokes fewer than 8 a second (Fujii et al. 2009, see the
  // docs), so three hand strokes inside 1/8 s need a double; a foot never faster than 10 a
  // second, nor three in a row faster than 6 a second (common practice, from memory).
  it('never places a stroke the limbs cannot play beside the bar’s other notes', () => {
    fc.assert(
      fc.property(fastCard, fc.string({ maxLength: 6 }), fc.boolean(), (raw, seed, vary) => {
        const card = canonicalCard(parseRuleCard(raw));
        const grid = createGrid(card.bars, beatsOf(card.subdivision, card.meter.beats));
        const ctx = createFillContext(card, grid, collectObligations(card, grid));
        const rng = createRng(seed);
        const seconds = 60 / (card.tempo * (grid.beats[0] ?? 1));
        for (let bar = 0; bar < grid.bars; bar++) {
          let f = initialFill(ctx, bar, rng, 0.5);
          if (vary) f = variantOf(ctx, f, rng, 1);
          // Every stroke of the bar (obligations and fills), in seconds from the bar's start.
          const hands: number[] = [];
          const kicks: number[] = [];
          for (let i = 0; i < grid.slotsPerBar; i++) {
            const at = i * seconds;
            const voices = [
              ...(ctx.ob.cells[bar * grid.slotsPerBar + i] ?? []).map((h) => h.voice),
              ...f.fills.filter((h) => h.i === i).map((h) => h.voice),
            ];
            for (const v of voices) (isHandVoice(v) ? hands : kicks).push(at);
          }
          const eps = 1e-9;
          for (let k = 0; k + 2 < hands.length; k++)
            expect((hands[k + 2] ?? 0) - (hands[k] ?? 0)).toBeGreaterThan(1 / 8 - eps);
          for (let k = 0; k + 1 < kicks.length; k++)
            expect((kicks[k + 1] ?? 0) - (kicks[k] ?? 0)).toBeGreaterThanOrEqual(1 / 10 - eps);
          for (let k = 0; k + 2 < kicks.length; k++) {
            const fast1 = (kicks[k + 1] ?? 0) - (kicks[k] ?? 0) <= 1 / 6 + eps;
            const fast2 = (kicks[k + 2] ?? 0) - (kicks[k + 1] ?? 0) <= 1 / 6 + eps;
            expect(fast1 && fast2).toBe(false);
          }
        }
      }),
      { numRuns: 300, seed: 20261202 },
    );
  });
});

describe('metrical strength of the fill', () => {
  // common practice: in an odd or compound meter the first beat of each group carries the
  // weight (7/8 as 2+2+3 is felt "1 2 1 2 1 2 3"; 6/8 as two dotted-quarter beats).
  it('leans on the group beats of a grouped meter', () => {
    const seven = createGrid(1, [1, 1, 1, 1, 1, 1, 1]);
    expect(metricalStrength(seven, [2, 2, 3])).toEqual([0, 2, 1, 2, 1, 2, 2]);
    const six = createGrid(1, [2, 2, 2, 2, 2, 2]);
    expect(metricalStrength(six, [3, 3])).toEqual([0, 3, 2, 3, 2, 3, 1, 3, 2, 3, 2, 3]);
  });

  it('keeps beats, half beats and the rest in a plain meter', () => {
    expect(metricalStrength(createGrid(1, [4, 4]))).toEqual([0, 3, 2, 3, 1, 3, 2, 3]);
  });
});
