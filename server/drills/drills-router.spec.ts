import request from 'supertest';
import { afterAll, beforeAll, describe, expect, it } from 'vitest';
import {
  ENGINE_VERSION,
  generateDrill,
  parseRuleCard,
  type Drill,
} from '../../shared/generator/index';
import { findBuiltInPreset } from '../../shared/generator/presets/index';
import { createApp } from '../app';
import { createLogger } from '../logger';
import { createSessionStore, stopSessionStore } from '../session';
import { createTestApp, findAccount, type TestApp } from '../testing/test-app';
import type { DrillGenerator } from './drill-generator';

let t: TestApp;
beforeAll(async () => {
  t = await createTestApp();
});
afterAll(async () => {
  await t.close();
});

const card = () =>
  structuredClone(findBuiltInPreset('four-over-three')!.card) as Record<string, unknown>;

async function save(agent: request.Agent, body: Record<string, unknown> = {}) {
  const res = await agent
    .post('/api/drills')
    .send({ title: 'Four over three, lesson 3', card: card(), seed: 'lesson-3', ...body });
  expect(res.status, JSON.stringify(res.body)).toBe(201);
  return res.body.drill as Record<string, unknown> & { id: number; snapshot: Drill };
}

describe('saved drills', () => {
  it('regenerates the drill on the server and stores card, seed, engine version and snapshot', async () => {
    const teacher = await t.signIn('teacher');
    const drill = await save(teacher, { notes: 'Count out loud.', presetId: 'four-over-three' });
    const expected = generateDrill(parseRuleCard(card()), 'lesson-3');
    expect(drill).toMatchObject({
      title: 'Four over three, lesson 3',
      notes: 'Count out loud.',
      ruleCardId: null,
      presetId: 'four-over-three',
      card: card(),
      seed: 'lesson-3',
      engineVersion: ENGINE_VERSION,
      shareLink: null,
    });
    expect(JSON.stringify(drill.snapshot)).toBe(JSON.stringify(expected));
    const read = await teacher.get(`/api/drills/${drill.id}`);
    expect(read.status).toBe(200);
    expect(read.body.drill).toEqual(drill);
  });

  it('links a drill to the teacher’s own rule card only', async () => {
    const tomasz = await t.signIn('tomasz.reyes@larkspur.test');
    const hana = await t.signIn('hana.lindqvist@larkspur.test');
    const mine = await tomasz.post('/api/rule-cards').send({ title: 'Mine', card: card() });
    const drill = await save(tomasz, { ruleCardId: mine.body.ruleCard.id });
    expect(drill['ruleCardId']).toBe(mine.body.ruleCard.id);
    const stolen = await hana
      .post('/api/drills')
      .send({ ruleCardId: mine.body.ruleCard.id, title: 'x', card: card(), seed: 's' });
    expect(stolen.status).toBe(404);
    const listed = await tomasz.get(`/api/drills?ruleCardId=${mine.body.ruleCard.id}`);
    expect(listed.body.items.map((d: { id: number }) => d.id)).toEqual([drill.id]);
  });

  it('renames and annotates, then deletes', async () => {
    const teacher = await t.signIn('teacher');
    const drill = await save(teacher);
    const res = await teacher
      .put(`/api/drills/${drill.id}`)
      .send({ title: 'Renamed', notes: 'Slower first.' });
    expect(res.status).toBe(200);
    expect(res.body.drill).toMatchObject({ title: 'Renamed', notes: 'Slower first.' });
    expect(res.body.drill.snapshot).toEqual(drill.snapshot);
    expect((await teacher.delete(`/api/drills/${drill.id}`)).status).toBe(204);
    expect((await teacher.get(`/api/drills/${drill.id}`)).status).toBe(404);
  });

  it('answers 400 with field paths for a bad body or card, and for a card that conflicts', async () => {
    const teacher = await t.signIn('teacher');
    const res = await teacher
      .post('/api/drills')
      .send({ title: '', seed: 'x'.repeat(65), card: card(), extra: 1 });
    expect(res.status).toBe(400);
    const paths = (res.body.error.details as { path: string }[]).map((d) => d.path).sort();
    expect(paths).toEqual(['body', 'body.seed', 'body.title']);

    const bad = card();
    bad['tempo'] = 5;
    const invalid = await teacher.post('/api/drills').send({ title: 't', seed: 's', card: bad });
    expect(invalid.status).toBe(400);
    expect(invalid.body.error.code).toBe('invalid_rule_card');
    expect(invalid.body.error.details[0].path).toBe('body.card.tempo');

    // The kick cannot both play four even notes across the bar and stay off beat 1.
    const conflicting = card();
    (conflicting['rules'] as unknown[]).push({ kind: 'avoidDownbeat', voice: 'kick' });
    const conflict = await teacher
      .post('/api/drills')
      .send({ title: 't', seed: 's', card: conflicting });
    expect(conflict.status).toBe(400);
    expect(conflict.body.error.code).toBe('rule_conflict');
    expect(conflict.body.error.message).toMatch(/kick off beat 1.*4-over-3 polyrhythm/);
    expect(conflict.body.error.details[0].path).toBe('body.card.rules');
  });

  it('keeps pinned bars as given and regenerates the rest with the new seed', async () => {
    const teacher = await t.signIn('teacher');
    const first = await save(teacher, { seed: 'take-1' });
    const pinned = first.snapshot.bars[1]!;
    const res = await teacher
      .post('/api/drills')
      .send({ title: 'Take 2', card: card(), seed: 'take-2', keep: [pinned] });
    expect(res.status, JSON.stringify(res.body)).toBe(201);
    const snapshot = res.body.drill.snapshot as Drill;
    expect(snapshot.bars[1]).toEqual(pinned);
    expect(snapshot.seed).toBe('take-2');
    // Without the pin, this seed draws another second bar: the pin is what kept it.
    const unpinned = generateDrill(parseRuleCard(card()), 'take-2');
    expect(unpinned.bars[1]).not.toEqual(pinned);
    // The server's drill is the engine's for the same card, seed and pinned bar.
    const expected = generateDrill(parseRuleCard(card()), 'take-2', { keep: [pinned] });
    expect(JSON.stringify(snapshot)).toBe(JSON.stringify(expected));
  });

  it('refuses pinned bars that do not fit, naming the bar', async () => {
    const teacher = await t.signIn('teacher');
    const drill = await save(teacher);
    const stray = { ...drill.snapshot.bars[0]!, bar: 9 };
    const res = await teacher
      .post('/api/drills')
      .send({ title: 't', card: card(), seed: 'new', keep: [stray] });
    expect(res.status).toBe(400);
    expect(res.body.error.code).toBe('invalid_keep');
    expect(res.body.error.details).toEqual([
      {
        path: 'body.keep[0].bar',
        message: 'Pinned bar 9 is not a bar of this card: it has bars 1 to 4.',
      },
    ]);
    const malformed = await teacher
      .post('/api/drills')
      .send({ title: 't', card: card(), seed: 'new', keep: [{ bar: 0 }] });
    expect(malformed.status).toBe(400);
    expect(malformed.body.error.details[0].path).toMatch(/^body\.keep\.0/);
  });

  it('pages, sorts and searches the list on the server', async () => {
    const hana = await t.signIn('hana.lindqvist@larkspur.test');
    for (const title of ['Zeta groove', 'alpha groove', 'Mid fill']) {
      await save(hana, { title });
    }
    const page = await hana.get('/api/drills?sort=title&pageSize=2');
    expect(page.body).toMatchObject({ total: 3, page: 0, pageSize: 2 });
    expect(page.body.items.map((d: { title: string }) => d.title)).toEqual([
      'alpha groove',
      'Mid fill',
    ]);
    expect(page.body.items[0]).not.toHaveProperty('snapshot');
    const found = await hana.get('/api/drills?q=GROOVE&sort=title&direction=desc');
    expect(found.body.items.map((d: { title: string }) => d.title)).toEqual([
      'Zeta groove',
      'alpha groove',
    ]);
    expect((await hana.get('/api/drills?sort=tempo')).status).toBe(400);
  });

  it('keeps one teacher’s drills from another (404) and from students (403)', async () => {
    const tomasz = await t.signIn('tomasz.reyes@larkspur.test');
    const hana = await t.signIn('hana.lindqvist@larkspur.test');
    const student = await t.signIn('student');
    const drill = await save(tomasz, { title: 'Private' });
    const url = `/api/drills/${drill.id}`;
    expect((await hana.get(url)).status).toBe(404);
    expect((await hana.put(url).send({ title: 'x' })).status).toBe(404);
    expect((await hana.delete(url)).status).toBe(404);
    expect((await hana.post(`${url}/share`)).status).toBe(404);
    expect((await hana.delete(`${url}/share`)).status).toBe(404);
    const list = await hana.get('/api/drills?pageSize=100');
    expect(list.body.items.map((d: { id: number }) => d.id)).not.toContain(drill.id);
    expect((await student.get('/api/drills')).status).toBe(403);
    expect((await student.get(url)).status).toBe(403);
    expect((await request(t.app).get(url)).status).toBe(401);
    expect((await tomasz.get(url)).status).toBe(200);
  });
});

describe('a saved drill after an engine change', () => {
  it('is served from its snapshot, unchanged, when the engine would now give another drill', async () => {
    const teacher = await t.signIn('teacher');
    const saved = await save(teacher, { title: 'Before the change' });

    // A later engine: another version, and a different drill for the same card and seed.
    const later: DrillGenerator = (parsed, seed) => {
      const drill = generateDrill(parsed, seed);
      return {
        ...drill,
        engine: '99.0',
        bars: drill.bars.map((bar) => ({ ...bar, hits: bar.hits.slice(1) })),
      };
    };
    const sessionStore = createSessionStore(t.db, createLogger('silent'), 0);
    const next = createApp({
      config: t.config,
      db: t.db,
      sessionStore,
      browserDist: t.dataDir,
      generateDrill: later,
      engineVersion: '99.0',
    });
    const account = findAccount('teacher');
    const agent = request.agent(next);
    await agent
      .post('/api/auth/sign-in')
      .send({ email: account.email, password: account.password });

    const after = await agent.get(`/api/drills/${saved.id}`);
    expect(after.status).toBe(200);
    expect(after.body.drill.engineVersion).toBe(ENGINE_VERSION);
    expect(JSON.stringify(after.body.drill.snapshot)).toBe(JSON.stringify(saved.snapshot));

    // The same card and seed saved now do give the later engine's drill: the change is real.
    const fresh = await agent
      .post('/api/drills')
      .send({ title: 'After', card: card(), seed: 'lesson-3' });
    expect(fresh.body.drill.engineVersion).toBe('99.0');
    expect(JSON.stringify(fresh.body.drill.snapshot)).not.toBe(JSON.stringify(saved.snapshot));
    stopSessionStore(sessionStore);
  });
});
