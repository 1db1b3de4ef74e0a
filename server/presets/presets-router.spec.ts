import request from 'supertest';
import { afterAll, beforeAll, describe, expect, it } from 'vitest';
import { generateDrill, parseRuleCard } from '../../shared/generator/index';
import { BUILT_IN_PRESETS, findBuiltInPreset } from '../../shared/generator/presets/index';
import { createTestApp, type TestApp } from '../testing/test-app';
import { BUILT_IN_CURATION } from './built-in-curation';
import { meterText, subdivisionWord } from './preset-summary';

let t: TestApp;
let renders = 0;
beforeAll(async () => {
  t = await createTestApp({
    deps: {
      // Counts engravings, so the test can show a thumbnail is drawn once and then cached.
      renderThumbnail: async (drill) => {
        renders += 1;
        return `<svg xmlns="http://www.w3.org/2000/svg" data-bars="${drill.bars.length}" data-seed="${drill.seed}"/>`;
      },
    },
  });
});
afterAll(async () => {
  await t.close();
});

type View = Record<string, unknown> & { id: string };

/** GETs an SVG and reads its body as text (supertest only buffers text types by itself). */
async function svgOf(agent: request.Agent, url: string) {
  const res = await agent
    .get(url)
    .buffer(true)
    .parse((stream, done) => {
      let text = '';
      stream.setEncoding('utf8');
      stream.on('data', (chunk: string) => (text += chunk));
      stream.on('end', () => done(null, text));
    });
  return { status: res.status, type: res.headers['content-type'], text: res.body as string };
}

describe('GET /api/presets (any signed-in role)', () => {
  it('has built-in presets to serve', () => {
    expect(BUILT_IN_PRESETS.length).toBeGreaterThan(0);
  });

  it.each(['admin', 'teacher', 'student'] as const)(
    'lists every built-in preset, in order, for a %s',
    async (role) => {
      const agent = await t.signIn(role);
      const res = await agent.get('/api/presets');
      expect(res.status).toBe(200);
      const presets = res.body.presets as View[];
      expect(presets.map((p) => p.id)).toEqual(BUILT_IN_PRESETS.map((p) => p.id));
      for (const [i, preset] of presets.entries()) {
        const source = BUILT_IN_PRESETS[i]!;
        const card = parseRuleCard(source.card);
        expect(preset).toEqual({
          id: source.id,
          title: source.title,
          summary: source.summary,
          card: source.card,
          meter: meterText(card),
          subdivision: subdivisionWord(card),
          level: BUILT_IN_CURATION[source.id]?.level ?? null,
          tags: BUILT_IN_CURATION[source.id]?.tags ?? [],
          position: i,
          published: true,
          credit: null,
        });
      }
    },
  );

  it('filters by tag, level, meter and subdivision', async () => {
    const agent = await t.signIn('student');
    const ids = async (query: string) =>
      ((await agent.get(`/api/presets?${query}`)).body.presets as View[]).map((p) => p.id);
    expect(await ids('tag=polyrhythm')).toContain('four-over-three');
    expect(await ids('tag=polyrhythm')).not.toContain('early-backbeat');
    expect(await ids('meter=7%2F8')).toEqual(['seven-eight-two-two-three']);
    const quintuplets = await ids('subdivision=5');
    expect(quintuplets).toEqual(['quintuplets-hihat-1-3-5', 'quintuplets-hihat-1-3-4']);
    expect(await ids('level=advanced&subdivision=5')).toEqual(quintuplets);
    expect((await agent.get('/api/presets?level=expert')).status).toBe(400);
  });

  it('answers 401 when signed out', async () => {
    expect((await request(t.app).get('/api/presets')).status).toBe(401);
    expect((await request(t.app).get(`/api/presets/${BUILT_IN_PRESETS[0]!.id}`)).status).toBe(401);
  });
});

describe('GET /api/presets/:id', () => {
  it('returns one preset by its built-in id', async () => {
    const agent = await t.signIn('student');
    const source = BUILT_IN_PRESETS[BUILT_IN_PRESETS.length - 1]!;
    const res = await agent.get(`/api/presets/${encodeURIComponent(source.id)}`);
    expect(res.status).toBe(200);
    expect(res.body.preset).toMatchObject({
      id: source.id,
      title: source.title,
      card: source.card,
    });
  });

  it('answers an unknown id with 404 in the error shape', async () => {
    const agent = await t.signIn('teacher');
    const res = await agent.get('/api/presets/no-such-preset');
    expect(res.status).toBe(404);
    expect(res.body).toEqual({
      error: { code: 'not_found', message: 'There is no preset rule card with that id.' },
    });
  });
});

describe('GET /api/presets/:id/drill?seed=', () => {
  it('answers the drill the engine gives the preset’s card at that seed, for any role', async () => {
    const source = findBuiltInPreset('early-backbeat')!;
    const expected = generateDrill(parseRuleCard(source.card), 'harbor-spark-21');
    const other = generateDrill(parseRuleCard(source.card), 'quiet-river-7');
    for (const role of ['student', 'teacher', 'admin'] as const) {
      const agent = await t.signIn(role);
      const res = await agent.get('/api/presets/early-backbeat/drill?seed=harbor-spark-21');
      expect(res.status).toBe(200);
      // Byte for byte what the browser would have generated itself.
      expect(JSON.stringify(res.body.drill)).toBe(JSON.stringify(expected));
    }
    const agent = await t.signIn('student');
    const res = await agent.get('/api/presets/early-backbeat/drill?seed=quiet-river-7');
    expect(JSON.stringify(res.body.drill)).toBe(JSON.stringify(other));
  });

  it('refuses a missing or too long seed, an unknown preset, and anyone signed out', async () => {
    const agent = await t.signIn('teacher');
    const noSeed = await agent.get('/api/presets/early-backbeat/drill');
    expect(noSeed.status).toBe(400);
    expect(noSeed.body.error.details).toEqual([
      expect.objectContaining({ path: expect.stringContaining('seed') }),
    ]);
    const long = await agent.get(`/api/presets/early-backbeat/drill?seed=${'a'.repeat(65)}`);
    expect(long.status).toBe(400);
    const unknown = await agent.get('/api/presets/no-such-preset/drill?seed=a');
    expect(unknown.status).toBe(404);
    const signedOut = await request(t.app).get('/api/presets/early-backbeat/drill?seed=a');
    expect(signedOut.status).toBe(401);
  });
});

describe('admin curation', () => {
  it('edits title, summary, level, tags and position, and withdraws and republishes', async () => {
    const admin = await t.signIn('admin');
    const teacher = await t.signIn('teacher');
    const res = await admin.put('/api/presets/late-backbeat').send({
      title: 'Backbeat, late',
      summary: 'Lean back on two and four.',
      level: 'intermediate',
      tags: ['displacement', 'feel'],
      position: 100,
    });
    expect(res.status).toBe(200);
    expect(res.body.preset).toMatchObject({
      id: 'late-backbeat',
      title: 'Backbeat, late',
      summary: 'Lean back on two and four.',
      level: 'intermediate',
      tags: ['displacement', 'feel'],
      position: 100,
      published: true,
    });
    const list = (await teacher.get('/api/presets')).body.presets as View[];
    expect(list.at(-1)?.id).toBe('late-backbeat');

    expect((await admin.put('/api/presets/late-backbeat').send({ published: false })).status).toBe(
      200,
    );
    const hidden = (await teacher.get('/api/presets')).body.presets as View[];
    expect(hidden.map((p) => p.id)).not.toContain('late-backbeat');
    expect((await teacher.get('/api/presets/late-backbeat')).status).toBe(404);
    expect((await teacher.post('/api/presets/late-backbeat/start')).status).toBe(404);
    const all = (await admin.get('/api/presets?all=true')).body.presets as View[];
    expect(all.find((p) => p.id === 'late-backbeat')?.published).toBe(false);
    expect((await admin.get('/api/presets/late-backbeat')).status).toBe(200);

    await admin.put('/api/presets/late-backbeat').send({ published: true });
    expect((await teacher.get('/api/presets/late-backbeat')).status).toBe(200);
  });

  it('refuses curation to teachers and students (403) and withdrawn lists to them too', async () => {
    for (const role of ['teacher', 'student'] as const) {
      const agent = await t.signIn(role);
      expect((await agent.put('/api/presets/early-backbeat').send({ title: 'Mine' })).status).toBe(
        403,
      );
      expect((await agent.post('/api/presets/promote').send({ ruleCardId: 1 })).status).toBe(403);
      expect((await agent.get('/api/presets?all=true')).status).toBe(403);
    }
  });

  it('validates edits with field paths, and 404s an unknown preset', async () => {
    const admin = await t.signIn('admin');
    const res = await admin
      .put('/api/presets/early-backbeat')
      .send({ title: ' ', position: -1, published: 'yes', card: {} });
    expect(res.status).toBe(400);
    const paths = (res.body.error.details as { path: string }[]).map((d) => d.path).sort();
    expect(paths).toEqual(['body', 'body.position', 'body.published', 'body.title']);
    expect((await admin.put('/api/presets/nope').send({ title: 'x' })).status).toBe(404);
  });

  it('promotes a teacher’s card as a credited, withdrawn copy, and publishes it', async () => {
    const teacher = await t.signIn('tomasz.reyes@larkspur.test');
    const admin = await t.signIn('admin');
    const made = await teacher.post('/api/rule-cards').send({
      title: 'Tomasz’s Four Over Three',
      card: findBuiltInPreset('four-over-three')!.card,
      tags: ['polyrhythm'],
      level: 'advanced',
    });
    const res = await admin
      .post('/api/presets/promote')
      .send({ ruleCardId: made.body.ruleCard.id });
    expect(res.status).toBe(201);
    expect(res.body.preset).toMatchObject({
      id: 'tomasz-s-four-over-three',
      title: 'Tomasz’s Four Over Three',
      card: findBuiltInPreset('four-over-three')!.card,
      tags: ['polyrhythm'],
      level: 'advanced',
      published: false,
      credit: 'Tomasz Reyes',
      meter: '3/4',
    });
    const again = await admin
      .post('/api/presets/promote')
      .send({ ruleCardId: made.body.ruleCard.id });
    expect(again.body.preset.id).toBe('tomasz-s-four-over-three-2');
    // The copy stands alone: the teacher's later edit leaves it as promoted.
    await teacher.put(`/api/rule-cards/${made.body.ruleCard.id}`).send({ title: 'Renamed' });
    const preset = await admin.get('/api/presets/tomasz-s-four-over-three');
    expect(preset.body.preset.title).toBe('Tomasz’s Four Over Three');
    expect((await admin.post('/api/presets/promote').send({ ruleCardId: 999999 })).status).toBe(
      404,
    );
    expect((await admin.post('/api/presets/promote').send({ ruleCardId: 'x' })).status).toBe(400);
  });
});

describe('start from a preset', () => {
  it('copies the preset into the teacher’s rule cards, credited', async () => {
    const teacher = await t.signIn('hana.lindqvist@larkspur.test');
    const res = await teacher.post('/api/presets/four-over-three/start');
    expect(res.status).toBe(201);
    expect(res.body.ruleCard).toMatchObject({
      title: 'Four over three',
      card: findBuiltInPreset('four-over-three')!.card,
      tags: ['polyrhythm'],
      level: 'advanced',
      fromPreset: { id: 'four-over-three', title: 'Four over three' },
    });
    const mine = await teacher.get(`/api/rule-cards/${res.body.ruleCard.id}`);
    expect(mine.status).toBe(200);
  });

  it('is for teachers: a student gets 403', async () => {
    const student = await t.signIn('student');
    expect((await student.post('/api/presets/four-over-three/start')).status).toBe(403);
  });
});

describe('GET /api/presets/:id/thumbnail.svg', () => {
  it('engraves the first bars at the preset’s default seed once, then serves the cache', async () => {
    const student = await t.signIn('student');
    const before = renders;
    const first = await svgOf(student, '/api/presets/groove-and-fill/thumbnail.svg');
    expect(first.status).toBe(200);
    expect(first.type).toMatch(/^image\/svg\+xml/);
    expect(first.text).toContain('data-bars="2"');
    expect(first.text).toContain('data-seed="groove-and-fill"');
    const second = await svgOf(student, '/api/presets/groove-and-fill/thumbnail.svg');
    expect(second.text).toBe(first.text);
    expect(renders).toBe(before + 1);
    const row = await t.db('presets').where({ id: 'groove-and-fill' }).first();
    expect(row.thumbnail_svg).toBe(first.text);
  });

  it('answers 404 for an unknown preset and 401 signed out', async () => {
    const student = await t.signIn('student');
    expect((await student.get('/api/presets/nope/thumbnail.svg')).status).toBe(404);
    expect((await request(t.app).get('/api/presets/groove-and-fill/thumbnail.svg')).status).toBe(
      401,
    );
  });

  it('lists teachers’ live cards for promotion, paged and filtered on the server, admin only', async () => {
    const tomasz = await t.signIn('tomasz.reyes@larkspur.test');
    const hana = await t.signIn('hana.lindqvist@larkspur.test');
    const admin = await t.signIn('admin');
    const fourOverThree = findBuiltInPreset('four-over-three')!.card;
    const made: number[] = [];
    for (const [agent, title, level] of [
      [tomasz, 'Quokka groove one', 'beginner'],
      [tomasz, 'Quokka groove two', 'advanced'],
      [hana, 'Quokka groove three', 'advanced'],
    ] as const) {
      const res = await agent.post('/api/rule-cards').send({ title, card: fourOverThree, level });
      made.push(res.body.ruleCard.id as number);
    }
    const archived = await hana
      .post('/api/rule-cards')
      .send({ title: 'Quokka groove archived', card: fourOverThree });
    await hana.post('/api/drills').send({
      ruleCardId: archived.body.ruleCard.id,
      title: 'keeps it',
      card: fourOverThree,
      seed: 's1',
    });
    expect((await hana.delete(`/api/rule-cards/${archived.body.ruleCard.id}`)).body).toEqual({
      archived: true,
    });
    // The admin's own card is not a teacher's.
    await admin.post('/api/rule-cards').send({ title: 'Quokka groove admin', card: fourOverThree });

    const all = await admin.get('/api/presets/candidates?q=quokka&sort=title&pageSize=2');
    expect(all.status).toBe(200);
    expect(all.body).toMatchObject({ total: 3, page: 0, pageSize: 2 });
    expect(all.body.items.map((c: { title: string }) => c.title)).toEqual([
      'Quokka groove one',
      'Quokka groove three',
    ]);
    expect(all.body.items[1]).toMatchObject({ ownerName: 'Hana Lindqvist', meter: '3/4' });
    const next = await admin.get('/api/presets/candidates?q=quokka&sort=title&pageSize=2&page=1');
    expect(next.body.items.map((c: { id: number }) => c.id)).toEqual([made[1]]);

    const byLevel = await admin.get('/api/presets/candidates?q=quokka&level=advanced');
    expect(byLevel.body.items.map((c: { id: number }) => c.id).sort()).toEqual(
      [made[1], made[2]].sort(),
    );
    // The search text finds the teacher's name too.
    const byName = await admin.get('/api/presets/candidates?q=lindqvist&sort=title');
    expect(byName.body.items.map((c: { title: string }) => c.title)).toContain(
      'Quokka groove three',
    );
    expect(
      byName.body.items.every((c: { ownerName: string }) => c.ownerName === 'Hana Lindqvist'),
    ).toBe(true);

    const bad = await admin.get('/api/presets/candidates?pageSize=500&sort=owner');
    expect(bad.status).toBe(400);
    expect((bad.body.error.details as { path: string }[]).map((d) => d.path).sort()).toEqual([
      'query.pageSize',
      'query.sort',
    ]);
    expect((await tomasz.get('/api/presets/candidates')).status).toBe(403);
    expect((await request(t.app).get('/api/presets/candidates')).status).toBe(401);
  });
});
