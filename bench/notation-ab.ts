/**
 * The notation code at a git revision against the working tree's, in one headless Chromium page:
 * first the SVG of every preset at a few seeds, lengths and option sets, which a speed change must
 * leave the same (byte for byte, VexFlow's running ids aside; the count with ids included is
 * printed too); then, with BENCH_RUNS > 0, the 16-bar render of both, interleaved run by run
 * (which goes first alternates), beside the floor of `bench/notation.ts`, so both meet the same
 * load. Run: npx tsx bench/notation-ab.ts [revision, default main]
 */
import { execFileSync } from 'node:child_process';
import { mkdtempSync, rmSync, writeFileSync } from 'node:fs';
import { loadavg, tmpdir } from 'node:os';
import { join } from 'node:path';
import { build } from 'esbuild';
import { generateDrill, parseRuleCard } from '../shared/generator/index';
import { BUILT_IN_PRESETS } from '../shared/generator/presets/index';
import { launchChromium, REPO_ROOT } from '../tests/support/browser';

const REVISION = process.argv[2] ?? 'main';
const RUNS = Number(process.env['BENCH_RUNS'] ?? 20);
const WIDTH = 1280;
const SEEDS = ['bench-16', 'compare-a', 'compare-b'];
const OPTION_SETS: readonly object[] = [
  { showSticking: true, showCounts: true, gapBelowSystem: 52 },
  {},
  { showCounts: true, showTension: true },
  { showSticking: true, leastTextSize: 12, ink: '#222' },
];

/** The browser side, for both trees: the bench's entry plus the drawing as markup. */
const ENTRY = `
import { buildNotation } from './shared/notation/notation-model';
import { renderNotation } from './shared/notation/render-vexflow';
export { timeRender, timeFloor, fontsReady } from './bench/notation-entry';
export function svgOf(drill, options) {
  const host = document.createElement('div');
  renderNotation(host, buildNotation(drill), { width: ${WIDTH}, ...options });
  return host.innerHTML;
}
`;

async function bundle(root: string, name: string): Promise<string> {
  const entry = join(root, 'notation-ab-entry.js');
  writeFileSync(entry, ENTRY);
  const result = await build({
    entryPoints: [entry],
    bundle: true,
    format: 'iife',
    globalName: name,
    platform: 'browser',
    target: 'es2022',
    write: false,
    logLevel: 'silent',
    nodePaths: [join(REPO_ROOT, 'node_modules')],
  });
  rmSync(entry);
  return result.outputFiles[0]!.text;
}

type Side = {
  fontsReady(): Promise<void>;
  svgOf(drill: unknown, options: object): string;
  timeRender(drill: unknown, width: number): { ms: number };
  timeFloor(drill: unknown, width: number): { ms: number };
};
type Sides = { __before: Side; __after: Side };

const median = (values: readonly number[]): number => {
  const sorted = [...values].sort((a, b) => a - b);
  return sorted[Math.floor((sorted.length - 1) / 2)]!;
};

// The revision's shared/ and bench/ in a folder of their own (its imports resolve there).
const old = mkdtempSync(join(tmpdir(), 'notation-ab-'));
execFileSync('sh', ['-c', `git archive ${REVISION} shared bench | tar -x -C "${old}"`], {
  cwd: REPO_ROOT,
});
const before = await bundle(old, '__before');
const after = await bundle(REPO_ROOT, '__after');
rmSync(old, { recursive: true, force: true });

const browser = await launchChromium();
try {
  const page = await browser.newPage({ viewport: { width: WIDTH + 40, height: 900 } });
  await page.setContent('<!doctype html><title>notation A/B</title><div id="score"></div>');
  await page.addScriptTag({ content: before });
  await page.addScriptTag({ content: after });
  await page.evaluate(() => (window as unknown as Sides).__after.fontsReady());

  let same = 0;
  let sameWithIds = 0;
  const different: string[] = [];
  for (const seed of SEEDS)
    for (const bars of [16, 8])
      for (const preset of BUILT_IN_PRESETS) {
        let drill;
        try {
          drill = generateDrill(parseRuleCard({ ...(preset.card as object), bars }), seed);
        } catch {
          continue; // a card tied to fewer bars
        }
        for (const options of OPTION_SETS) {
          // Both sides draw the same sequence, so their running ids agree unless one creates
          // more VexFlow elements than the other.
          const [a, b] = await page.evaluate(
            ({ drill, options }) => {
              const sides = window as unknown as Sides;
              return [sides.__before.svgOf(drill, options), sides.__after.svgOf(drill, options)];
            },
            { drill, options },
          );
          const withoutIds = (svg: string) => svg.replace(/vf-auto\d+/g, 'vf-auto');
          if (a === b) sameWithIds++;
          if (withoutIds(a) === withoutIds(b)) same++;
          else different.push(`${preset.id} ${seed} ${bars} bars ${JSON.stringify(options)}`);
        }
      }
  console.log(
    `SVG, ${REVISION} against the working tree: ${same} of ${same + different.length} the same ` +
      `(${sameWithIds} with VexFlow's ids too)`,
  );
  for (const line of different.slice(0, 10)) console.log(`  different: ${line}`);

  if (RUNS > 0) {
    const load = loadavg()[0]!.toFixed(1);
    const rows: { before: number; after: number; floor: number }[] = [];
    for (const preset of BUILT_IN_PRESETS) {
      let drill;
      try {
        drill = generateDrill(parseRuleCard({ ...(preset.card as object), bars: 16 }), 'bench-16');
      } catch {
        continue;
      }
      const times = await page.evaluate(
        ({ drill, width, runs }) => {
          const { __before: a, __after: b } = window as unknown as Sides;
          for (let i = 0; i < 3; i++) [a, b].forEach((side) => side.timeRender(drill, width));
          const out = { before: [] as number[], after: [] as number[], floor: [] as number[] };
          for (let i = 0; i < runs; i++) {
            const first = i % 2 ? a : b;
            const t1 = first.timeRender(drill, width).ms;
            const t2 = (first === a ? b : a).timeRender(drill, width).ms;
            out.before.push(first === a ? t1 : t2);
            out.after.push(first === a ? t2 : t1);
            out.floor.push(b.timeFloor(drill, width).ms);
          }
          return out;
        },
        { drill, width: WIDTH, runs: RUNS },
      );
      rows.push({
        before: median(times.before),
        after: median(times.after),
        floor: median(times.floor),
      });
    }
    const ratio = (key: 'before' | 'after') => median(rows.map((r) => r[key] / r.floor));
    console.log(
      `16 bars, ${rows.length} presets, ${RUNS} runs each (load average ${load} → ` +
        `${loadavg()[0]!.toFixed(1)}): median ${median(rows.map((r) => r.before)).toFixed(1)} ms ` +
        `→ ${median(rows.map((r) => r.after)).toFixed(1)} ms; bare VexFlow ` +
        `${median(rows.map((r) => r.floor)).toFixed(1)} ms; ratio by medians ` +
        `${ratio('before').toFixed(2)}× → ${ratio('after').toFixed(2)}×; after/before per ` +
        `preset, median ${median(rows.map((r) => r.after / r.before)).toFixed(3)}`,
    );
  }
} finally {
  await browser.close();
}
