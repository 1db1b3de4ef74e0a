/**
 * Runs in a worker thread: engraves thumbnails so that the first draw (loading jsdom and the
 * fonts, then VexFlow) never holds up the server's requests.
 */
import { parentPort } from 'node:worker_threads';
import { engraveInProcess } from './engrave-thumbnail';

interface Job {
  readonly id: number;
  readonly drill: Parameters<typeof engraveInProcess>[0];
}

parentPort?.on('message', (job: Job) => {
  engraveInProcess(job.drill).then(
    (svg) => parentPort?.postMessage({ id: job.id, svg }),
    (error: unknown) =>
      parentPort?.postMessage({
        id: job.id,
        error: error instanceof Error ? error.message : String(error),
      }),
  );
});
