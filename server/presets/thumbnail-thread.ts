import type { Worker } from 'node:worker_threads';
import { tsWorker } from '../threads/ts-worker';
import type { ThumbnailRenderer } from './presets-service';

interface Pending {
  readonly resolve: (svg: string) => void;
  readonly reject: (error: Error) => void;
}

type Reply = { id: number; svg: string } | { id: number; error: string };

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
    const started = tsWorker(workerUrl);
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
