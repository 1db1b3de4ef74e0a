import { createRequire } from 'node:module';
import { pathToFileURL } from 'node:url';
import { Worker } from 'node:worker_threads';

/**
 * A worker thread running a TypeScript module. A worker does not inherit the loader the server
 * was started with, so its first lines register tsx's loader before importing the module.
 */
export function tsWorker(workerUrl: URL): Worker {
  return new Worker(bootstrap(workerUrl), { eval: true });
}

function bootstrap(workerUrl: URL): string {
  const tsx = pathToFileURL(createRequire(import.meta.url).resolve('tsx/esm/api')).href;
  const api = tsx.replace(/\.cjs$/, '.mjs');
  return `import(${JSON.stringify(api)}).then(({ register }) => { register(); return import(${JSON.stringify(workerUrl.href)}); });`;
}
