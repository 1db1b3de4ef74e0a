import { afterAll, describe, expect, it } from 'vitest';
import { generateDrill, parseRuleCard } from '../../shared/generator/index';
import { findBuiltInPreset } from '../../shared/generator/presets/index';
import { engraveInProcess } from './engrave-thumbnail';
import { threadedThumbnails } from './thumbnail-thread';

const drill = (id: string) => {
  const full = generateDrill(parseRuleCard(findBuiltInPreset(id)!.card), id);
  return { ...full, bars: full.bars.slice(0, 2) };
};

describe('threadedThumbnails', () => {
  const render = threadedThumbnails();
  afterAll(() => render.close());

  it('draws in a worker thread what the server would draw itself, while the event loop runs', async () => {
    let ticks = 0;
    const timer = setInterval(() => (ticks += 1), 10);
    const drawn = Promise.all([render(drill('early-backbeat')), render(drill('four-over-three'))]);
    const [first, second] = await drawn.finally(() => clearInterval(timer));
    // The main thread kept turning while the worker loaded jsdom, the fonts and VexFlow.
    expect(ticks).toBeGreaterThan(3);
    expect(first).toBe(await engraveInProcess(drill('early-backbeat')));
    expect(second).toBe(await engraveInProcess(drill('four-over-three')));
    expect(first).not.toBe(second);
  }, 60_000);

  it('fails a job with the reason when the drawing fails, and keeps serving', async () => {
    await expect(render({ not: 'a drill' } as never)).rejects.toThrow(
      /The thumbnail could not be drawn/,
    );
    expect(await render(drill('early-backbeat'))).toContain('<svg');
  }, 60_000);
});
