import { afterAll, beforeAll, describe, expect, it } from 'vitest';
import { BUILT_IN_PRESETS } from '../../shared/generator/presets/index';
import { createDb, migrateLatest } from '../db';
import { createTestApp, type TestApp } from '../testing/test-app';
import { syncBuiltInPresets } from './sync-built-ins';

let t: TestApp;
beforeAll(async () => {
  t = await createTestApp({ seed: true });
});
afterAll(async () => {
  await t.close();
});

const count = async () => Number((await t.db('presets').count({ n: '*' }))[0]!.n);

describe('built-in presets in the database', () => {
  it('are all there after the first start, in the built-in order', async () => {
    const rows = await t.db('presets').orderBy('position').select('id', 'built_in', 'published');
    expect(rows.map((r: { id: string }) => r.id)).toEqual(BUILT_IN_PRESETS.map((p) => p.id));
  });

  it('survive restarts without duplicates and keep the admin’s edits', async () => {
    const admin = await t.signIn('admin');
    const edit = {
      title: 'Kick waits',
      summary: 'Edited.',
      level: 'advanced',
      tags: ['mine'],
      position: 50,
      published: false,
    };
    expect((await admin.put('/api/presets/kick-off-the-one').send(edit)).status).toBe(200);
    const before = await t.db('presets').orderBy('id');

    // A restart is another process opening the same database: migrate, then sync again.
    const db = createDb(t.config);
    try {
      expect(await migrateLatest(db)).toEqual([]);
      expect(await syncBuiltInPresets(db)).toBe(0);
      expect(await syncBuiltInPresets(db)).toBe(0);
    } finally {
      await db.destroy();
    }
    expect(await count()).toBe(BUILT_IN_PRESETS.length);
    expect(await t.db('presets').orderBy('id')).toEqual(before);
    const kept = await admin.get('/api/presets/kick-off-the-one');
    expect(kept.body.preset).toMatchObject(edit);
  });

  it('adds a built-in card that appears in a later release, after the others', async () => {
    const later = {
      id: 'later-built-in',
      title: 'Later built-in',
      summary: 'Shipped in a later release.',
      card: BUILT_IN_PRESETS[0]!.card,
    };
    expect(await syncBuiltInPresets(t.db, [...BUILT_IN_PRESETS, later])).toBe(1);
    expect(await syncBuiltInPresets(t.db, [...BUILT_IN_PRESETS, later])).toBe(0);
    const row = await t.db('presets').where({ id: 'later-built-in' }).first();
    const last = await t.db('presets').max({ p: 'position' });
    expect(Number(row.position)).toBe(Number(last[0]!.p));
    expect(row.title).toBe('Later built-in');
    expect(await count()).toBe(BUILT_IN_PRESETS.length + 1);
  });

  it('brings an unedited built-in preset up to a later release, and leaves an edited one alone', async () => {
    const admin = await t.signIn('admin');
    const edited = { summary: 'The admin’s own words.' };
    expect((await admin.put('/api/presets/late-backbeat').send(edited)).status).toBe(200);
    const release = BUILT_IN_PRESETS.map((preset) =>
      preset.id === 'early-backbeat' || preset.id === 'late-backbeat'
        ? {
            ...preset,
            summary: `${preset.summary} Revised.`,
            card: { ...(preset.card as object), tempo: 61 },
          }
        : preset,
    );
    await t.db('presets').where({ id: 'early-backbeat' }).update({
      thumbnail_svg: '<svg/>',
      thumbnail_engine: 'old',
    });
    const editedBefore = await t.db('presets').where({ id: 'late-backbeat' }).first();

    expect(await syncBuiltInPresets(t.db, release)).toBe(1);
    expect(await syncBuiltInPresets(t.db, release)).toBe(0);

    const refreshed = await t.db('presets').where({ id: 'early-backbeat' }).first();
    expect(refreshed.summary).toMatch(/ Revised\.$/);
    expect(JSON.parse(refreshed.card).tempo).toBe(61);
    expect(refreshed.thumbnail_svg).toBeNull();
    expect(String(refreshed.updated_at)).toBe(String(refreshed.created_at));
    expect(await t.db('presets').where({ id: 'late-backbeat' }).first()).toEqual(editedBefore);
  });

  it('stops the start when a built-in card is invalid, naming it', async () => {
    const broken = { id: 'broken', title: 'Broken', summary: '', card: { bars: 0 } };
    await expect(syncBuiltInPresets(t.db, [broken])).rejects.toThrow(/Built-in preset "broken"/);
  });
});
