/** Runs in a worker thread of the engraving pool (engraving-pool.ts): engraves one drill a job. */
import { parentPort } from 'node:worker_threads';
import { engraveNotation } from './notation-art';
import type { EngravingJob } from './engraving-pool';

parentPort?.on('message', ({ id, job }: { id: number; job: EngravingJob }) => {
  try {
    const art = engraveNotation(job.drill, job.aids, job.maxAspect);
    parentPort?.postMessage({ id, art });
  } catch (error) {
    parentPort?.postMessage({ id, error: error instanceof Error ? error.message : String(error) });
  }
});
// Loaded: the pool's per-job timeout runs from here, not from the (slower) start.
parentPort?.postMessage({ ready: true });
