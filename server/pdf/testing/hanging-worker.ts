/** A worker that loads, says so, and never answers a job: the pool's timeout spec. */
import { parentPort } from 'node:worker_threads';

parentPort?.on('message', () => undefined);
parentPort?.postMessage({ ready: true });
