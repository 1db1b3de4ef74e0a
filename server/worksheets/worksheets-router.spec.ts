import request from 'supertest';
import { afterAll, beforeAll, describe, expect, it } from 'vitest';
import { findBuiltInPreset } from '../../shared/generator/presets/index';
import { createTestApp, type TestApp } from '../testing/test-app';

let t: TestApp;
beforeAll(async () => {
  t = await createTestApp();
});
afterAll(async () => {
  await t.close();
});

const TOMASZ = 'tomasz.reyes@larkspur.test';
const HANA = 'hana.lindqvist@larkspur.test';

async function saveDrill(agent: request.Agent, title: string): Promise<number> {
  const card = structuredClone(findBuiltInPreset('early-backbeat')!.card);
  const res = await agent.post('/api/drills').send({ title, card, seed: title });
  expect(res.status, JSON.stringify(res.body)).toBe(201);
  return res.body.drill.id as number;
}

async function create(agent: request.Agent, body: Record<string, unknown>) {
  const res = await agent.post('/api/worksheets').send(body);
  expect(res.status, JSON.stringify(res.body)).toBe(201);
  return res.body.worksheet as { id: number; items: Record<string, unknown>[] } & Record<
    string,
    unknown
  >;
}

const paths = (res: request.Response) =>
  (res.body.error.details as { path: string }[]).map((d) => d.path).sort();

describe('worksheets', () => {
  it('creates a worksheet of a saved drill and a preset at a seed, and reads it back', async () => {
    const tomasz = await t.signIn(TOMASZ);
    const drillId = await saveDrill(tomasz, 'Pushed backbeat, week 1');
    const sheet = await create(tomasz, {
      title: 'Week 1',
      notes: 'Slow first.',
      paper: 'letter',
      items: [
        {
          source: { kind: 'saved', drillId },
          ladder: { start: 60, target: 84, step: 8 },
          aids: { sticking: true, counts: false, tension: true },
        },
        { source: { kind: 'preset', presetId: 'four-over-three', seed: 'lesson-2' } },
      ],
    });
    const fourOverThree = findBuiltInPreset('four-over-three')!;
    const tempo = (fourOverThree.card as { tempo: number }).tempo;
    expect(sheet).toMatchObject({
      title: 'Week 1',
      notes: 'Slow first.',
      paper: 'letter',
      itemCount: 2,
      items: [
        {
          source: { kind: 'saved', drillId },
          ladder: { start: 60, target: 84, step: 8 },
          aids: { sticking: true, counts: false, tension: true },
          title: 'Pushed backbeat, week 1',
          problem: null,
        },
        {
          source: { kind: 'preset', presetId: 'four-over-three', seed: 'lesson-2' },
          // Left out: 20 below the drill's own tempo up to it, in steps of 4, every aid on.
          ladder: { start: tempo - 20, target: tempo, step: 4 },
          aids: { sticking: true, counts: true, tension: true },
          title: `${fourOverThree.title} (seed lesson-2)`,
          tempo,
          problem: null,
        },
      ],
    });
    const read = await tomasz.get(`/api/worksheets/${sheet.id}`);
    expect(read.status).toBe(200);
    expect(read.body.worksheet).toEqual(sheet);
  });

  it('reorders, edits and removes items with one PUT, keeping the order given', async () => {
    const tomasz = await t.signIn(TOMASZ);
    const ids = [
      await saveDrill(tomasz, 'First'),
      await saveDrill(tomasz, 'Second'),
      await saveDrill(tomasz, 'Third'),
    ];
    const sheet = await create(tomasz, {
      title: 'Order',
      items: ids.map((drillId) => ({ source: { kind: 'saved', drillId } })),
    });
    const reordered = [ids[2], ids[0], ids[1]].map((drillId) => ({
      source: { kind: 'saved', drillId },
      ladder: { start: 70, target: 90, step: 5 },
      aids: { sticking: false, counts: false, tension: false },
    }));
    const res = await tomasz
      .put(`/api/worksheets/${sheet.id}`)
      .send({ title: 'Order, again', items: reordered });
    expect(res.status, JSON.stringify(res.body)).toBe(200);
    expect(res.body.worksheet.title).toBe('Order, again');
    expect(res.body.worksheet.items.map((i: { title: string }) => i.title)).toEqual([
      'Third',
      'First',
      'Second',
    ]);
    expect(res.body.worksheet.items[0].aids).toEqual({
      sticking: false,
      counts: false,
      tension: false,
    });
    // Title alone leaves the items as they are.
    const renamed = await tomasz.put(`/api/worksheets/${sheet.id}`).send({ notes: 'n' });
    expect(renamed.body.worksheet.items).toEqual(res.body.worksheet.items);
    const emptied = await tomasz.put(`/api/worksheets/${sheet.id}`).send({ items: [] });
    expect(emptied.body.worksheet).toMatchObject({ items: [], itemCount: 0 });
  });

  it('duplicates with every item and deletes', async () => {
    const tomasz = await t.signIn(TOMASZ);
    const drillId = await saveDrill(tomasz, 'To copy');
    const sheet = await create(tomasz, {
      title: 'Original',
      items: [{ source: { kind: 'saved', drillId }, ladder: { start: 50, target: 60, step: 2 } }],
    });
    const copy = await tomasz.post(`/api/worksheets/${sheet.id}/duplicate`);
    expect(copy.status).toBe(201);
    expect(copy.body.worksheet.id).not.toBe(sheet.id);
    expect(copy.body.worksheet.title).toBe('Original (copy)');
    expect(copy.body.worksheet.items).toEqual(sheet.items);
    expect((await tomasz.delete(`/api/worksheets/${sheet.id}`)).status).toBe(204);
    expect((await tomasz.get(`/api/worksheets/${sheet.id}`)).status).toBe(404);
    expect((await tomasz.get(`/api/worksheets/${copy.body.worksheet.id}`)).status).toBe(200);
  });

  it('takes a deleted saved drill off the worksheets that held it', async () => {
    const tomasz = await t.signIn(TOMASZ);
    const keep = await saveDrill(tomasz, 'Kept');
    const gone = await saveDrill(tomasz, 'Gone');
    const sheet = await create(tomasz, {
      title: 'Cascade',
      items: [keep, gone].map((drillId) => ({ source: { kind: 'saved', drillId } })),
    });
    expect((await tomasz.delete(`/api/drills/${gone}`)).status).toBe(204);
    const read = await tomasz.get(`/api/worksheets/${sheet.id}`);
    expect(read.body.worksheet.items.map((i: { title: string }) => i.title)).toEqual(['Kept']);
  });

  it('answers 400 with field paths for bad fields, ladders and sources', async () => {
    const tomasz = await t.signIn(TOMASZ);
    const drillId = await saveDrill(tomasz, 'Valid');
    const res = await tomasz.post('/api/worksheets').send({
      title: '',
      paper: 'a3',
      extra: true,
      items: [
        { source: { kind: 'saved', drillId }, ladder: { start: 100, target: 90, step: 5 } },
        { source: { kind: 'saved', drillId }, ladder: { start: 10, target: 400, step: 0 } },
        { source: { kind: 'saved', drillId }, ladder: { start: 40, target: 200, step: 1 } },
        { source: { kind: 'card', card: {} } },
        { source: { kind: 'preset', presetId: 'four-over-three' } },
        { source: { kind: 'saved', drillId }, aids: { sticking: 'yes' } },
      ],
    });
    expect(res.status).toBe(400);
    expect(res.body.error.code).toBe('validation_failed');
    expect(paths(res)).toEqual([
      'body',
      'body.items.0.ladder.target',
      'body.items.1.ladder.start',
      'body.items.1.ladder.step',
      'body.items.1.ladder.target',
      'body.items.2.ladder.step',
      'body.items.3.source.kind',
      'body.items.4.source.seed',
      'body.items.5.aids.sticking',
      'body.paper',
      'body.title',
    ]);
    const messages = res.body.error.details as { path: string; message: string }[];
    const at = (path: string) => messages.find((d) => d.path === path)?.message;
    expect(at('body.items.0.ladder.target')).toBe(
      'The target tempo (90) is below the start tempo (100): a ladder climbs.',
    );
    expect(at('body.items.1.ladder.start')).toBe('The start tempo is 20 to 320 beats per minute.');
    expect(at('body.items.1.ladder.step')).toBe('The step is at least 1 beat per minute.');
    expect(at('body.items.2.ladder.step')).toMatch(/161 rungs; a ladder has at most 24/);

    const tooMany = await tomasz.post('/api/worksheets').send({
      title: 'Long',
      items: Array.from({ length: 25 }, () => ({ source: { kind: 'saved', drillId } })),
    });
    expect(tooMany.status).toBe(400);
    expect(paths(tooMany)).toEqual(['body.items']);

    const badId = await tomasz.put('/api/worksheets/abc').send({});
    expect(badId.status).toBe(400);
    expect(paths(badId)).toEqual(['params.id']);
    expect((await tomasz.get('/api/worksheets?sort=tempo')).status).toBe(400);
  });

  it('refuses another teacher’s saved drill and unknown or withdrawn presets, naming the item', async () => {
    const tomasz = await t.signIn(TOMASZ);
    const hana = await t.signIn(HANA);
    const admin = await t.signIn('admin');
    const hanas = await saveDrill(hana, 'Hana’s own');
    const withdrawn = await admin.put('/api/presets/six-eight-groove').send({ published: false });
    expect(withdrawn.status).toBe(200);
    const res = await tomasz.post('/api/worksheets').send({
      title: 'Borrowed',
      items: [
        { source: { kind: 'preset', presetId: 'four-over-three', seed: 'ok' } },
        { source: { kind: 'saved', drillId: hanas } },
        { source: { kind: 'preset', presetId: 'no-such-preset', seed: 's' } },
        { source: { kind: 'preset', presetId: 'six-eight-groove', seed: 's' } },
      ],
    });
    expect(res.status).toBe(400);
    expect(res.body.error.details).toEqual([
      {
        path: 'body.items.1.source.drillId',
        message: `There is no saved drill with id ${hanas} among yours.`,
      },
      {
        path: 'body.items.2.source.presetId',
        message: 'There is no published preset with id "no-such-preset".',
      },
      {
        path: 'body.items.3.source.presetId',
        message: 'There is no published preset with id "six-eight-groove".',
      },
    ]);
    const list = await tomasz.get('/api/worksheets?q=Borrowed');
    expect(list.body.total).toBe(0);
    await admin.put('/api/presets/six-eight-groove').send({ published: true });
  });

  it('flags an item whose preset was withdrawn after it was added', async () => {
    const tomasz = await t.signIn(TOMASZ);
    const admin = await t.signIn('admin');
    const sheet = await create(tomasz, {
      title: 'Withdrawn later',
      items: [{ source: { kind: 'preset', presetId: 'twelve-eight-shuffle', seed: 'a' } }],
    });
    await admin.put('/api/presets/twelve-eight-shuffle').send({ published: false });
    const read = await tomasz.get(`/api/worksheets/${sheet.id}`);
    expect(read.body.worksheet.items[0]).toMatchObject({
      title: 'twelve-eight-shuffle',
      tempo: null,
      problem: expect.stringMatching(/withdrawn/),
    });
    await admin.put('/api/presets/twelve-eight-shuffle').send({ published: true });
  });

  it('pages, sorts and searches the list on the server', async () => {
    const hana = await t.signIn(HANA);
    const drillId = await saveDrill(hana, 'For the list');
    await create(hana, { title: 'Zeta sheet' });
    await create(hana, {
      title: 'alpha sheet',
      items: [1, 2, 3].map(() => ({ source: { kind: 'saved', drillId } })),
    });
    await create(hana, { title: 'Mid', items: [{ source: { kind: 'saved', drillId } }] });
    const page = await hana.get('/api/worksheets?sort=title&pageSize=2');
    expect(page.status).toBe(200);
    expect(page.body).toMatchObject({ total: 3, page: 0, pageSize: 2 });
    expect(page.body.items.map((w: { title: string }) => w.title)).toEqual(['alpha sheet', 'Mid']);
    expect(page.body.items[0]).not.toHaveProperty('items');
    const second = await hana.get('/api/worksheets?sort=title&pageSize=2&page=1');
    expect(second.body.items.map((w: { title: string }) => w.title)).toEqual(['Zeta sheet']);
    const byCount = await hana.get('/api/worksheets?sort=itemCount');
    expect(byCount.body.items.map((w: { itemCount: number }) => w.itemCount)).toEqual([3, 1, 0]);
    const found = await hana.get('/api/worksheets?q=SHEET&sort=title&direction=desc');
    expect(found.body.items.map((w: { title: string }) => w.title)).toEqual([
      'Zeta sheet',
      'alpha sheet',
    ]);
    const wild = await hana.get('/api/worksheets?q=%25');
    expect(wild.body.total).toBe(0);
  });

  it('keeps one teacher’s worksheets from another (404), and from students and admins (403)', async () => {
    const tomasz = await t.signIn(TOMASZ);
    const hana = await t.signIn(HANA);
    const student = await t.signIn('student');
    const admin = await t.signIn('admin');
    const sheet = await create(tomasz, { title: 'Private sheet' });
    const url = `/api/worksheets/${sheet.id}`;
    expect((await hana.get(url)).status).toBe(404);
    expect((await hana.put(url).send({ title: 'x' })).status).toBe(404);
    expect((await hana.post(`${url}/duplicate`)).status).toBe(404);
    expect((await hana.delete(url)).status).toBe(404);
    expect((await hana.get('/api/worksheets?pageSize=100')).body.items).not.toContainEqual(
      expect.objectContaining({ id: sheet.id }),
    );
    for (const other of [student, admin]) {
      expect((await other.get('/api/worksheets')).status).toBe(403);
      expect((await other.get(url)).status).toBe(403);
      expect((await other.post('/api/worksheets').send({ title: 'x' })).status).toBe(403);
    }
    expect((await request(t.app).get(url)).status).toBe(401);
    expect((await tomasz.get(url)).body.worksheet.title).toBe('Private sheet');
  });
});
