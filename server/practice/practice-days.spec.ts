import { afterAll, beforeAll, describe, expect, it } from 'vitest';
import { createTestApp, type TestApp } from '../testing/test-app';

// Days and weeks are UTC days and ISO weeks starting Monday 00:00 UTC (the app says so beside
// its charts); the injected clock puts each log exactly either side of a boundary.
let clock = new Date('2026-03-08T23:59:00Z'); // a Sunday, checked below
let t: TestApp;

beforeAll(async () => {
  t = await createTestApp({ deps: { now: () => clock } });
  const ids = Object.fromEntries(
    (await t.db('users').select('id', 'email')).map((u: { id: number; email: string }) => [
      u.email,
      Number(u.id),
    ]),
  );
  await t.db('studio_students').insert({
    teacher_id: ids['tomasz.reyes@larkspur.test'],
    student_id: ids['juno.marsh@larkspur.test'],
    created_at: new Date('2026-01-01T00:00:00Z'),
  });
});
afterAll(async () => {
  await t.close();
});

async function logAt(iso: string, minutes: number) {
  clock = new Date(iso);
  const juno = await t.signIn('juno.marsh@larkspur.test');
  const res = await juno.post('/api/practice/logs').send({ minutes, tempo: 80, rating: 3 });
  expect(res.status).toBe(201);
  expect(res.body.log.practisedAt).toBe(clock.toISOString());
}

describe('practice days and weeks on the server clock (UTC)', () => {
  it('splits weeks at Monday 00:00 UTC and counts the streak in UTC days', async () => {
    expect(new Date('2026-03-08T00:00:00Z').getUTCDay()).toBe(0); // Sunday
    await logAt('2026-03-07T12:00:00Z', 5);
    await logAt('2026-03-08T23:59:00Z', 10);
    await logAt('2026-03-09T00:01:00Z', 20);
    const juno = await t.signIn('juno.marsh@larkspur.test');
    const progress = (await juno.get('/api/practice/progress')).body.progress;
    expect(progress.minutesPerWeek).toEqual([
      { weekStart: '2026-03-02', minutes: 15 },
      { weekStart: '2026-03-09', minutes: 20 },
    ]);

    const tomasz = await t.signIn('tomasz.reyes@larkspur.test');
    const streak = async (iso: string) => {
      clock = new Date(iso);
      const roster = (await tomasz.get('/api/studio/students')).body.students;
      return roster[0].streak as number;
    };
    expect(await streak('2026-03-09T23:59:59Z')).toBe(3);
    // Tuesday: Monday was practised, so the streak stands until Tuesday ends (UTC).
    expect(await streak('2026-03-10T23:59:59Z')).toBe(3);
    expect(await streak('2026-03-11T00:00:00Z')).toBe(0);
  });
});
