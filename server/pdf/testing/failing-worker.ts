/** A worker that dies on its first job, for the pool's fallback spec. */
import { parentPort } from 'node:worker_threads';

parentPort?.on('message', () => process.exit(3));
