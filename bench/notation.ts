/**
 * Prints the median time to engrave a 16-bar drill (notation model + VexFlow SVG, sticking and
 * counts on) in headless Chromium, over many runs, for every preset that takes 16 bars, and
 * beside it the floor: plain VexFlow drawing the same notes without our layout, and the ratio.
 * Run: npm run bench:notation
 */
import { generateDrill, parseRuleCard } from '../shared/generator/index';
import { BUILT_IN_PRESETS } from '../shared/generator/presets/index';
import { bundleForBrowser, launchChromium } from '../tests/support/browser';

const WARM_UP = 5;
/** Runs per preset (BENCH_RUNS overrides it, for a quick look on a busy machine). */
const RUNS = Number(process.env.BENCH_RUNS ?? 60);
const WIDTH = 1280;
const BARS = 16;

type Bundle = {
  fontsReady(): Promise<void>;
  timeRender(drill: unknown, width: number): { ms: number; bars: number; systems: number };
  timeFloor(drill: unknown, width: number): { ms: number };
};

function quantile(sorted: readonly number[], q: number): number {
  const index = Math.min(sorted.length - 1, Math.max(0, Math.ceil(q * sorted.length) - 1));
  return sorted[index] ?? NaN;
}

const code = await bundleForBrowser('bench/notation-entry.ts');
const browser = await launchChromium();
try {
  const page = await browser.newPage({ viewport: { width: WIDTH + 40, height: 900 } });
  await page.setContent('<!doctype html><title>notation bench</title><div id="score"></div>');
  await page.addScriptTag({ content: code });
  await page.evaluate(() => (window as unknown as { __bundle: Bundle }).__bundle.fontsReady());
  const medians: number[] = [];
  const floors: number[] = [];
  const ratios: number[] = [];
  const minRatios: number[] = [];
  for (const preset of BUILT_IN_PRESETS) {
    const card = parseRuleCard({ ...(preset.card as object), bars: BARS });
    let drill;
    try {
      drill = generateDrill(card, 'bench-16');
    } catch {
      continue; // a card whose rules tie it to fewer bars is not a fair 16-bar sample
    }
    // Ours and the floor in turns, so both meet the same machine load.
    const { ours, floor } = await page.evaluate(
      ({ drill, width, warmUp, runs }) => {
        const bundle = (window as unknown as { __bundle: Bundle }).__bundle;
        for (let i = 0; i < warmUp; i++) {
          bundle.timeRender(drill, width);
          bundle.timeFloor(drill, width);
        }
        const ours = [];
        const floor = [];
        for (let i = 0; i < runs; i++) {
          ours.push(bundle.timeRender(drill, width));
          floor.push(bundle.timeFloor(drill, width).ms);
        }
        return { ours, floor };
      },
      { drill, width: WIDTH, warmUp: WARM_UP, runs: RUNS },
    );
    const sorted = ours.map((t) => t.ms).sort((a, b) => a - b);
    const median = quantile(sorted, 0.5);
    const floorSorted = [...floor].sort((a, b) => a - b);
    const floorMedian = quantile(floorSorted, 0.5);
    // The fastest runs: on a busy machine the least disturbed measure of each side.
    minRatios.push(sorted[0]! / floorSorted[0]!);
    medians.push(median);
    floors.push(floorMedian);
    ratios.push(median / floorMedian);
    console.log(
      `${preset.id.padEnd(28)} ${ours[0]!.bars} bars, ${ours[0]!.systems} systems: ` +
        `median ${median.toFixed(1)} ms, p90 ${quantile(sorted, 0.9).toFixed(1)} ms, ` +
        `min ${sorted[0]!.toFixed(1)} ms; bare VexFlow median ${floorMedian.toFixed(1)} ms, ` +
        `min ${floorSorted[0]!.toFixed(1)} ms (${(median / floorMedian).toFixed(2)}× by medians, ` +
        `${(sorted[0]! / floorSorted[0]!).toFixed(2)}× by minimums)`,
    );
  }
  const all = [...medians].sort((a, b) => a - b);
  const allFloors = [...floors].sort((a, b) => a - b);
  const allRatios = [...ratios].sort((a, b) => a - b);
  console.log(
    `Notation: median time to render ${BARS} bars ${quantile(all, 0.5).toFixed(1)} ms ` +
      `(median over ${medians.length} presets, ${RUNS} runs each, ${WIDTH} px wide, headless Chromium); ` +
      `bare VexFlow, same notes: ${quantile(allFloors, 0.5).toFixed(1)} ms; ` +
      `ratio median ${quantile(allRatios, 0.5).toFixed(2)}×, worst ${allRatios[allRatios.length - 1]!.toFixed(2)}×; ` +
      `by minimums median ${quantile(
        [...minRatios].sort((a, b) => a - b),
        0.5,
      ).toFixed(2)}×`,
  );
} finally {
  await browser.close();
}
