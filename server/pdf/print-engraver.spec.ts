import { describe, expect, it } from 'vitest';
import { DrawingCache, drawingBytes } from './drawing-cache';
import type { EngravingJob } from './engraving-pool';
import type { NotationArt } from './notation-art';
import { printEngraver } from './print-engraver';
import { ALL_AIDS, presetDrill } from './testing/sample-print';

const job = (seed: string, maxAspect = 0.6): EngravingJob => ({
  drill: presetDrill('early-backbeat', 2, seed).drill,
  aids: ALL_AIDS,
  maxAspect,
});

/** A stand-in drawing `chars` long, named after the drill it was made for. */
const art = (name: string, chars = 10): NotationArt => ({
  svg: name.padEnd(chars, '.'),
  drawing: { width: 1, height: 1, items: [] },
  width: 1,
  height: 1,
});

/** An engraver whose drawings arrive only when the spec lets them. */
function heldEngraving() {
  const asked: EngravingJob[] = [];
  const waiting: (() => void)[] = [];
  const engrave = (jobs: readonly EngravingJob[]) => {
    asked.push(...jobs);
    return new Promise<NotationArt[]>((resolve) =>
      waiting.push(() => resolve(jobs.map((j) => art(j.drill.seed)))),
    );
  };
  /** Let every engraving asked for finish, turn by turn, until `work` is done. */
  const releaseUntil = async (work: Promise<unknown>) => {
    let done = false;
    void work.finally(() => (done = true));
    while (!done) {
      waiting.splice(0).forEach((go) => go());
      await new Promise((next) => setImmediate(next));
    }
  };
  return { asked, engrave, releaseUntil };
}

describe('DrawingCache', () => {
  it('lets the least recently used drawings go once over its size', () => {
    const one = drawingBytes(art('a', 100));
    const cache = new DrawingCache(3 * one);
    cache.set('a', art('a', 100));
    cache.set('b', art('b', 100));
    cache.set('c', art('c', 100));
    cache.get('a');
    cache.set('d', art('d', 100));
    expect(['a', 'b', 'c', 'd'].filter((k) => cache.has(k))).toEqual(['a', 'c', 'd']);
    expect(cache.bytes).toBe(3 * one);
    // One drawing larger than the whole budget is still kept, alone, until the next.
    cache.set('e', art('e', 1000));
    expect(cache.size).toBe(1);
  });
});

describe('printEngraver', () => {
  it('an export waits for a drawing under way rather than engraving it again', async () => {
    const held = heldEngraving();
    const hurried: string[] = [];
    const engraver = printEngraver(held.engrave, new DrawingCache(1e6), (jobs) =>
      hurried.push(...jobs.map((j) => j.drill.seed)),
    );
    const background = engraver.prepare([job('x'), job('y')]);
    const exported = engraver.drawings([job('y'), job('z'), job('x')]);
    // The export's drills under way in the background go ahead of other background work.
    expect(hurried).toEqual(['y', 'x']);
    await held.releaseUntil(Promise.all([background, exported]));
    const drawn = await exported;
    expect(drawn.map((a) => a.svg.replace(/\.+$/, ''))).toEqual(['y', 'z', 'x']);
    expect(held.asked.map((j) => j.drill.seed)).toEqual(['x', 'y', 'z']);
    // All three kept now: the same export again engraves nothing.
    await engraver.drawings([job('x'), job('y'), job('z')]);
    expect(held.asked).toHaveLength(3);
  });

  it('keys on the room too, and engraves a drawing once however often it is listed', async () => {
    const held = heldEngraving();
    const engraver = printEngraver(held.engrave, new DrawingCache(1e6));
    const exported = engraver.drawings([job('x'), job('x'), job('x', 0.3)]);
    await held.releaseUntil(exported);
    const drawn = await exported;
    expect(held.asked.map((j) => j.maxAspect)).toEqual([0.6, 0.3]);
    expect(drawn[0]).toBe(drawn[1]);
  });

  it('a failed background engraving is done again by the export', async () => {
    let calls = 0;
    const engraver = printEngraver((jobs) => {
      calls += 1;
      return calls === 1
        ? Promise.reject(new Error('worker lost'))
        : Promise.resolve(jobs.map((j) => art(j.drill.seed)));
    }, new DrawingCache(1e6));
    await engraver.prepare([job('x')]);
    expect(engraver.cache.size).toBe(0);
    expect((await engraver.drawings([job('x')]))[0]!.svg).toMatch(/^x/);
    expect(calls).toBe(2);
  });
});
