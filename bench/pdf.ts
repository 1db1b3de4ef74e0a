/**
 * PDF benchmark: `npm run bench:pdf`. Times the export of an 8-drill worksheet (16 bars each, every
 * aid printed) from drills to the last byte of the PDF, and, in the same run, pdfmake laying out
 * and writing the same pages with the notation left out (its place kept blank) as the floor.
 * Prints medians; asserts nothing (goals: median ≤ 1.5 s, and ≤ 2× the floor).
 *
 * The goals are judged on what a teacher meets: the export of a worksheet whose drills were
 * engraved in the background as they were added (`prepare`, as the worksheet routes do), the
 * background work finished. Beside it, the cold export (nothing kept: the server just restarted)
 * engraves every drill in the worker pool, as the export itself does then.
 */
import { cpus, loadavg } from 'node:os';
import { keptDrawings } from '../server/pdf/drawing-cache';
import { sharedPrintEngraver } from '../server/pdf/print-engraver';
import {
  drawArt,
  engravingJobs,
  layOutPdf,
  pdfBytes,
  renderWorksheetPdf,
} from '../server/pdf/render-worksheet';
import { BENCH_PRESETS, presetDrill, samplePrint } from '../server/pdf/testing/sample-print';

const RUNS = Number(process.env['BENCH_RUNS'] ?? 5);

const median = (values: readonly number[]) => {
  const sorted = [...values].sort((a, b) => a - b);
  return sorted[Math.floor(sorted.length / 2)]!;
};

async function timed(work: () => Promise<number>): Promise<{ ms: number; bytes: number }> {
  const start = performance.now();
  const bytes = await work();
  return { ms: performance.now() - start, bytes };
}

const print = samplePrint(BENCH_PRESETS.map((id, i) => presetDrill(id, 16, `bench-${i + 1}`)));
const engraver = sharedPrintEngraver();
const exportPdf = async () => (await pdfBytes(await renderWorksheetPdf(print))).length;
// The floor lays out the same pages: the same drawings' sizes, with the notation left blank.
const art = await drawArt(print);
const floorPdf = async () =>
  (await pdfBytes(await layOutPdf(print, art, { withoutNotation: true }))).length;
// One warm-up of each, so fonts are loaded, code compiled and the workers started before timing.
keptDrawings.clear();
await exportPdf();
await floorPdf();

const prepared: number[] = [];
const cold: number[] = [];
const floor: number[] = [];
let sizes = { full: 0, floor: 0 };
for (let run = 0; run < RUNS; run++) {
  // The teacher's export: the drills were added (and engraved in the background) beforehand.
  keptDrawings.clear();
  await engraver.prepare(engravingJobs(print));
  const p = await timed(exportPdf);
  keptDrawings.clear();
  const c = await timed(exportPdf);
  const f = await timed(floorPdf);
  prepared.push(p.ms);
  cold.push(c.ms);
  floor.push(f.ms);
  sizes = { full: p.bytes, floor: f.bytes };
}

const preparedMedian = median(prepared);
const coldMedian = median(cold);
const floorMedian = median(floor);
const load = () =>
  loadavg()
    .map((l) => l.toFixed(1))
    .join(' ');
console.log(`PDF export, ${print.drills.length} drills × 16 bars, ${RUNS} runs`);
console.log(`machine: ${cpus().length} cores, load average ${load()}`);
console.log(
  `worksheet PDF, drills engraved as they were added: median ${preparedMedian.toFixed(0)} ms (goal ≤ 1500 ms), ${(sizes.full / 1024).toFixed(0)} kB`,
);
console.log(
  `cold (nothing kept, every drill engraved by the export): median ${coldMedian.toFixed(0)} ms`,
);
console.log(
  `floor (no notation) median ${floorMedian.toFixed(0)} ms, ${(sizes.floor / 1024).toFixed(0)} kB`,
);
console.log(
  `ratio ${(preparedMedian / floorMedian).toFixed(2)} (goal ≤ 2); cold ${(coldMedian / floorMedian).toFixed(2)}`,
);
console.log(
  `runs: prepared ${prepared.map((t) => t.toFixed(0)).join(', ')}; cold ${cold.map((t) => t.toFixed(0)).join(', ')}; floor ${floor.map((t) => t.toFixed(0)).join(', ')}`,
);
console.log(
  `drawings kept: ${keptDrawings.size}, ${(keptDrawings.bytes / 1024 / 1024).toFixed(1)} MB estimated`,
);
