import { existsSync, readFileSync, statSync } from 'node:fs';
import path from 'node:path';
import { fileURLToPath } from 'node:url';
import express, { Router, type Response } from 'express';
import {
  DRILL_PAGE_ENTRIES,
  MUSIC_FONTS_SOURCE,
  drillPageRequests,
  injectFetchPreloads,
  injectPreloads,
  readMetafile,
  routePreloads,
} from './route-preloads';

/** Where `ng build` writes the browser app. */
export const DEFAULT_BROWSER_DIST = fileURLToPath(
  new URL('../../dist/tensile/browser', import.meta.url),
);

/**
 * The build names its bundles and media with a content hash, e.g. `main-2YQ7VRZL.js`; chunks
 * merged after esbuild (`NG_BUILD_OPTIMIZE_CHUNKS`) take a mixed-case one, e.g. `chunk-02xAIvIv.js`.
 */
const HASHED_FILE = /(?:-[A-Z0-9]{8,}\.[a-z0-9]+|^chunk-[A-Za-z0-9_-]{8}\.js)$/;

/** Paths that ask for a file (not a page): a missing one is a 404, not the app's shell. */
const ASSET_EXTENSION =
  /\.(js|mjs|css|map|json|ico|png|jpe?g|gif|svg|webp|woff2?|ttf|otf|txt|wasm|mp3|wav|ogg)$/i;

const ONE_YEAR_SECONDS = 365 * 24 * 60 * 60;

/**
 * Serves the built app from `distDir`: hashed files cached for a year (their names change with
 * their content), everything else revalidated on each use, and `index.html` for any other
 * non-API GET so the client router can take over (`/drills/…` and the like). A drill page's
 * `index.html` also preloads the page's chunks and fonts, read from the build's `stats.json`
 * beside `distDir`, and the API requests the page starts first (route-preloads.ts). Without a build, pages get a 503 saying how to make one.
 */
export function createSpaRouter(distDir: string = DEFAULT_BROWSER_DIST): Router {
  const router = Router();
  const indexFile = path.join(distDir, 'index.html');
  const drillIndex = drillPageIndex(indexFile, path.join(distDir, '..', 'stats.json'));

  router.use(
    express.static(distDir, {
      index: false,
      setHeaders(res, filePath) {
        res.setHeader(
          'Cache-Control',
          HASHED_FILE.test(path.basename(filePath))
            ? `public, max-age=${ONE_YEAR_SECONDS}, immutable`
            : 'no-cache',
        );
      },
    }),
  );

  router.get('/{*splat}', (req, res, next) => {
    if (req.path === '/api' || req.path.startsWith('/api/')) return next();
    if (ASSET_EXTENSION.test(req.path)) return next();
    if (!existsSync(indexFile)) return sendBuildMissing(res);
    res.setHeader('Cache-Control', 'no-cache');
    const query = req.originalUrl.indexOf('?');
    const search = query < 0 ? '' : req.originalUrl.slice(query);
    const requests = drillPageRequests(req.path, search);
    const html = requests && drillIndex();
    if (!requests || !html) return res.sendFile(indexFile);
    res.type('html').send(injectFetchPreloads(html, requests));
  });

  return router;
}

/**
 * The drill page's `index.html`, built once per build (a rebuild changes the files' times), or
 * null without a metafile: the page then loads as before, only in more waves.
 */
function drillPageIndex(indexFile: string, metafileFile: string): () => string | null {
  let built: { key: string; html: string | null } | null = null;
  return () => {
    let key: string;
    try {
      key = `${statSync(indexFile).mtimeMs}:${statSync(metafileFile).mtimeMs}`;
    } catch {
      return null;
    }
    if (built?.key !== key) {
      const metafile = readMetafile(metafileFile);
      built = {
        key,
        html:
          metafile &&
          injectPreloads(
            readFileSync(indexFile, 'utf8'),
            routePreloads(metafile, DRILL_PAGE_ENTRIES, MUSIC_FONTS_SOURCE),
          ),
      };
    }
    return built.html;
  };
}

function sendBuildMissing(res: Response): void {
  res
    .status(503)
    .type('html')
    .setHeader('Cache-Control', 'no-store')
    .send(
      '<!doctype html><html lang="en"><head><meta charset="utf-8"><title>Tensile: app not built</title></head>' +
        '<body><h1>The web app has not been built yet</h1>' +
        '<p>Run <code>npm run build</code>, then reload this page. ' +
        '(<code>npm start</code> builds and starts the server in one step.)</p></body></html>',
    );
}
