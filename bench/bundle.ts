/**
 * Initial bundle size: what a browser downloads before the first route renders. Starts from the
 * built index.html (its script, stylesheet and modulepreload tags), follows static imports between
 * chunks (never dynamic `import()`, which is what keeps VexFlow and Tone lazy), and prints raw and
 * gzip sizes. Run after `npm run build`.
 */
import { existsSync, readFileSync } from 'node:fs';
import { join } from 'node:path';
import { gzipSync } from 'node:zlib';

const dir = join(import.meta.dirname, '..', 'dist', 'tensile', 'browser');
if (!existsSync(join(dir, 'index.html'))) {
  console.error('No build found in dist/tensile/browser: run `npm run build` first.');
  process.exit(1);
}

const html = readFileSync(join(dir, 'index.html'), 'utf8');
const entries = [
  ...html.matchAll(/<script[^>]*\ssrc="([^"]+)"/g),
  ...html.matchAll(/<link[^>]*rel="(?:stylesheet|modulepreload)"[^>]*href="([^"]+)"/g),
].map((m) => m[1] as string);

/** Static `import … from "./x.js"` and bare `import "./x.js"`; dynamic imports are left out. */
function staticImports(code: string): string[] {
  const found = code.matchAll(
    /(?:^|[;\s}])(?:import|export)\s*(?:[\w*{}\s,$]+from\s*)?["']\.\/([^"']+\.js)["']/g,
  );
  return [...found].map((m) => m[1] as string);
}

const initial = new Set<string>();
const queue = [...entries];
while (queue.length > 0) {
  const file = queue.pop() as string;
  if (initial.has(file)) continue;
  initial.add(file);
  if (file.endsWith('.js')) queue.push(...staticImports(readFileSync(join(dir, file), 'utf8')));
}

let raw = 0;
let gzip = 0;
const rows = [...initial].sort().map((file) => {
  const bytes = readFileSync(join(dir, file));
  const zipped = gzipSync(bytes, { level: 9 }).length;
  raw += bytes.length;
  gzip += zipped;
  return `  ${file.padEnd(28)} ${(bytes.length / 1024).toFixed(1).padStart(8)} kB ${(zipped / 1024).toFixed(1).padStart(8)} kB gzip`;
});
console.log(`Initial bundle: ${initial.size} files`);
console.log(rows.join('\n'));
console.log(
  `Initial bundle total: ${(raw / 1024).toFixed(1)} kB raw, ${(gzip / 1024).toFixed(1)} kB gzip`,
);
const lazy = ['vexflow', 'Tone'].filter((name) =>
  [...initial].some(
    (file) =>
      file.endsWith('.js') &&
      readFileSync(join(dir, file), 'utf8').includes(name === 'Tone' ? 'ToneAudioNode' : 'VexFlow'),
  ),
);
console.log(
  lazy.length === 0
    ? 'VexFlow and Tone.js: not in the initial bundle'
    : `In the initial bundle: ${lazy.join(', ')}`,
);
