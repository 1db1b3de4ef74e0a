import fc from 'fast-check';
import { beforeAll, describe, expect, it } from 'vitest';
import { BUILT_IN_PRESETS } from '../../shared/generator/presets/index';
import { cardArb } from './arbitraries';
import { failuresOf, report, runCard, type Outcome } from './run';

/**
 * The engine's polyphonic (Witek) tension against the oracle's own (witek.ts), bar by bar: every
 * preset switched to the Witek measure at 20 seeds, and random cards on that measure. The check
 * is the oracle's `tension/measured` (each bar's stored tension equals the oracle's value).
 */
const SEEDS = Array.from({ length: 20 }, (_, i) => `s${i}`);
// 360 cards give a little over 300 drills (the rest are refusals the random-card spec explains).
const RANDOM_RUNS = Number(process.env['WITEK_RUNS'] ?? 360);
const FC_SEED = 20_140_446;

type Json = Record<string, unknown>;

/** The card on the Witek measure; a tension curve flat (as the random-card arbitrary keeps it). */
function onWitek(card: Json, flatten: boolean): Json {
  const rules = ((card['rules'] as Json[] | undefined) ?? []).map((r) =>
    flatten && r['kind'] === 'tension'
      ? { ...r, curve: (r['curve'] as number[]).map((_, __, c) => c[0]!) }
      : r,
  );
  return { ...card, measure: 'witek', rules };
}

let presets: Outcome[] = [];
let randoms: Outcome[] = [];

beforeAll(() => {
  presets = BUILT_IN_PRESETS.flatMap((preset) =>
    SEEDS.map((seed) =>
      runCard(onWitek(preset.card as Json, false), seed, { label: `preset ${preset.id} (witek)` }),
    ),
  );
  const samples = fc.sample(fc.tuple(cardArb, fc.string({ maxLength: 12 })), {
    seed: FC_SEED,
    numRuns: RANDOM_RUNS,
  });
  randoms = samples.map(([card, seed]) => runCard(onWitek(card, true), seed));
}, 180_000);

const drills = (o: readonly Outcome[]): Outcome[] => o.filter((x) => x.kind === 'drill');

describe('the engine’s Witek measure against the oracle’s', () => {
  it('runs every preset at 20 seeds and the random cards, with no crash', () => {
    expect(presets.length).toBe(BUILT_IN_PRESETS.length * SEEDS.length);
    expect(randoms.length).toBe(RANDOM_RUNS);
    const crashed = [...presets, ...randoms].filter(
      (o) => o.kind === 'crashed' || o.kind === 'invalid',
    );
    expect(report(crashed, 'Witek cards the engine could not take'), '').toBeNull();
  });

  it('compares a drill for most runs (the sample is not mostly refusals)', () => {
    expect(drills(presets).length).toBeGreaterThanOrEqual(presets.length * 0.8);
    // 300 drills at the default 360 cards (313 come back today).
    expect(drills(randoms).length).toBeGreaterThanOrEqual(Math.round((RANDOM_RUNS * 300) / 360));
  });

  it('every preset bar stores the oracle’s Witek tension', () => {
    expect(failuresOf(presets, 'tension/measured'), '').toBeNull();
  });

  it('every random drill’s bar stores the oracle’s Witek tension', () => {
    expect(failuresOf(randoms, 'tension/measured'), '').toBeNull();
  });
});
