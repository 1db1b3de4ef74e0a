import { afterAll, beforeAll, describe, expect, it } from 'vitest';
import { createTestApp, type TestApp } from '../testing/test-app';
import { seedDemoAuthoring } from './seed-authoring';
import { seedDemoWorksheets } from './seed-worksheets';

let t: TestApp;
beforeAll(async () => {
  t = await createTestApp();
  await seedDemoAuthoring(t.db);
});
afterAll(async () => {
  await t.close();
});

describe('demo worksheets', () => {
  it('gives each demo teacher a worksheet of their own drills, once', async () => {
    expect(await seedDemoWorksheets(t.db)).toBe(2);
    expect(await seedDemoWorksheets(t.db)).toBe(0);

    const tomasz = await t.signIn('tomasz.reyes@larkspur.test');
    const list = await tomasz.get('/api/worksheets');
    expect(list.body.items).toHaveLength(1);
    const sheet = (await tomasz.get(`/api/worksheets/${list.body.items[0].id}`)).body.worksheet;
    expect(sheet.title).toBe('Juno, week 3: leaning on the backbeat');
    expect(sheet.items.map((i: { title: string }) => i.title)).toEqual([
      'Pushed backbeat for Juno',
      expect.stringMatching(/\(seed juno-week-3\)$/),
      '7/8 warm-up',
    ]);
    expect(sheet.items.every((i: { problem: string | null }) => i.problem === null)).toBe(true);

    const hana = await t.signIn('hana.lindqvist@larkspur.test');
    const hanas = await hana.get('/api/worksheets');
    expect(hanas.body.items.map((w: { title: string }) => w.title)).toEqual([
      'Felix: linear and four over three',
    ]);
    expect(hanas.body.items[0].itemCount).toBe(2);
  });
});
