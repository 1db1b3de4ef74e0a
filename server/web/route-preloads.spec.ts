import { readFileSync } from 'node:fs';
import path from 'node:path';
import { fileURLToPath } from 'node:url';
import { describe, expect, it } from 'vitest';
import {
  DRILL_PAGE_ENTRIES,
  injectFetchPreloads,
  MAX_SEED_LENGTH,
  MUSIC_FONTS_SOURCE,
  injectPreloads,
  routePreloads,
  type BuildMetafile,
} from './route-preloads';

const REPO = fileURLToPath(new URL('../..', import.meta.url));

/** A small build: two entries sharing a chunk, a lazy chunk, a cycle and the fonts' chunk. */
const METAFILE: BuildMetafile = {
  outputs: {
    'main-AAAAAAAA.js': {
      entryPoint: 'src/main.ts',
      imports: [{ path: 'chunk-SHARED01.js', kind: 'import-statement' }],
    },
    'chunk-PAGE0001.js': {
      entryPoint: 'src/page.ts',
      imports: [
        { path: 'chunk-SHARED01.js', kind: 'import-statement' },
        { path: 'chunk-LAZY0001.js', kind: 'dynamic-import' },
      ],
    },
    'chunk-SHELL001.js': {
      entryPoint: 'src/shell.ts',
      imports: [{ path: 'chunk-CYCLE001.js', kind: 'import-statement' }],
    },
    'chunk-CYCLE001.js': {
      imports: [{ path: 'chunk-SHELL001.js', kind: 'import-statement' }],
    },
    'chunk-SHARED01.js': {
      inputs: { 'src/fonts.ts': {}, 'src/other.ts': {} },
      imports: [
        { path: 'media/face-BBBBBBBB.woff2', kind: 'file-loader' },
        { path: 'media/logo-CCCCCCCC.svg', kind: 'file-loader' },
      ],
    },
    'chunk-LAZY0001.js': { entryPoint: 'src/lazy.ts', imports: [] },
    'media/face-BBBBBBBB.woff2': { inputs: { 'fonts/face.woff2': {} } },
  },
};

describe('routePreloads', () => {
  it('follows static imports from the entries, once each, and leaves dynamic ones out', () => {
    const found = routePreloads(METAFILE, ['src/page.ts', 'src/shell.ts'], 'src/fonts.ts');
    expect([...found.scripts].sort()).toEqual([
      'chunk-CYCLE001.js',
      'chunk-PAGE0001.js',
      'chunk-SHARED01.js',
      'chunk-SHELL001.js',
    ]);
    expect(found.fonts).toEqual(['media/face-BBBBBBBB.woff2']);
  });

  it('in a build with merged chunks, takes the chunk holding an entry for it', () => {
    const merged: BuildMetafile = {
      outputs: {
        'main-AAAAAAAA.js': {
          entryPoint: 'src/main.ts',
          imports: [{ path: 'chunk-02xAIvIv.js', kind: 'import-statement' }],
        },
        'chunk-02xAIvIv.js': {
          inputs: { 'src/page.ts': {}, 'src/shell.ts': {} },
          imports: [{ path: 'chunk-1aFyDfV4.js', kind: 'import-statement' }],
        },
        'chunk-1aFyDfV4.js': { inputs: { 'node_modules/x/index.js': {} }, imports: [] },
        'chunk-Lazy0001.js': { inputs: { 'src/lazy.ts': {} }, imports: [] },
      },
    };
    expect(routePreloads(merged, ['src/page.ts'], 'src/fonts.ts').scripts).toEqual([
      'chunk-02xAIvIv.js',
      'chunk-1aFyDfV4.js',
    ]);
    expect(routePreloads(merged, ['src/page.ts'], 'src/fonts.ts').fonts).toEqual([]);
    const withFaces: BuildMetafile = {
      inputs: {
        'src/fonts.ts': {
          imports: [{ path: 'node_modules/f/face.woff2' }, { path: 'node_modules/f/util.js' }],
        },
      },
      outputs: {
        ...merged.outputs,
        'media/face-BBBBBBBB.woff2': { inputs: { 'node_modules/f/face.woff2': {} } },
        'media/other-CCCCCCCC.woff2': { inputs: { 'node_modules/f/other.woff2': {} } },
      },
    };
    expect(routePreloads(withFaces, ['src/page.ts'], 'src/fonts.ts').fonts).toEqual([
      'media/face-BBBBBBBB.woff2',
    ]);
    expect(routePreloads(merged, ['src/main.ts'], 'src/fonts.ts').scripts).toEqual([
      'main-AAAAAAAA.js',
      'chunk-02xAIvIv.js',
      'chunk-1aFyDfV4.js',
    ]);
  });

  it('finds nothing for entries the build does not have', () => {
    expect(routePreloads(METAFILE, ['src/gone.ts'], 'src/gone-fonts.ts')).toEqual({
      scripts: [],
      fonts: [],
    });
  });
});

describe('injectPreloads', () => {
  const HTML =
    '<html><head><link rel="stylesheet" href="styles-DDDDDDDD.css"></head><body><tensile-root></tensile-root>' +
    '<link rel="modulepreload" href="chunk-SHARED01.js"><script src="main-AAAAAAAA.js" type="module"></script></body></html>';

  it('adds the main script first in the head, the fonts before </head> and the chunks after the main script, skipping files the page already names', () => {
    const html = injectPreloads(HTML, {
      scripts: ['chunk-PAGE0001.js', 'chunk-SHARED01.js'],
      fonts: ['media/face-BBBBBBBB.woff2'],
    });
    expect(html).toBe(
      HTML.replace('<head>', '<head><link rel="modulepreload" href="main-AAAAAAAA.js">')
        .replace(
          '</head>',
          '<link rel="preload" as="font" type="font/woff2" crossorigin href="media/face-BBBBBBBB.woff2"></head>',
        )
        .replace('</script>', '</script><link rel="modulepreload" href="chunk-PAGE0001.js">'),
    );
  });

  it('names the main script after <base>, which its URL is resolved against', () => {
    const based = HTML.replace('<head>', '<head><meta charset="utf-8"><base href="/app/">');
    expect(injectPreloads(based, { scripts: ['chunk-PAGE0001.js'], fonts: [] })).toContain(
      '<base href="/app/"><link rel="modulepreload" href="main-AAAAAAAA.js"><link rel="stylesheet"',
    );
  });

  it('puts them before </body> when there is no module script, and leaves a page alone when there is nothing to add', () => {
    const plain = '<html><body><p>x</p></body></html>';
    expect(injectPreloads(plain, { scripts: ['a-EEEEEEEE.js'], fonts: [] })).toBe(
      '<html><body><p>x</p><link rel="modulepreload" href="a-EEEEEEEE.js"></body></html>',
    );
    expect(injectPreloads(plain, { scripts: ['a-EEEEEEEE.js'], fonts: ['f-FFFFFFFF.woff2'] })).toBe(
      '<html><body><p>x</p><link rel="modulepreload" href="a-EEEEEEEE.js">' +
        '<link rel="preload" as="font" type="font/woff2" crossorigin href="f-FFFFFFFF.woff2"></body></html>',
    );
    expect(injectPreloads(HTML, { scripts: ['chunk-SHARED01.js'], fonts: [] })).toBe(HTML);
  });
});

describe('injectFetchPreloads', () => {
  const link = (url: string): string => `<link rel="preload" as="fetch" crossorigin href="${url}">`;

  it('puts the requests first in the head, after <meta charset>', () => {
    const html = '<html><head><meta charset="utf-8"><title>t</title></head><body></body></html>';
    expect(injectFetchPreloads(html, ['/api/a', '/api/b?x="1"'])).toBe(
      html.replace('utf-8">', `utf-8">${link('/api/a')}${link('/api/b?x=&quot;1&quot;')}`),
    );
    const noCharset = '<html><head lang="en"><title>t</title></head></html>';
    expect(injectFetchPreloads(noCharset, ['/api/a'])).toBe(
      noCharset.replace('<head lang="en">', `<head lang="en">${link('/api/a')}`),
    );
  });

  it('without a head, goes after the main script, else before </body>, else at the end', () => {
    const main = '<body><script src="m.js" type="module"></script><p></p></body>';
    expect(injectFetchPreloads(main, ['/api/a'])).toBe(
      main.replace('</script>', `</script>${link('/api/a')}`),
    );
    expect(injectFetchPreloads('<body></body>', ['/api/a'])).toBe(`<body>${link('/api/a')}</body>`);
    expect(injectFetchPreloads('<p></p>', ['/api/a'])).toBe(`<p></p>${link('/api/a')}`);
  });
});

describe('the drill page entries', () => {
  it('name every module the drill prefetch imports, and exist', () => {
    const prefetch = path.join(REPO, 'src/app/drills/drill-prefetch.ts');
    const imported = [...readFileSync(prefetch, 'utf8').matchAll(/import\('([^']+)'\)/g)].map((m) =>
      path.relative(REPO, path.resolve(path.dirname(prefetch), `${m[1]}.ts`)),
    );
    expect(imported.length).toBeGreaterThan(0);
    for (const source of imported) expect(DRILL_PAGE_ENTRIES).toContain(source);
    for (const source of [...DRILL_PAGE_ENTRIES, MUSIC_FONTS_SOURCE]) {
      expect(() => readFileSync(path.join(REPO, source))).not.toThrow();
    }
  });
});

describe('drillPageRequests', () => {
  it('keeps the seed limit of the drill page', () => {
    const client = readFileSync(path.join(REPO, 'src/app/drills/seed-problem.ts'), 'utf8');
    expect(client).toContain(`export const MAX_SEED_LENGTH = ${MAX_SEED_LENGTH};`);
  });
});
