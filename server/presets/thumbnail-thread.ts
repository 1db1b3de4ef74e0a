import { createRequire } from 'node:module';
import { pathToFileURL } from 'node:url';
import { Worker } from 'node:worker_threads';
import type { ThumbnailRenderer } from './presets-service';

interface Pending {
  readonly resolve: (svg: string) => void;
  readonly reject: (error: Error) => void;
}

type Reply = { id: number; svg: string } | { id: number; error: string };

/**
 * The worker's first lines: the worker is TypeScript like the server, so tsx's loader is
 * registered in the thread before its module is imported (a worker does not inherit the loader
 * the server was started with).
 */
function bootstrap(workerUrl: URL): string {
  const tsx = pathToFileURL(createRequire(import.meta.url).resolve('tsx/esm/api')).href;
  const api = tsx.replace(/\.cjs$/, '.mjs');
  return `import(${JSON.stringify(api)}).then(({ register }) => { register(); return import(${JSON.stringify(workerUrl.href)}); });`;
}

/**
 * A renderer that engraves in one worker thread, started on first use and ended when idle
 * (`unref`, so it never keeps the process alive). Should the worker die, the jobs in hand fail
 * with the reason and the next one starts a fresh worker.
 */
export function threadedThumbnails(
  workerUrl: URL = new URL('./thumbnail-worker.ts', import.meta.url),
): ThumbnailRenderer & { close(): Promise<void> } {
  let worker: Worker | null = null;
  let nextId = 0;
  const pending = new Map<number, Pending>();

  const failAll = (error: Error): void => {
    for (const job of pending.values()) job.reject(error);
    pending.clear();
  };

  const start = (): Worker => {
    const started = new Worker(bootstrap(workerUrl), { eval: true });
    started.unref();
    started.on('message', (reply: Reply) => {
      const job = pending.get(reply.id);
      if (!job) return;
      pending.delete(reply.id);
      if ('svg' in reply) job.resolve(reply.svg);
      else job.reject(new Error(`The thumbnail could not be drawn: ${reply.error}`));
    });
    started.on('error', (error) => {
      worker = null;
      failAll(error);
    });
    started.on('exit', (code) => {
      if (worker === started) worker = null;
      if (pending.size) failAll(new Error(`The thumbnail worker stopped (exit code ${code}).`));
    });
    return started;
  };

  const render = ((drill) =>
    new Promise<string>((resolve, reject) => {
      worker ??= start();
      const id = nextId++;
      pending.set(id, { resolve, reject });
      // Only busy while a job is out, so an idle worker never holds the process open.
      worker.ref();
      worker.postMessage({ id, drill });
    }).finally(() => {
      if (pending.size === 0) worker?.unref();
    })) as ThumbnailRenderer & { close(): Promise<void> };
  render.close = async () => {
    const running = worker;
    worker = null;
    if (running) await running.terminate();
  };
  return render;
}
