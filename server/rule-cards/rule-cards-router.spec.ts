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

const groove = () =>
  structuredClone(findBuiltInPreset('early-backbeat')!.card) as Record<string, unknown>;
const polyrhythm = () => structuredClone(findBuiltInPreset('four-over-three')!.card);
const sevenEight = () => structuredClone(findBuiltInPreset('seven-eight-two-two-three')!.card);

async function create(agent: request.Agent, body: Record<string, unknown>) {
  const res = await agent.post('/api/rule-cards').send(body);
  expect(res.status, JSON.stringify(res.body)).toBe(201);
  return res.body.ruleCard as Record<string, unknown> & { id: number };
}

describe('rule cards: create, read, update', () => {
  it('creates a card and reads it back with its summary fields', async () => {
    const teacher = await t.signIn('teacher');
    const card = await create(teacher, {
      title: 'Backbeat a sixteenth early',
      card: groove(),
      tags: ['Displacement', 'my own'],
      level: 'beginner',
    });
    expect(card).toMatchObject({
      title: 'Backbeat a sixteenth early',
      tags: ['displacement', 'my own'],
      level: 'beginner',
      meter: '4/4',
      subdivision: 'sixteenths',
      archived: false,
      drillCount: 0,
      fromPreset: null,
      card: groove(),
    });
    expect(new Date(card['updatedAt'] as string).toISOString()).toBe(card['updatedAt']);
    const read = await teacher.get(`/api/rule-cards/${card.id}`);
    expect(read.status).toBe(200);
    expect(read.body.ruleCard).toEqual(card);
  });

  it('updates title, tags, level and card, re-deriving the listed facts', async () => {
    const teacher = await t.signIn('teacher');
    const card = await create(teacher, { title: 'To change', card: groove() });
    const res = await teacher
      .put(`/api/rule-cards/${card.id}`)
      .send({ title: 'Changed', tags: ['odd meter'], level: 'advanced', card: sevenEight() });
    expect(res.status).toBe(200);
    expect(res.body.ruleCard).toMatchObject({
      id: card.id,
      title: 'Changed',
      tags: ['odd meter'],
      level: 'advanced',
      meter: '7/8',
      card: sevenEight(),
    });
  });

  it('credits the preset a card was started from', async () => {
    const teacher = await t.signIn('teacher');
    const card = await create(teacher, {
      title: 'From a preset',
      card: polyrhythm(),
      fromPreset: 'four-over-three',
    });
    expect(card['fromPreset']).toEqual({ id: 'four-over-three', title: 'Four over three' });
    const bad = await teacher
      .post('/api/rule-cards')
      .send({ title: 'x', card: polyrhythm(), fromPreset: 'no-such-preset' });
    expect(bad.status).toBe(400);
    expect(bad.body.error.details).toEqual([
      { path: 'body.fromPreset', message: 'There is no preset with that id.' },
    ]);
  });
});

describe('rule cards: validation answers 400 with field paths', () => {
  it('gives the engine’s message under the card field’s path', async () => {
    const teacher = await t.signIn('teacher');
    const card = groove();
    card['bars'] = 0;
    card['tempoo'] = 90;
    const res = await teacher.post('/api/rule-cards').send({ title: 'Bad', card });
    expect(res.status).toBe(400);
    expect(res.body.error.code).toBe('invalid_rule_card');
    const paths = (res.body.error.details as { path: string }[]).map((d) => d.path);
    expect(paths).toContain('body.card.bars');
    expect(paths).toContain('body.card.tempoo');
    const hint = (res.body.error.details as { path: string; message: string }[]).find(
      (d) => d.path === 'body.card.tempoo',
    );
    expect(hint?.message).toMatch(/tempo/);
  });

  it('puts a rule’s problem under its index in the rules list', async () => {
    const teacher = await t.signIn('teacher');
    const card = groove();
    const rules = card['rules'] as Record<string, unknown>[];
    rules[0] = { ...rules[0], kind: 'no-such-kind' };
    const res = await teacher.post('/api/rule-cards').send({ title: 'Bad rule', card });
    expect(res.status).toBe(400);
    expect(res.body.error.details[0].path).toMatch(/^body\.card\.rules\[0\]/);
  });

  it('checks title, tags, level and unknown fields of the request itself', async () => {
    const teacher = await t.signIn('teacher');
    const res = await teacher.post('/api/rule-cards').send({
      title: '',
      card: groove(),
      tags: ['100%'],
      level: 'expert',
      colour: 'red',
    });
    expect(res.status).toBe(400);
    expect(res.body.error.code).toBe('validation_failed');
    const paths = (res.body.error.details as { path: string }[]).map((d) => d.path).sort();
    expect(paths).toEqual(['body', 'body.level', 'body.tags.0', 'body.title']);
    expect(
      (await teacher.post('/api/rule-cards').send({ title: 'No card' })).body.error.details,
    ).toEqual([{ path: 'body.card', message: 'The rule card ("card") is missing.' }]);
  });

  it('refuses a non-numeric id with 400 and an unknown one with 404', async () => {
    const teacher = await t.signIn('teacher');
    expect((await teacher.get('/api/rule-cards/abc')).status).toBe(400);
    expect((await teacher.get('/api/rule-cards/999999')).status).toBe(404);
  });
});

describe('rule cards: ownership and roles', () => {
  it('answers 404 when one teacher reaches for another teacher’s card', async () => {
    const tomasz = await t.signIn('tomasz.reyes@larkspur.test');
    const hana = await t.signIn('hana.lindqvist@larkspur.test');
    const card = await create(tomasz, { title: 'Tomasz only', card: groove() });
    const url = `/api/rule-cards/${card.id}`;
    expect((await hana.get(url)).status).toBe(404);
    expect((await hana.put(url).send({ title: 'Taken' })).status).toBe(404);
    expect((await hana.delete(url)).status).toBe(404);
    expect((await hana.post(`${url}/duplicate`)).status).toBe(404);
    expect((await hana.get(`${url}/export`)).status).toBe(404);
    const hanaList = await hana.get('/api/rule-cards?pageSize=100');
    expect((hanaList.body.items as { id: number }[]).map((c) => c.id)).not.toContain(card.id);
    expect((await tomasz.get(url)).body.ruleCard.title).toBe('Tomasz only');
  });

  it('refuses students (403) and signed-out visitors (401)', async () => {
    const student = await t.signIn('student');
    expect((await student.get('/api/rule-cards')).status).toBe(403);
    expect(
      (await student.post('/api/rule-cards').send({ title: 'x', card: groove() })).status,
    ).toBe(403);
    expect((await request(t.app).get('/api/rule-cards')).status).toBe(401);
  });
});

describe('rule cards: duplicate and delete', () => {
  it('duplicates as "… (copy)"', async () => {
    const teacher = await t.signIn('teacher');
    const card = await create(teacher, { title: 'Original', card: groove(), tags: ['linear'] });
    const res = await teacher.post(`/api/rule-cards/${card.id}/duplicate`);
    expect(res.status).toBe(201);
    expect(res.body.ruleCard).toMatchObject({
      title: 'Original (copy)',
      tags: ['linear'],
      card: groove(),
    });
    expect(res.body.ruleCard.id).not.toBe(card.id);
  });

  it('destroys an unused card (204) and archives one that saved drills use', async () => {
    const teacher = await t.signIn('teacher');
    const unused = await create(teacher, { title: 'Unused', card: groove() });
    expect((await teacher.delete(`/api/rule-cards/${unused.id}`)).status).toBe(204);
    expect((await teacher.get(`/api/rule-cards/${unused.id}`)).status).toBe(404);

    const used = await create(teacher, { title: 'Used', card: groove() });
    const saved = await teacher
      .post('/api/drills')
      .send({ ruleCardId: used.id, title: 'Kept', card: groove(), seed: 'lesson-1' });
    expect(saved.status).toBe(201);
    const res = await teacher.delete(`/api/rule-cards/${used.id}`);
    expect(res.status).toBe(200);
    expect(res.body).toEqual({ archived: true });
    const archived = (await teacher.get(`/api/rule-cards/${used.id}`)).body.ruleCard;
    expect(archived).toMatchObject({ archived: true, drillCount: 1 });
    const active = await teacher.get('/api/rule-cards?pageSize=100');
    expect((active.body.items as { id: number }[]).map((c) => c.id)).not.toContain(used.id);
    const shelf = await teacher.get('/api/rule-cards?archived=true');
    expect((shelf.body.items as { id: number }[]).map((c) => c.id)).toContain(used.id);
    expect((await teacher.get(`/api/drills/${saved.body.drill.id}`)).status).toBe(200);
  });
});

describe('rule cards: list paging, sorting and filters on the server', () => {
  it('pages, sorts and filters by tag, level, meter, subdivision and text', async () => {
    const hana = await t.signIn('hana.lindqvist@larkspur.test');
    await create(hana, {
      title: 'Gamma 4/4',
      card: groove(),
      tags: ['displacement'],
      level: 'beginner',
    });
    await create(hana, {
      title: 'alpha 3/4',
      card: polyrhythm(),
      tags: ['polyrhythm'],
      level: 'advanced',
    });
    await create(hana, {
      title: 'Beta 7/8',
      card: sevenEight(),
      tags: ['odd meter'],
      level: 'advanced',
    });
    await create(hana, { title: '100% _under_', card: groove() });

    const byTitle = await hana.get('/api/rule-cards?sort=title&pageSize=2&page=0');
    expect(byTitle.status).toBe(200);
    expect(byTitle.body.total).toBe(4);
    expect(byTitle.body.pageSize).toBe(2);
    expect(byTitle.body.items.map((c: { title: string }) => c.title)).toEqual([
      '100% _under_',
      'alpha 3/4',
    ]);
    const second = await hana.get('/api/rule-cards?sort=title&pageSize=2&page=1');
    expect(second.body.items.map((c: { title: string }) => c.title)).toEqual([
      'Beta 7/8',
      'Gamma 4/4',
    ]);
    const desc = await hana.get('/api/rule-cards?sort=title&direction=desc&pageSize=1');
    expect(desc.body.items[0].title).toBe('Gamma 4/4');
    const bySlots = await hana.get('/api/rule-cards?sort=subdivision&direction=asc');
    expect(bySlots.status).toBe(200);
    expect(bySlots.body.items[0].title).toBe('Beta 7/8');
    const byLevel = await hana.get('/api/rule-cards?sort=level&direction=asc');
    expect(byLevel.body.items.map((c: { level: string | null }) => c.level)).toEqual([
      null,
      'beginner',
      'advanced',
      'advanced',
    ]);

    const titles = async (query: string) =>
      ((await hana.get(`/api/rule-cards?${query}`)).body.items as { title: string }[])
        .map((c) => c.title)
        .sort();
    expect(await titles('tag=polyrhythm')).toEqual(['alpha 3/4']);
    expect(await titles('level=advanced')).toEqual(['Beta 7/8', 'alpha 3/4']);
    expect(await titles('meter=7%2F8')).toEqual(['Beta 7/8']);
    expect(await titles('subdivision=4&meter=4%2F4')).toEqual(['100% _under_', 'Gamma 4/4']);
    expect(await titles('q=ALPHA')).toEqual(['alpha 3/4']);
    // LIKE's wildcards are taken literally.
    expect(await titles('q=%25')).toEqual(['100% _under_']);
    expect(await titles('q=_u')).toEqual(['100% _under_']);
  });

  it('refuses bad list queries with 400 naming the field', async () => {
    const teacher = await t.signIn('teacher');
    const res = await teacher.get('/api/rule-cards?page=-1&pageSize=1000&sort=colour&meter=x');
    expect(res.status).toBe(400);
    const paths = (res.body.error.details as { path: string }[]).map((d) => d.path).sort();
    expect(paths).toEqual(['query.meter', 'query.page', 'query.pageSize', 'query.sort']);
  });
});
