import { afterAll, beforeAll, describe, expect, it } from 'vitest';
import { createTestApp, type TestApp } from '../testing/test-app';
import { seedDemoAuthoring } from './seed-authoring';
import { seedDemoStudio } from './seed-studio';
import { seedDemoWorksheetAssignment } from './seed-worksheet-assignment';
import { seedDemoWorksheets } from './seed-worksheets';

let t: TestApp;
const now = new Date();
beforeAll(async () => {
  t = await createTestApp();
  await seedDemoAuthoring(t.db);
  await seedDemoStudio(t.db, now);
  await seedDemoWorksheets(t.db);
});
afterAll(async () => {
  await t.close();
});

describe('demo worksheet assignment', () => {
  it('assigns the demo worksheet once, with practice logged on its drills', async () => {
    expect(await seedDemoWorksheetAssignment(t.db, now)).toBe(1);
    expect(await seedDemoWorksheetAssignment(t.db, now)).toBe(0);

    const juno = await t.signIn('juno.marsh@larkspur.test');
    const mine = (await juno.get('/api/assignments/mine')).body.assignments;
    const sheet = mine.find((a: { kind: string }) => a.kind === 'worksheet');
    expect(sheet.title).toBe('Juno, week 3: leaning on the backbeat');
    const detail = (await juno.get(`/api/assignments/${sheet.id}`)).body.assignment;
    expect(detail.drills).toHaveLength(3);
    for (const d of detail.drills) expect(d.logs).toBeGreaterThan(0);
    expect(detail.status).toBe('practising');

    const tomasz = await t.signIn('tomasz.reyes@larkspur.test');
    const seen = (await tomasz.get(`/api/assignments/${sheet.id}`)).body.assignment;
    expect(seen.students.map((s: { name: string }) => s.name)).toEqual(['Juno Marsh']);
  });
});
