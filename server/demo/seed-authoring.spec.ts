import request from 'supertest';
import { afterAll, beforeAll, describe, expect, it } from 'vitest';
import { createTestApp, type TestApp } from '../testing/test-app';
import { demoCards } from './demo-authoring';
import { seedDemoAuthoring } from './seed-authoring';

let t: TestApp;
beforeAll(async () => {
  t = await createTestApp();
});
afterAll(async () => {
  await t.close();
});

describe('demo rule cards, drills, links and presets', () => {
  it('fills the teachers’ screens on first start, and adds nothing on the next', async () => {
    const demo = demoCards();
    const first = await seedDemoAuthoring(t.db);
    expect(first).toEqual({
      ruleCards: demo.length,
      drills: demo.reduce((n, card) => n + card.drills.length, 0),
      links: 1,
      presets: 1,
    });
    expect(await seedDemoAuthoring(t.db)).toEqual({
      ruleCards: 0,
      drills: 0,
      links: 0,
      presets: 0,
    });

    for (const email of ['tomasz.reyes@larkspur.test', 'hana.lindqvist@larkspur.test']) {
      const teacher = await t.signIn(email);
      const cards = await teacher.get('/api/rule-cards');
      expect(cards.body.total).toBe(demo.filter((card) => card.owner === email).length);
      const drills = await teacher.get('/api/drills');
      expect(drills.body.total).toBeGreaterThan(0);
    }
  });

  it('shares one drill that opens signed out, credits the preset it started from', async () => {
    const tomasz = await t.signIn('tomasz.reyes@larkspur.test');
    const drills = (await tomasz.get('/api/drills?pageSize=100')).body.items as { id: number }[];
    const full = await Promise.all(
      drills.map(async (d) => (await tomasz.get(`/api/drills/${d.id}`)).body.drill),
    );
    const shared = full.filter((d) => d.shareLink && d.shareLink.revokedAt === null);
    expect(shared).toHaveLength(1);
    const open = await request(t.app).get(`/api/seed-links/${shared[0].shareLink.code}`);
    expect(open.status).toBe(200);
    expect(open.body.drill.teacherName).toBe('Tomasz Reyes');
    const cards = (await tomasz.get('/api/rule-cards?sort=title')).body.items as { id: number }[];
    const details = await Promise.all(
      cards.map(async (c) => (await tomasz.get(`/api/rule-cards/${c.id}`)).body.ruleCard),
    );
    expect(details.map((c) => c.fromPreset?.id ?? null)).toContain('early-backbeat');
  });

  it('publishes a promoted teacher’s card in the gallery, credited', async () => {
    const student = await t.signIn('student');
    const presets = (await student.get('/api/presets')).body.presets as {
      credit: string | null;
      title: string;
    }[];
    const promoted = presets.filter((p) => p.credit !== null);
    expect(promoted).toEqual([
      expect.objectContaining({
        title: 'Seven-eight with a ghosted snare',
        credit: 'Tomasz Reyes',
        published: true,
      }),
    ]);
  });
});
