import { afterAll, describe, expect, it } from 'vitest';
import { engravingPool, type EngravingJob } from './engraving-pool';
import { engraveNotation } from './notation-art';
import { ALL_AIDS, presetDrill } from './testing/sample-print';

const jobs: EngravingJob[] = [
  { drill: presetDrill('early-backbeat', 4, 'pool-1').drill, aids: ALL_AIDS, maxAspect: 0.6 },
  {
    drill: presetDrill('quintuplets-hihat-1-3-5', 4, 'pool-2').drill,
    aids: { sticking: false, counts: true, tension: false },
    maxAspect: 0.3,
  },
  { drill: presetDrill('linear-sixteenths', 2, 'pool-3').drill, aids: ALL_AIDS, maxAspect: 1 },
];

describe('engravingPool', () => {
  const pool = engravingPool({ size: 2 });
  const failing = engravingPool({
    size: 2,
    workerUrl: new URL('./testing/failing-worker.ts', import.meta.url),
  });
  afterAll(() => Promise.all([pool.close(), failing.close()]));

  it('engraves in worker threads, in order, exactly what this thread engraves', async () => {
    let ticks = 0;
    const timer = setInterval(() => (ticks += 1), 10);
    const art = await pool.engrave(jobs).finally(() => clearInterval(timer));
    // The event loop kept turning while the workers loaded VexFlow and engraved.
    expect(ticks).toBeGreaterThan(3);
    expect(pool.engraved).toEqual({ inThreads: jobs.length, here: 0, timedOut: 0, workers: 2 });
    art.forEach((drawn, i) => {
      const job = jobs[i]!;
      expect(drawn).toEqual(engraveNotation(job.drill, job.aids, job.maxAspect));
    });
    expect(art[0]!.svg).not.toBe(art[1]!.svg);
    // Warm workers serve the next export too.
    expect(await pool.engrave(jobs.slice(0, 1))).toEqual(art.slice(0, 1));
    expect(pool.engraved.inThreads).toBe(jobs.length + 1);
  }, 120_000);

  it('engraves here what a dying worker could not', async () => {
    const art = await failing.engrave(jobs.slice(0, 2));
    expect(art).toEqual(jobs.slice(0, 2).map((j) => engraveNotation(j.drill, j.aids, j.maxAspect)));
    expect(failing.engraved).toMatchObject({ inThreads: 0, here: 2, timedOut: 0 });
  }, 120_000);

  it('stops between drills when the download is cancelled', async () => {
    const controller = new AbortController();
    controller.abort();
    await expect(pool.engrave(jobs, { signal: controller.signal })).rejects.toThrow();
  });

  it('serves two exports at once, each its own drawings', async () => {
    const [one, two] = await Promise.all([
      pool.engrave(jobs.slice(0, 2)),
      pool.engrave(jobs.slice(1, 3), { background: true }),
    ]);
    expect(one.map((a) => a.svg)).toEqual(
      jobs.slice(0, 2).map((j) => engraveNotation(j.drill, j.aids, j.maxAspect).svg),
    );
    expect(two[0]!.svg).toBe(one[1]!.svg);
    expect(two[1]).toEqual(engraveNotation(jobs[2]!.drill, jobs[2]!.aids, jobs[2]!.maxAspect));
  }, 120_000);

  it('gives up on a worker that never answers: engraves here and starts another', async () => {
    const hanging = engravingPool({
      size: 2,
      workerUrl: new URL('./testing/hanging-worker.ts', import.meta.url),
      jobTimeoutMs: 200,
    });
    try {
      const art = await hanging.engrave(jobs.slice(0, 1));
      expect(art).toEqual([engraveNotation(jobs[0]!.drill, jobs[0]!.aids, jobs[0]!.maxAspect)]);
      expect(hanging.engraved).toEqual({ inThreads: 0, here: 1, timedOut: 1, workers: 1 });
      // The next job goes to a new worker (which hangs too), not to a lane left waiting.
      await hanging.engrave(jobs.slice(1, 2));
      expect(hanging.engraved).toEqual({ inThreads: 0, here: 2, timedOut: 2, workers: 2 });
    } finally {
      await hanging.close();
    }
  }, 120_000);
});
