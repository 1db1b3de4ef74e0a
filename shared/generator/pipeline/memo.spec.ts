import fc from 'fast-check';
import { afterEach, describe, expect, it } from 'vitest';
import type { DrillBar } from '../drill';
import { generateDrill, parseRuleCard } from '../index';
import { BUILT_IN_PRESETS } from '../presets';
import { phraseVaries } from '../rules/phrase';
import { cardArb } from '../testing/cards';
import { frame } from './frame';
import { keptProofs, useProofMemo } from './memo';
import { place } from './place';
import { prove } from './prove';

/** The drill as JSON, or the refusal as its class, message and details. */
function outcome(raw: unknown, seed: string, keep?: readonly DrillBar[]): string {
  try {
    return JSON.stringify(generateDrill(parseRuleCard(raw), seed, keep ? { keep } : {}));
  } catch (error) {
    const e = error as Error & { issues?: unknown; rules?: unknown };
    return `${e.constructor.name}: ${e.message} ${JSON.stringify(e.issues ?? e.rules ?? null)}`;
  }
}

/** Everything a value holds, Maps, Sets and typed arrays included (the fill's pick weights left out). */
function snapshot(value: unknown): unknown {
  if (typeof value === 'function') return 'function';
  if (value === null || typeof value !== 'object') return value;
  if (ArrayBuffer.isView(value)) return ['typed', Array.from(value as Uint8Array)];
  if (value instanceof Map) return ['map', [...value].map(([k, v]) => [k, snapshot(v)])];
  if (value instanceof Set) return ['set', [...value].map(snapshot)];
  if (Array.isArray(value)) return value.map(snapshot);
  return Object.fromEntries(
    Object.entries(value)
      .filter(([k]) => k !== 'weightsByLean')
      .map(([k, v]) => [k, snapshot(v)]),
  );
}

/** Freezes every plain object and array reachable (Maps, Sets and typed arrays cannot be). */
function deepFreeze(value: unknown, seen = new Set<object>()): void {
  if (value === null || typeof value !== 'object' || seen.has(value)) return;
  seen.add(value);
  if (ArrayBuffer.isView(value)) return;
  if (value instanceof Map || value instanceof Set) {
    for (const v of value.values()) deepFreeze(v, seen);
    return;
  }
  Object.freeze(value);
  for (const v of Object.values(value)) deepFreeze(v, seen);
}

const randomCards = fc.sample(cardArb, { numRuns: 24, seed: 20261203 });
const cards: unknown[] = [...BUILT_IN_PRESETS.map((p) => p.card), ...randomCards];
const SEEDS = ['a', 'b', 'c'];

describe('the proof memo', () => {
  afterEach(() => useProofMemo(true));

  it('gives byte-identical drills and refusals in any order of calls, kept or not', () => {
    useProofMemo(false);
    const fresh = cards.map((card) => SEEDS.map((seed) => outcome(card, seed)));
    useProofMemo(true);
    // Seed by seed, the cards backwards: more cards than the memo keeps, so some are let go.
    const byName = cards.map(() => SEEDS.map(() => ''));
    for (let s = SEEDS.length - 1; s >= 0; s--)
      for (let c = cards.length - 1; c >= 0; c--)
        byName[c]![s] = outcome(cards[c], SEEDS[s] as string);
    expect(byName).toEqual(fresh);
    // Card by card, each seed twice in a row: the second from the memo.
    const again = cards.map((card) =>
      SEEDS.map((seed) => (outcome(card, seed), outcome(card, seed))),
    );
    expect(again).toEqual(fresh);
    expect(keptProofs().length).toBeGreaterThan(0);
    expect(keptProofs().length).toBeLessThanOrEqual(8);
  });

  it('keeps kept bars apart, and refuses a kept bar that does not fit every time', () => {
    const preset = BUILT_IN_PRESETS.find((p) => p.id === 'tension-and-release')!.card;
    const base = generateDrill(parseRuleCard(preset), 'base');
    const keeps: DrillBar[][] = [
      [],
      [base.bars[0]!],
      [base.bars[0]!, base.bars[2]!],
      [{ ...base.bars[0]!, tension: Number.NaN }],
      [{ ...base.bars[1]!, bar: 1 }],
    ];
    useProofMemo(false);
    const fresh = keeps.map((keep) => SEEDS.map((seed) => outcome(preset, seed, keep)));
    useProofMemo(true);
    const memo = keeps.map((keep) => SEEDS.map((seed) => outcome(preset, seed, keep)));
    expect(memo).toEqual(fresh);
    expect(new Set(memo.map((row) => row[0])).size).toBeGreaterThan(2);
  });

  it('remembers no refusal: the same error every time', () => {
    const clash = {
      ...(BUILT_IN_PRESETS[0]!.card as object),
      rules: [
        { kind: 'backbeat', voice: 'snare', beats: [2, 4] },
        { kind: 'linear', maxOverlaps: 0 },
      ],
    };
    useProofMemo(true);
    const first = outcome(clash, 'a');
    expect(first).toMatch(/^RuleConflictError/);
    expect(keptProofs()).toHaveLength(0);
    expect(outcome(clash, 'b')).toBe(first);
  });

  it('hands every drill a card of its own: changing one changes no later drill', () => {
    const card = BUILT_IN_PRESETS[1]!.card;
    useProofMemo(false);
    const expected = outcome(card, 'after');
    useProofMemo(true);
    const drill = generateDrill(parseRuleCard(card), 'before');
    (drill.card as { tempo: number }).tempo = 1;
    (drill.card.rules as unknown[]).length = 0;
    expect(outcome(card, 'after')).toBe(expected);
  });

  it('no later stage writes to a proof it reads', () => {
    const some = cards.slice(0, 8);
    useProofMemo(false);
    const fresh = some.map((card) => SEEDS.map((seed) => outcome(card, seed)));
    useProofMemo(true);
    for (const card of some) outcome(card, 'first');
    const proofs = keptProofs();
    expect(proofs.length).toBeGreaterThan(4);
    const before = snapshot(proofs);
    // A write to a frozen object or array throws: the drill would come out as an error.
    deepFreeze(proofs);
    const memo = some.map((card) => SEEDS.map((seed) => outcome(card, seed)));
    expect(memo).toEqual(fresh);
    expect(keptProofs().every((proof) => proofs.includes(proof))).toBe(true);
    expect(snapshot(proofs)).toEqual(before);
  });

  it('a proof reads no seed unless the phrase fill varies with it', () => {
    fc.assert(
      fc.property(cardArb, (raw) => {
        const card = parseRuleCard(raw);
        const proofAt = (seed: string): unknown => {
          try {
            const { seed: _, ...proof } = prove(place(frame(card, seed), []), []);
            return snapshot(proof);
          } catch (error) {
            return String(error);
          }
        };
        const framed = frame(card, 'x');
        if (phraseVaries(framed.card, framed.grid)) return;
        expect(proofAt('one')).toEqual(proofAt('another'));
      }),
      { numRuns: 60, seed: 8 },
    );
  });
});
