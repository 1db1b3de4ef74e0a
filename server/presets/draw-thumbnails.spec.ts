import { afterAll, beforeAll, describe, expect, it } from 'vitest';
import { engineGenerator } from '../drills/drill-generator';
import { RuleCardsRepository } from '../rule-cards/rule-cards-repository';
import { createTestApp, type TestApp } from '../testing/test-app';
import { PresetsRepository } from './presets-repository';
import { PresetsService, type ThumbnailRenderer } from './presets-service';

const ENGINE = 'test-engine-1';
/** Long enough that a list request queued behind the drawings would plainly wait for them. */
const DRAW_MS = 300;

let t: TestApp;
let drawn: string[] = [];
/** Stands in for the worker thread's engraving: takes a while, counts what it drew. */
const slowRenderer: ThumbnailRenderer = async (drill) => {
  await new Promise((resolve) => setTimeout(resolve, DRAW_MS));
  drawn.push(drill.seed);
  return `<svg xmlns="http://www.w3.org/2000/svg" data-seed="${drill.seed}"/>`;
};
const service = () =>
  new PresetsService(
    new PresetsRepository(t.db),
    new RuleCardsRepository(t.db),
    engineGenerator,
    slowRenderer,
  );

beforeAll(async () => {
  t = await createTestApp({ deps: { renderThumbnail: slowRenderer, engineVersion: ENGINE } });
});
afterAll(async () => {
  await t.close();
});

describe('PresetsService.drawThumbnails (at server start)', () => {
  it('answers the gallery list while the thumbnails are still being drawn, then serves them from the cache', async () => {
    const ids: string[] = (await t.db('presets').select('id')).map((r: { id: string }) => r.id);
    expect(ids.length).toBeGreaterThan(3);
    drawn = [];
    const background = service().drawThumbnails(ENGINE);
    const student = await t.signIn('student');

    const list = await student.get('/api/presets');
    expect(list.status).toBe(200);
    // Not queued behind the drawing: most thumbnails are still to come when the list answers.
    expect(drawn.length).toBeLessThan(ids.length / 2);

    expect(await background).toBe(ids.length);
    expect([...drawn].sort()).toEqual([...ids].sort());
    const rows = await t.db('presets').select('thumbnail_svg', 'thumbnail_engine');
    for (const row of rows) {
      expect(row.thumbnail_engine).toBe(ENGINE);
      expect(row.thumbnail_svg).toContain('data-seed=');
    }
    // A visitor's request now finds its thumbnail drawn.
    drawn = [];
    const svg = await student.get('/api/presets/early-backbeat/thumbnail.svg').buffer(true);
    expect(svg.status).toBe(200);
    expect(drawn).toEqual([]);
  });

  it('draws nothing on a restart with the same engine, and everything again for a new one', async () => {
    drawn = [];
    expect(await service().drawThumbnails(ENGINE)).toBe(0);
    expect(drawn).toEqual([]);
    const count = (await t.db('presets').count({ n: '*' }).first())!.n;
    expect(await service().drawThumbnails('test-engine-2')).toBe(Number(count));
  });
});
