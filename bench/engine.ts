/**
 * Engine benchmark: `npm run bench:engine`. Times `generateDrill` on a 16-bar, 4-voice card that
 * uses every rule kind (median, p99, drills per second, and the median against
 * `JSON.stringify` of the same drill), the first drill of a card (its proof not yet remembered:
 * the same seeds with the proof memo off), and the time to refuse unsatisfiable cards: one
 * caught by the obligation checks, one by the tension reach proof (formerly found by the
 * search), and the worst cases where the search runs to its work budget (median and max over seeds).
 * Prints figures; it asserts nothing (targets: median ≤ 1 ms, ratio ≤ 20, refusals ≤ 100 ms).
 */
import { cpus } from 'node:os';
import {
  generateDrill,
  parseRuleCard,
  RuleConflictError,
  SearchExhaustedError,
} from '../shared/generator/index';
import { useProofMemo } from '../shared/generator/pipeline/memo';
import {
  FULL_CARD,
  SEARCH_CONFLICT_CARD,
  UNSATISFIABLE_CARD,
  WORST_CONFLICT_CARDS,
} from './engine-cards';

const WARM_UP = 300;
const RUNS = Number(process.env['BENCH_RUNS'] ?? 3000);

function quantile(sorted: readonly number[], q: number): number {
  return sorted[Math.min(sorted.length - 1, Math.floor(q * sorted.length))] ?? Number.NaN;
}

function timeEach(runs: number, work: (i: number) => void): number[] {
  const times: number[] = [];
  for (let i = 0; i < runs; i++) {
    const start = performance.now();
    work(i);
    times.push(performance.now() - start);
  }
  return times.sort((a, b) => a - b);
}

const card = parseRuleCard(FULL_CARD);
for (let i = 0; i < WARM_UP; i++) generateDrill(card, `warm-${i}`);

const drillTimes = timeEach(RUNS, (i) => generateDrill(card, `bench-${i}`));
const median = quantile(drillTimes, 0.5);
const p99 = quantile(drillTimes, 0.99);
const mean = drillTimes.reduce((a, b) => a + b, 0) / drillTimes.length;

// Many seeds of one card reuse its proof; a card seen for the first time works it out.
useProofMemo(false);
const firstTimes = timeEach(RUNS, (i) => generateDrill(card, `bench-${i}`));
useProofMemo(true);

// JSON.stringify of one drill is a few microseconds: time batches of 100 for a stable figure.
const sample = generateDrill(card, 'bench-json');
const jsonBytes = JSON.stringify(sample).length;
const jsonTimes = timeEach(200, () => {
  for (let k = 0; k < 100; k++) JSON.stringify(sample);
}).map((t) => t / 100);
const jsonMedian = quantile(jsonTimes, 0.5);

function refuse(raw: unknown, runs: number): number[] {
  const unsatisfiable = parseRuleCard(raw);
  return timeEach(runs, (i) => {
    try {
      generateDrill(unsatisfiable, `clash-${i}`);
    } catch (error) {
      // A proved refusal, or (worst cases) a search that spent its budget and says so.
      if (!(error instanceof RuleConflictError) && !(error instanceof SearchExhaustedError))
        throw error;
      return;
    }
    throw new Error('The unsatisfiable card produced a drill.');
  });
}

const conflictTimes = refuse(UNSATISFIABLE_CARD, RUNS);
const searchConflictTimes = refuse(SEARCH_CONFLICT_CARD, Math.min(RUNS, 300));
const worstRuns = Number(process.env['BENCH_WORST_RUNS'] ?? 30);
refuse(WORST_CONFLICT_CARDS.linear, 3); // warm-up
const worstLinear = refuse(WORST_CONFLICT_CARDS.linear, worstRuns);
const worstHands = refuse(WORST_CONFLICT_CARDS.hands, worstRuns);

const ms = (t: number): string => t.toFixed(3);
console.log(
  `Engine benchmark (${RUNS} drills, Node ${process.version}, ${cpus().length} × ${cpus()[0]?.model ?? 'cpu'})`,
);
console.log(`card: 16 bars, 4 voices, 16ths, every rule kind; drill JSON ${jsonBytes} bytes`);
console.log(
  `generateDrill   median ${ms(median)} ms   p99 ${ms(p99)} ms   ${Math.round(1000 / mean)} drills/s`,
);
console.log(
  `first of a card median ${ms(quantile(firstTimes, 0.5))} ms   p99 ${ms(quantile(firstTimes, 0.99))} ms   (proof not remembered)`,
);
console.log(
  `JSON.stringify  median ${ms(jsonMedian)} ms   ratio generate/stringify ${(median / jsonMedian).toFixed(1)}`,
);
console.log(
  `RuleConflictError (linear 0 vs backbeat on the ostinato)   median ${ms(quantile(conflictTimes, 0.5))} ms   p99 ${ms(quantile(conflictTimes, 0.99))} ms`,
);
const spread = (times: readonly number[]): string =>
  `median ${ms(quantile(times, 0.5))} ms   max ${ms(times[times.length - 1] ?? Number.NaN)} ms`;
console.log(
  `RuleConflictError (a) 16-level curve, proved out of reach        ${spread(searchConflictTimes)}`,
);
console.log(
  `RuleConflictError (b) worst: 64 × 15 beats × 8, linear 1, search  ${spread(worstLinear)}`,
);
console.log(
  `RuleConflictError (c) worst: 64 × 15 beats × 8, fast hands, search  ${spread(worstHands)}`,
);
