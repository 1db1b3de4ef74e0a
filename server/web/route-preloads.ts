import { readFileSync } from 'node:fs';

/**
 * A drill page opened cold fetches its code in waves: each chunk's own imports are only found once
 * it has arrived and been parsed. `index.html` can name the whole set up front instead, so the
 * browser fetches it all at once while it parses `main`. The set comes from the build's esbuild
 * metafile (`stats.json`, written by `statsJson` in angular.json), so it follows every rebuild.
 */

/** The parts of esbuild's metafile read here. */
export interface BuildMetafile {
  /** Source files with what they import (a merged build's outputs no longer list its fonts). */
  readonly inputs?: Readonly<
    Record<string, { readonly imports?: readonly { readonly path: string }[] }>
  >;
  readonly outputs: Readonly<
    Record<
      string,
      {
        readonly entryPoint?: string;
        readonly inputs?: Readonly<Record<string, unknown>>;
        readonly imports?: readonly { readonly path: string; readonly kind: string }[];
        readonly exports?: readonly string[];
      }
    >
  >;
}

/**
 * Source files a `/drills/<card>` page loads before its score: the signed-in shell, the drill
 * routes, the page and the engraver (what `src/app/drills/drill-prefetch.ts` and the router
 * import), and `main`, whose own imports the HTML names only in a build whose chunks are not
 * merged. A spec keeps this list in step with the prefetch's imports.
 */
export const DRILL_PAGE_ENTRIES: readonly string[] = [
  'src/main.ts',
  'src/app/shell/shell.ts',
  'src/app/drills/drill-routes.ts',
  'src/app/drills/drill-page.ts',
  'shared/notation/render-vexflow.ts',
];

/** The module whose `.woff2` imports are the score's faces. */
export const MUSIC_FONTS_SOURCE = 'src/app/drills/score/music-fonts.ts';

export interface RoutePreloads {
  /** Chunks, in the order found (entries first, then what they import). */
  readonly scripts: readonly string[];
  /** Font files, fetched in CORS mode as the browser fetches every font. */
  readonly fonts: readonly string[];
}

/**
 * The chunks `entries` compile to with every chunk they import statically, and the font files
 * the output holding `fontSource` loads. Entries missing from the build are skipped. A build
 * whose chunks were merged after esbuild (`NG_BUILD_OPTIMIZE_CHUNKS`) names no entry points
 * but its lazy ones: there, the chunk holding an entry's source stands for it.
 */
export function routePreloads(
  metafile: BuildMetafile,
  entries: readonly string[],
  fontSource: string,
): RoutePreloads {
  const outputs = Object.entries(metafile.outputs);
  const queue = outputs
    .filter(([, output]) =>
      output.entryPoint === undefined
        ? Object.keys(output.inputs ?? {}).some((input) => entries.includes(input))
        : entries.includes(output.entryPoint),
    )
    .map(([file]) => file);
  const scripts: string[] = [];
  while (queue.length > 0) {
    const file = queue.shift() as string;
    if (scripts.includes(file)) continue;
    scripts.push(file);
    for (const imported of metafile.outputs[file]?.imports ?? []) {
      if (imported.kind === 'import-statement' && imported.path.endsWith('.js')) {
        queue.push(imported.path);
      }
    }
  }
  const fonts = outputs
    .filter(([, output]) => Object.keys(output.inputs ?? {}).includes(fontSource))
    .flatMap(([, output]) => output.imports ?? [])
    .filter((imported) => imported.kind === 'file-loader' && imported.path.endsWith('.woff2'))
    .map((imported) => imported.path);
  if (fonts.length === 0) {
    // Merged chunks keep no file-loader imports: find the faces the source imports by their files.
    const faces = (metafile.inputs?.[fontSource]?.imports ?? [])
      .map((imported) => imported.path)
      .filter((file) => file.endsWith('.woff2'));
    fonts.push(
      ...outputs
        .filter(
          ([file, output]) =>
            file.endsWith('.woff2') &&
            Object.keys(output.inputs ?? {}).some((input) => faces.includes(input)),
        )
        .map(([file]) => file),
    );
  }
  return { scripts, fonts: [...new Set(fonts)] };
}

/** The build's metafile at `file`, or null when there is none or it cannot be read. */
export function readMetafile(file: string): BuildMetafile | null {
  try {
    const parsed = JSON.parse(readFileSync(file, 'utf8')) as Partial<BuildMetafile>;
    return typeof parsed.outputs === 'object' && parsed.outputs !== null
      ? (parsed as BuildMetafile)
      : null;
  } catch {
    return null;
  }
}

const escapeAttribute = (value: string): string =>
  value.replace(/&/g, '&amp;').replace(/"/g, '&quot;').replace(/</g, '&lt;');

/**
 * `html` with preload links for `preloads`, leaving out what it already names. The chunks go
 * after the main script so the browser asks for `main` and its own chunks first; the fonts go in
 * the head, ahead of every script: with six HTTP/1.1 connections to one host the order of the
 * queue matters, and named after 40 scripts the faces arrived last. Without a head, the fonts
 * join the chunks; without a main script, both go before `</body>`.
 */
export function injectPreloads(html: string, preloads: RoutePreloads): string {
  const named = new Set([...html.matchAll(/\s(?:href|src)="([^"]+)"/g)].map((m) => m[1]));
  const scripts = preloads.scripts
    .filter((file) => !named.has(file))
    .map((file) => `<link rel="modulepreload" href="${escapeAttribute(file)}">`)
    .join('');
  const fonts = preloads.fonts
    .filter((file) => !named.has(file))
    .map(
      (file) =>
        `<link rel="preload" as="font" type="font/woff2" crossorigin href="${escapeAttribute(file)}">`,
    )
    .join('');
  if (scripts === '' && fonts === '') return html;
  const headEnd = html.indexOf('</head>');
  const withFonts = headEnd < 0 ? html : insertAt(html, headEnd, fonts);
  const withScripts = insertAt(
    withFonts,
    afterMainScript(withFonts),
    headEnd < 0 ? scripts + fonts : scripts,
  );
  return preloadMainFirst(withScripts);
}

/**
 * The main script, named again early in the head: Angular writes it at the end of the body,
 * behind the stylesheet and the fonts, so with six connections to one host it waited for one
 * of those to finish, and the whole boot waited with it. It goes after `<base>`, which its
 * relative URL is resolved against (before it, `/drills/main-….js` would be asked for).
 */
function preloadMainFirst(html: string): string {
  const main = /<script\b[^>]*\stype="module"[^>]*><\/script>/.exec(html)?.[0];
  const src = main && /\ssrc="([^"]+)"/.exec(main)?.[1];
  const base = /<base\b[^>]*>/i.exec(html);
  const at = base ? base.index + base[0].length : headStart(html);
  if (!src || at < 0) return html;
  return insertAt(html, at, `<link rel="modulepreload" href="${src}">`);
}

const insertAt = (html: string, at: number, text: string): string =>
  html.slice(0, at) + text + html.slice(at);

/** Just after the module script (`main`), else before `</body>`, else the end. */
function afterMainScript(html: string): number {
  const mainScript = /<script\b[^>]*\stype="module"[^>]*><\/script>/.exec(html);
  if (mainScript) return mainScript.index + mainScript[0].length;
  const bodyEnd = html.lastIndexOf('</body>');
  return bodyEnd < 0 ? html.length : bodyEnd;
}

/** Where the head's own content starts: after `<meta charset>` (which must come first), else after `<head>`. */
function headStart(html: string): number {
  const charset = /<meta\s+charset=[^>]*>/i.exec(html);
  if (charset) return charset.index + charset[0].length;
  const head = /<head\b[^>]*>/i.exec(html);
  return head ? head.index + head[0].length : -1;
}

/** The drill page's longest seed (`MAX_SEED_LENGTH` in src/app/drills/seed-problem.ts). */
export const MAX_SEED_LENGTH = 64;

/**
 * The requests `src/app/drills/drill-prefetch.ts` starts for the drill page at `pathname` and
 * `search` (the session check, the preset's drill at the URL's seed, the preset), in the same
 * URLs, so the browser can start them while it still parses the page and hand the answers to
 * those `fetch` calls. Null for a path that is not a drill page.
 */
export function drillPageRequests(pathname: string, search: string): string[] | null {
  const match = /^\/drills\/([^/]+)\/?$/.exec(pathname);
  if (!match) return null;
  let id: string;
  try {
    id = decodeURIComponent(match[1]!);
  } catch {
    return null;
  }
  const preset = `/api/presets/${encodeURIComponent(id)}`;
  const seed = new URLSearchParams(search).get('seed')?.trim().slice(0, MAX_SEED_LENGTH);
  return [
    '/api/auth/me',
    ...(seed ? [`${preset}/drill?seed=${encodeURIComponent(seed)}`] : []),
    preset,
  ];
}

/**
 * `html` with preloads for `urls` as `fetch` would ask for them (CORS mode, same-origin
 * credentials: the `crossorigin` attribute), first in the head: the server needs the longest to
 * answer them, so they leave before every font and script. Without a head, after the main script.
 */
export function injectFetchPreloads(html: string, urls: readonly string[]): string {
  const links = urls
    .map((url) => `<link rel="preload" as="fetch" crossorigin href="${escapeAttribute(url)}">`)
    .join('');
  const start = headStart(html);
  return insertAt(html, start < 0 ? afterMainScript(html) : start, links);
}
