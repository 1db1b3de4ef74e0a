/**
 * PDF benchmark: `npm run bench:pdf`. Times the export of an 8-drill worksheet (16 bars each, every
 * aid printed) from drills to the last byte of the PDF, and, in the same run, pdfmake laying out
 * and writing the same pages with the notation left out (its place kept blank) as the floor.
 * Prints medians; asserts nothing (goals: median ≤ 1.5 s, and ≤ 2× the floor). The goals are
 * judged on cold exports (the engraving cache emptied first); a warm export (every drawing
 * cached, as when a teacher prints the same sheet again) is printed beside them.
 */
import { cpus, loadavg } from 'node:os';
import { clearNotationCache } from '../server/pdf/notation-art';
import { drawArt, layOutPdf, pdfBytes, renderWorksheetPdf } from '../server/pdf/render-worksheet';
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
// The floor lays out the same pages: the same drawings' sizes, with the notation left blank.
const art = await drawArt(print);
// One warm-up of each, so fonts are loaded and code is compiled before timing.
await pdfBytes(await renderWorksheetPdf(print));
await pdfBytes(await layOutPdf(print, art, { withoutNotation: true }));

const full: number[] = [];
const warm: number[] = [];
const floor: number[] = [];
let sizes = { full: 0, floor: 0 };
for (let run = 0; run < RUNS; run++) {
  clearNotationCache();
  const a = await timed(async () => (await pdfBytes(await renderWorksheetPdf(print))).length);
  const w = await timed(async () => (await pdfBytes(await renderWorksheetPdf(print))).length);
  warm.push(w.ms);
  const b = await timed(
    async () => (await pdfBytes(await layOutPdf(print, art, { withoutNotation: true }))).length,
  );
  full.push(a.ms);
  floor.push(b.ms);
  sizes = { full: a.bytes, floor: b.bytes };
}

const fullMedian = median(full);
const floorMedian = median(floor);
console.log(`PDF export, ${print.drills.length} drills × 16 bars, ${RUNS} runs`);
console.log(
  `machine: ${cpus().length} cores, load average ${loadavg()
    .map((l) => l.toFixed(1))
    .join(' ')}`,
);
console.log(
  `worksheet PDF (cold) median ${fullMedian.toFixed(0)} ms (goal ≤ 1500 ms), ${(sizes.full / 1024).toFixed(0)} kB`,
);
console.log(`warm (drawings cached) median ${median(warm).toFixed(0)} ms`);
console.log(
  `floor (no notation) median ${floorMedian.toFixed(0)} ms, ${(sizes.floor / 1024).toFixed(0)} kB`,
);
console.log(`ratio ${(fullMedian / floorMedian).toFixed(2)} (goal ≤ 2)`);
console.log(
  `runs: full ${full.map((t) => t.toFixed(0)).join(', ')}; warm ${warm.map((t) => t.toFixed(0)).join(', ')}; floor ${floor.map((t) => t.toFixed(0)).join(', ')}`,
);
