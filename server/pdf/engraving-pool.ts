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

export interface EngraveOptions {
  readonly signal?: AbortSignal;
  /** Background work (a worksheet being composed) waits behind every export's drills. */
  readonly background?: boolean;
}

export interface EngravingPool {
  /** Each job's drawing, in order; the same as `engraveNotation` draws in this thread. */
  engrave(jobs: readonly EngravingJob[], options?: EngraveOptions): Promise<NotationArt[]>;
  /** Move these jobs (the same objects), if still queued as background work, ahead of it. */
  hurry(jobs: readonly EngravingJob[]): void;
  /** Drills engraved so far in worker threads and in this thread (for the specs and logs). */
  readonly engraved: { inThreads: number; here: number; timedOut: number; workers: number };
  close(): Promise<void>;
}

export interface PoolOptions {
  readonly size?: number;
  readonly workerUrl?: URL;
  /**
   * How long a worker may take over one drill once it is running; past it the worker is taken
   * for hung, replaced, and the drill engraved in this thread. A 16-bar drill takes ~0.15 s on
   * an idle core, so 20 s leaves room for a machine loaded forty times over.
   */
  readonly jobTimeoutMs?: number;
  /** How long a new worker may take to load tsx, the fonts and VexFlow (~1 s idle). */
  readonly startTimeoutMs?: number;
}

type Reply = { ready: true } | { id: number; art: NotationArt } | { id: number; error: string };

/**
 * Each worker holds its own VexFlow, fonts and compiled code (tens of MB), and a worksheet has
 * a handful of drills, so a few workers are enough even on a large machine.
 */
const MOST_WORKERS = 4;

/** Workers that start, or a job that fails, this many times in a row leave engraving here. */
const FAILURES_BEFORE_GIVING_UP = 3;

export const DEFAULT_JOB_TIMEOUT_MS = 20_000;
export const DEFAULT_START_TIMEOUT_MS = 60_000;

interface Queued {
  readonly job: EngravingJob;
  urgent: boolean;
  readonly signal?: AbortSignal;
  resolve(art: NotationArt): void;
  reject(error: unknown): void;
}

/**
 * Engraving is synchronous CPU work (VexFlow), a drill at a time: drills wait in one queue
 * (an export's ahead of background work) and each worker thread, one per core, takes the next as
 * it finishes one. Workers start on first use and stay (loading tsx, the fonts and VexFlow costs
 * more than a drill), `unref`'d while idle so they never hold the process open. A job a worker
 * fails (it dies, cannot start, throws, or hangs past the timeout) is engraved in this thread
 * instead and the worker replaced; after repeated failures the pool is not used again. With one
 * core the pool engraves here: a worker would only add the copying.
 */
export function engravingPool(options: PoolOptions = {}): EngravingPool {
  const size = options.size ?? Math.min(availableParallelism(), MOST_WORKERS);
  const workerUrl = options.workerUrl ?? new URL('./engraving-worker.ts', import.meta.url);
  const timeouts = {
    job: options.jobTimeoutMs ?? DEFAULT_JOB_TIMEOUT_MS,
    start: options.startTimeoutMs ?? DEFAULT_START_TIMEOUT_MS,
  };
  const lanes = Array.from({ length: size > 1 ? size : 0 }, () =>
    lane(workerUrl, timeouts, () => (engraved.workers += 1)),
  );
  const idle = new Set(lanes);
  const queue: Queued[] = [];
  let failures = 0;
  const engraved = { inThreads: 0, here: 0, timedOut: 0, workers: 0 };

  const here = (job: EngravingJob) => {
    engraved.here += 1;
    return engraveNotation(job.drill, job.aids, job.maxAspect);
  };

  const takeNext = (): Queued | undefined => {
    const index = queue.findIndex((q) => q.urgent);
    return queue.splice(index >= 0 ? index : 0, 1)[0];
  };

  const settle = (item: Queued, work: () => NotationArt) => {
    try {
      item.resolve(work());
    } catch (error) {
      item.reject(error);
    }
  };

  const run = async (worker: Lane) => {
    for (let item = takeNext(); item; item = takeNext()) {
      if (item.signal?.aborted) {
        item.reject(item.signal.reason);
        continue;
      }
      if (failures >= FAILURES_BEFORE_GIVING_UP) {
        settle(item, () => here(item.job));
        continue;
      }
      try {
        const art = await worker.engrave(item.job);
        failures = 0;
        engraved.inThreads += 1;
        item.resolve(art);
      } catch (error) {
        failures += 1;
        if (error instanceof TimeoutError) engraved.timedOut += 1;
        settle(item, () => here(item.job));
      }
    }
    idle.add(worker);
  };

  const dispatch = () => {
    for (const worker of idle) {
      if (queue.length === 0) return;
      idle.delete(worker);
      void run(worker);
    }
  };

  return {
    engraved,
    async engrave(jobs, { signal, background = false } = {}) {
      if (lanes.length === 0) {
        const art: NotationArt[] = [];
        for (const job of jobs) {
          signal?.throwIfAborted();
          // Background work yields between drills, so requests are answered meanwhile.
          if (background) await new Promise((next) => setImmediate(next));
          art.push(here(job));
        }
        return art;
      }
      signal?.throwIfAborted();
      const results = jobs.map(
        (job) =>
          new Promise<NotationArt>((resolve, reject) =>
            queue.push({ job, urgent: !background, signal, resolve, reject }),
          ),
      );
      dispatch();
      return Promise.all(results);
    },
    hurry(jobs) {
      const wanted = new Set(jobs);
      for (const item of queue) if (wanted.has(item.job)) item.urgent = true;
    },
    async close() {
      await Promise.all(lanes.map((worker) => worker.close()));
    },
  };
}

class TimeoutError extends Error {}

interface Lane {
  engrave(job: EngravingJob): Promise<NotationArt>;
  close(): Promise<void>;
}

/**
 * One worker thread taking one job at a time. A dead worker is replaced on the next job; a hung
 * one (no answer within the timeout, counted from when it has loaded) is terminated first.
 */
function lane(workerUrl: URL, timeouts: { job: number; start: number }, onStart: () => void): Lane {
  let worker: Worker | null = null;
  let ready = false;
  let nextId = 0;
  let pending: {
    id: number;
    resolve(art: NotationArt): void;
    reject(error: Error): void;
    timer?: NodeJS.Timeout;
  } | null = null;

  const fail = (error: Error) => {
    const job = pending;
    pending = null;
    if (job?.timer) clearTimeout(job.timer);
    job?.reject(error);
  };

  /** Give up on the running worker: it is terminated and a new one starts on the next job. */
  const abandon = (why: string) => {
    const hung = worker;
    worker = null;
    fail(new TimeoutError(why));
    void hung?.terminate();
  };

  const arm = (ms: number, why: string) => {
    if (!pending) return;
    clearTimeout(pending.timer);
    pending.timer = setTimeout(() => abandon(why), ms);
  };

  const start = (): Worker => {
    const started = tsWorker(workerUrl);
    onStart();
    ready = false;
    started.unref();
    started.on('message', (reply: Reply) => {
      if (worker !== started) return;
      if ('ready' in reply) {
        ready = true;
        arm(timeouts.job, `The engraving worker gave no answer in ${timeouts.job} ms.`);
        return;
      }
      if (!pending || reply.id !== pending.id) return;
      const job = pending;
      pending = null;
      clearTimeout(job.timer);
      if ('art' in reply) job.resolve(reply.art);
      else job.reject(new Error(`The drill could not be engraved: ${reply.error}`));
    });
    started.on('error', (error) => {
      if (worker !== started) return;
      worker = null;
      fail(error);
    });
    started.on('exit', (code) => {
      if (worker !== started) return;
      worker = null;
      fail(new Error(`The engraving worker stopped (exit code ${code}).`));
    });
    return started;
  };

  return {
    engrave(job) {
      const running = (worker ??= start());
      return new Promise<NotationArt>((resolve, reject) => {
        pending = { id: nextId++, resolve, reject };
        if (ready) arm(timeouts.job, `The engraving worker gave no answer in ${timeouts.job} ms.`);
        else arm(timeouts.start, `The engraving worker did not start in ${timeouts.start} ms.`);
        // Busy only while a job is out, so an idle worker never holds the process open.
        running.ref();
        running.postMessage({ id: pending.id, job });
      }).finally(() => running.unref());
    },
    async close() {
      const running = worker;
      worker = null;
      fail(new Error('The engraving pool was closed.'));
      if (running) await running.terminate();
    },
  };
}
