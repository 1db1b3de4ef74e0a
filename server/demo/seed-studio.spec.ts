import { afterAll, beforeAll, describe, expect, it } from 'vitest';
import { createTestApp, type TestApp } from '../testing/test-app';
import { seedDemoAuthoring } from './seed-authoring';
import { seedDemoStudio } from './seed-studio';

let t: TestApp;
beforeAll(async () => {
  t = await createTestApp();
  await seedDemoAuthoring(t.db);
});
afterAll(async () => {
  await t.close();
});

describe('seedDemoStudio', () => {
  it('adds studios, assignments and weeks of practice once, and nothing on the next start', async () => {
    const first = await seedDemoStudio(t.db);
    expect(first.links).toBe(4);
    // Each teacher's first two saved drills (Hana has one) are assigned to all their students.
    const drills = await Promise.all(
      ['tomasz.reyes@larkspur.test', 'hana.lindqvist@larkspur.test'].map(async (email) => {
        const owner = t.db('users').where({ email }).select('id');
        const rows = await t.db('saved_drills').whereIn('owner_id', owner).count({ n: '*' });
        return Math.min(2, Number(rows[0]!.n));
      }),
    );
    expect(first.assignments).toBe(drills[0]! + drills[1]!);
    expect(first.assignments).toBeGreaterThanOrEqual(3);
    expect(first.logs).toBeGreaterThan(60);
    const days = (await t.db('practice_logs').select('practised_at')).map((r) =>
      Number(new Date(r.practised_at)),
    );
    // Several weeks of history, none of it in the future.
    expect(Math.max(...days) - Math.min(...days)).toBeGreaterThan(4 * 7 * 86_400_000);
    expect(Math.max(...days)).toBeLessThanOrEqual(Date.now());
    expect(await seedDemoStudio(t.db)).toEqual({ links: 0, assignments: 0, logs: 0 });
    const emails = await t
      .db('users')
      .whereIn('id', t.db('studio_students').select('student_id'))
      .pluck('email');
    for (const email of emails) expect(email).toMatch(/\.test$/);
  });
});
