import request from 'supertest';
import { expect, it } from 'vitest';
import { BUILT_IN_PRESETS, findBuiltInPreset } from '../../shared/generator/presets/index';
import { seedDemoAuthoring } from '../demo/seed-authoring';
import { syncBuiltInPresets } from '../presets/sync-built-ins';
import type { TestApp } from './test-app';

/**
 * The authoring API's queries end to end on whichever database `app()` runs on: filters, sorting,
 * paging, counts, JSON text, timestamps, booleans, view counting and revocation. Used by the
 * PostgreSQL suite, where SQLite-only SQL would fail.
 */
export function authoringJourney(app: () => TestApp): void {
  const card = (id: string) => structuredClone(findBuiltInPreset(id)!.card);

  it('seeds the presets once and filters the gallery in SQL', async () => {
    const t = app();
    expect(await syncBuiltInPresets(t.db)).toBe(0);
    const student = await t.signIn('student');
    const all = await student.get('/api/presets');
    expect(all.body.presets.map((p: { id: string }) => p.id)).toEqual(
      BUILT_IN_PRESETS.map((p) => p.id),
    );
    const odd = await student.get(
      '/api/presets?subdivision=5&level=advanced&tag=odd%20subdivision',
    );
    expect(odd.body.presets).toHaveLength(2);
    expect((await student.get('/api/presets?meter=7%2F8')).body.presets).toHaveLength(1);
  });

  it('keeps rule cards and drills per teacher, with lists sorted, filtered and paged', async () => {
    const t = app();
    const hana = await t.signIn('hana.lindqvist@larkspur.test');
    const tomasz = await t.signIn('tomasz.reyes@larkspur.test');
    const ids: number[] = [];
    for (const [title, id, tags] of [
      ['b Poly', 'four-over-three', ['polyrhythm']],
      ['A Seven', 'seven-eight-two-two-three', ['odd meter']],
      ['c 100%', 'early-backbeat', []],
    ] as const) {
      const res = await hana.post('/api/rule-cards').send({ title, card: card(id), tags });
      expect(res.status).toBe(201);
      ids.push(res.body.ruleCard.id);
    }
    const page = await hana.get('/api/rule-cards?sort=title&pageSize=2');
    expect(page.body.total).toBe(3);
    expect(page.body.items.map((c: { title: string }) => c.title)).toEqual(['A Seven', 'b Poly']);
    expect((await hana.get('/api/rule-cards?tag=polyrhythm')).body.total).toBe(1);
    for (const sort of ['level', 'subdivision', 'meter', 'drillCount', 'createdAt']) {
      expect((await hana.get(`/api/rule-cards?sort=${sort}`)).body.total).toBe(3);
    }
    expect((await hana.get('/api/rule-cards?q=%25')).body.total).toBe(1);
    expect((await hana.get('/api/rule-cards?meter=7%2F8&subdivision=2')).body.total).toBe(1);
    expect((await tomasz.get(`/api/rule-cards/${ids[0]}`)).status).toBe(404);

    const drill = await hana
      .post('/api/drills')
      .send({ ruleCardId: ids[0], title: 'Poly drill', card: card('four-over-three'), seed: 'pg' });
    expect(drill.status).toBe(201);
    const sorted = await hana.get('/api/rule-cards?sort=drillCount');
    expect(sorted.body.items[0]).toMatchObject({ id: ids[0], drillCount: 1 });
    expect(new Date(sorted.body.items[0].updatedAt).getTime()).toBeGreaterThan(0);
    expect((await hana.delete(`/api/rule-cards/${ids[0]}`)).body).toEqual({ archived: true });
    expect((await hana.get('/api/rule-cards?archived=true')).body.total).toBe(1);
    expect((await hana.delete(`/api/rule-cards/${ids[2]}`)).status).toBe(204);
    const drills = await hana.get(`/api/drills?ruleCardId=${ids[0]}&q=POLY`);
    expect(drills.body.items.map((d: { id: number }) => d.id)).toEqual([drill.body.drill.id]);

    const link = await hana.post(`/api/drills/${drill.body.drill.id}/share`);
    expect(link.status).toBe(201);
    const code = link.body.link.code as string;
    await Promise.all([1, 2, 3].map(() => request(t.app).get(`/api/seed-links/${code}`)));
    const seen = await hana.get(`/api/drills/${drill.body.drill.id}`);
    expect(seen.body.drill.shareLink.views).toBe(3);
    expect(seen.body.drill.snapshot).toEqual(drill.body.drill.snapshot);
    expect((await hana.delete(`/api/drills/${drill.body.drill.id}/share`)).status).toBe(204);
    expect((await request(t.app).get(`/api/seed-links/${code}`)).status).toBe(410);
  });

  it('promotes, publishes, starts from and imports', async () => {
    const t = app();
    const admin = await t.signIn('admin');
    const tomasz = await t.signIn('tomasz.reyes@larkspur.test');
    const mine = await tomasz
      .post('/api/rule-cards')
      .send({ title: 'Promote me', card: card('groove-and-fill') });
    const promoted = await admin
      .post('/api/presets/promote')
      .send({ ruleCardId: mine.body.ruleCard.id });
    expect(promoted.body.preset).toMatchObject({ credit: 'Tomasz Reyes', published: false });
    const id = promoted.body.preset.id as string;
    expect(
      (await admin.put(`/api/presets/${id}`).send({ published: true })).body.preset.published,
    ).toBe(true);
    const started = await tomasz.post(`/api/presets/${id}/start`);
    expect(started.body.ruleCard.fromPreset).toEqual({ id, title: 'Promote me' });
    const imported = await tomasz.post('/api/rule-cards/import').send({
      format: 'tensile.rule-card',
      version: 1,
      title: 'Imported',
      card: card('six-eight-groove'),
    });
    expect(imported.status).toBe(201);
  });

  it('adds the demo material only to an empty authoring database', async () => {
    const t = app();
    expect((await seedDemoAuthoring(t.db)).ruleCards).toBe(0);
  });
}
