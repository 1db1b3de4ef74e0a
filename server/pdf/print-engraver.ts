import { keptDrawings, type DrawingCache } from './drawing-cache';
import { engravingPool, type EngraveOptions, type EngravingJob } from './engraving-pool';
import { notationKey, type NotationArt } from './notation-art';

/** Engraves drills (the pool's `engrave`); specs inject one that counts. */
export type Engrave = (
  jobs: readonly EngravingJob[],
  options?: EngraveOptions,
) => Promise<NotationArt[]>;

export interface PrintEngraver {
  /**
   * Engrave in the background the drawings not kept yet (a worksheet composed or opened), behind
   * any export's drills. Resolves once they are kept; never rejects (an export engraves again).
   */
  prepare(jobs: readonly EngravingJob[]): Promise<void>;
  /** Each job's drawing for an export: kept, awaited if under way, else engraved now. */
  drawings(jobs: readonly EngravingJob[], signal?: AbortSignal): Promise<NotationArt[]>;
  readonly cache: DrawingCache;
}

export function printEngraver(
  engrave: Engrave,
  cache: DrawingCache = keptDrawings,
  /** Puts background jobs an export now waits for ahead of other background work. */
  hurry: (jobs: readonly EngravingJob[]) => void = () => undefined,
): PrintEngraver {
  // Drawings being engraved in the background, so an export waits for them rather than
  // engraving the same drill twice. Settles to undefined when the engraving failed.
  const underWay = new Map<string, { art: Promise<NotationArt | undefined>; job: EngravingJob }>();

  return {
    cache,
    async prepare(jobs) {
      const keyed = distinct(jobs).filter(({ key }) => !cache.has(key) && !underWay.has(key));
      if (keyed.length === 0) return;
      const batch = engrave(
        keyed.map(({ job }) => job),
        { background: true },
      );
      const settled = keyed.map(({ key }, i) => {
        const art = batch.then(
          (all) => all[i],
          () => undefined,
        );
        underWay.set(key, { art, job: keyed[i]!.job });
        return art.then((drawn) => {
          if (drawn) cache.set(key, drawn);
          underWay.delete(key);
        });
      });
      await Promise.all(settled);
    },
    async drawings(jobs, signal) {
      const wanted = jobs.map((job) => ({ job, key: keyOf(job) }));
      const found = new Map<string, NotationArt>();
      hurry(wanted.flatMap(({ key }) => underWay.get(key)?.job ?? []));
      for (const { key } of wanted) {
        if (found.has(key)) continue;
        // Looked up again after each wait: background work keeps drawings meanwhile.
        const coming = cache.get(key) ?? underWay.get(key)?.art;
        const drawn = coming && (await untilAborted(Promise.resolve(coming), signal));
        if (drawn) found.set(key, drawn);
      }
      const missing = distinct(jobs).filter(({ key }) => !found.has(key));
      const fresh =
        missing.length === 0
          ? []
          : await engrave(
              missing.map(({ job }) => job),
              { signal },
            );
      missing.forEach(({ key }, i) => {
        found.set(key, fresh[i]!);
        cache.set(key, fresh[i]!);
      });
      return wanted.map(({ key }) => found.get(key)!);
    },
  };
}

const keyOf = (job: EngravingJob) => notationKey(job.drill, job.aids, job.maxAspect);

/** The jobs with their keys, each drawing once (a drill can appear twice on a sheet). */
function distinct(jobs: readonly EngravingJob[]): { job: EngravingJob; key: string }[] {
  const byKey = new Map(jobs.map((job) => [keyOf(job), job]));
  return [...byKey].map(([key, job]) => ({ job, key }));
}

function untilAborted<T>(work: Promise<T>, signal?: AbortSignal): Promise<T> {
  if (!signal) return work;
  signal.throwIfAborted();
  return new Promise<T>((resolve, reject) => {
    const stop = () => reject(signal.reason as Error);
    signal.addEventListener('abort', stop, { once: true });
    work.then(resolve, reject).finally(() => signal.removeEventListener('abort', stop));
  });
}

let shared: PrintEngraver | undefined;

/**
 * The server's engraver: one worker pool (its default job timeout, engraving-pool.ts) and one
 * cache for every export and every background job.
 */
export function sharedPrintEngraver(): PrintEngraver {
  if (!shared) {
    const pool = engravingPool();
    shared = printEngraver(
      (jobs, options) => pool.engrave(jobs, options),
      keptDrawings,
      (jobs) => pool.hurry(jobs),
    );
  }
  return shared;
}
