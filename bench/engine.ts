/**
 * Engine benchmark: `npm run bench:engine`. Times `generateDrill` on a 16-bar, 4-voice card that
 * uses every rule kind (median, p99, drills per second, and the median against
 * `JSON.stringify` of the same drill), and the time to refuse an unsatisfiable card.
 * Prints figures; it asserts nothing (targets: median ≤ 1 ms, ratio ≤ 20).
 */
import { cpus } from 'node:os';
import { generateDrill, parseRuleCard, RuleConflictError } from '../shared/generator/index';
import { FULL_CARD, UNSATISFIABLE_CARD } from './engine-cards';

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
const clash = parseRuleCard(UNSATISFIABLE_CARD);
for (let i = 0; i < WARM_UP; i++) generateDrill(card, `warm-${i}`);

const drillTimes = timeEach(RUNS, (i) => generateDrill(card, `bench-${i}`));
const median = quantile(drillTimes, 0.5);
const p99 = quantile(drillTimes, 0.99);
const mean = drillTimes.reduce((a, b) => a + b, 0) / drillTimes.length;

// JSON.stringify of one drill is a few microseconds: time batches of 100 for a stable figure.
const sample = generateDrill(card, 'bench-json');
const jsonBytes = JSON.stringify(sample).length;
const jsonTimes = timeEach(200, () => {
  for (let k = 0; k < 100; k++) JSON.stringify(sample);
}).map((t) => t / 100);
const jsonMedian = quantile(jsonTimes, 0.5);

const conflictTimes = timeEach(RUNS, (i) => {
  try {
    generateDrill(clash, `clash-${i}`);
  } catch (error) {
    if (!(error instanceof RuleConflictError)) throw error;
    return;
  }
  throw new Error('The unsatisfiable card produced a drill.');
});

const ms = (t: number): string => t.toFixed(3);
console.log(
  `Engine benchmark (${RUNS} drills, Node ${process.version}, ${cpus().length} × ${cpus()[0]?.model ?? 'cpu'})`,
);
console.log(`card: 16 bars, 4 voices, 16ths, every rule kind; drill JSON ${jsonBytes} bytes`);
console.log(
  `generateDrill   median ${ms(median)} ms   p99 ${ms(p99)} ms   ${Math.round(1000 / mean)} drills/s`,
);
console.log(
  `JSON.stringify  median ${ms(jsonMedian)} ms   ratio generate/stringify ${(median / jsonMedian).toFixed(1)}`,
);
console.log(
  `RuleConflictError (linear 0 vs backbeat on the ostinato)   median ${ms(quantile(conflictTimes, 0.5))} ms   p99 ${ms(quantile(conflictTimes, 0.99))} ms`,
);
