import { availableParallelism } from 'node:os';
import type { Worker } from 'node:worker_threads';
import type { Drill } from '../../shared/generator/index';
import { tsWorker } from '../threads/ts-worker';
import { engraveNotation, type NotationArt } from './notation-art';
import type { PrintAids } from './worksheet-print';

export interface EngravingJob {
  readonly drill: Drill;
  readonly aids: PrintAids;
  readonly maxAspect: number;
}

export interface EngravingPool {
  /** Each job's drawing, in order; the same as `engraveNotation` draws in this thread. */
  engrave(jobs: readonly EngravingJob[], signal?: AbortSignal): Promise<NotationArt[]>;
  /** Drills engraved so far in worker threads and in this thread (for the specs and logs). */
  readonly engraved: { inThreads: number; here: number };
  close(): Promise<void>;
}

type Reply = { id: number; art: NotationArt } | { id: number; error: string };

/**
 * Each worker holds its own VexFlow, fonts and compiled code (tens of MB), and a worksheet has
 * a handful of drills, so a few workers are enough even on a large machine.
 */
const MOST_WORKERS = 4;

/** Workers that start, or a job that fails, this many times in a row leave engraving here. */
const FAILURES_BEFORE_GIVING_UP = 3;

/**
 * Engraving is synchronous CPU work (VexFlow), a drill at a time: a worksheet's drills are
 * shared among worker threads, one per core. Workers start on first use and stay for the next
 * export (loading tsx, the fonts and VexFlow costs more than a drill), `unref`'d while idle so
 * they never hold the process open. A job a worker fails (it dies, cannot start, or throws) is
 * engraved in this thread instead; after repeated failures the pool is not used again. With
 * one core the pool engraves here: a worker would only add the copying.
 */
export function engravingPool(
  size = Math.min(availableParallelism(), MOST_WORKERS),
  workerUrl: URL = new URL('./engraving-worker.ts', import.meta.url),
): EngravingPool {
  const lanes = Array.from({ length: size > 1 ? size : 0 }, () => lane(workerUrl));
  let failures = 0;
  const engraved = { inThreads: 0, here: 0 };

  const here = (job: EngravingJob) => {
    engraved.here += 1;
    return engraveNotation(job.drill, job.aids, job.maxAspect);
  };

  return {
    engraved,
    async engrave(jobs, signal) {
      if (lanes.length === 0 || failures >= FAILURES_BEFORE_GIVING_UP || jobs.length === 0)
        return jobs.map((job) => (signal?.throwIfAborted(), here(job)));
      const results: NotationArt[] = new Array(jobs.length);
      let next = 0;
      await Promise.all(
        lanes.map(async (worker) => {
          while (next < jobs.length) {
            signal?.throwIfAborted();
            const index = next++;
            const job = jobs[index]!;
            try {
              results[index] = await worker.engrave(job);
              failures = 0;
              engraved.inThreads += 1;
            } catch {
              failures += 1;
              results[index] = here(job);
            }
          }
        }),
      );
      return results;
    },
    async close() {
      await Promise.all(lanes.map((worker) => worker.close()));
    },
  };
}

interface Lane {
  engrave(job: EngravingJob): Promise<NotationArt>;
  close(): Promise<void>;
}

/** One worker thread taking one job at a time; a dead worker is replaced on the next job. */
function lane(workerUrl: URL): Lane {
  let worker: Worker | null = null;
  let nextId = 0;
  let pending: { id: number; resolve(art: NotationArt): void; reject(error: Error): void } | null =
    null;

  const fail = (error: Error) => {
    const job = pending;
    pending = null;
    job?.reject(error);
  };

  const start = (): Worker => {
    const started = tsWorker(workerUrl);
    started.unref();
    started.on('message', (reply: Reply) => {
      if (!pending || reply.id !== pending.id) return;
      const job = pending;
      pending = null;
      if ('art' in reply) job.resolve(reply.art);
      else job.reject(new Error(`The drill could not be engraved: ${reply.error}`));
    });
    started.on('error', (error) => {
      if (worker === started) worker = null;
      fail(error);
    });
    started.on('exit', (code) => {
      if (worker === started) worker = null;
      fail(new Error(`The engraving worker stopped (exit code ${code}).`));
    });
    return started;
  };

  return {
    engrave(job) {
      const running = (worker ??= start());
      return new Promise<NotationArt>((resolve, reject) => {
        pending = { id: nextId++, resolve, reject };
        // Busy only while a job is out, so an idle worker never holds the process open.
        running.ref();
        running.postMessage({ id: pending.id, job });
      }).finally(() => running.unref());
    },
    async close() {
      const running = worker;
      worker = null;
      if (running) await running.terminate();
    },
  };
}
