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

const card = () =>
  structuredClone(findBuiltInPreset('linear-sixteenths')!.card) as Record<string, unknown>;
const envelope = (fields: Record<string, unknown> = {}) => ({
  format: 'tensile.rule-card',
  version: 1,
  title: 'Linear study',
  tags: ['linear'],
  level: 'intermediate',
  card: card(),
  ...fields,
});

describe('export and import of rule cards', () => {
  it('exports a versioned envelope as an attachment that imports back to the same card', async () => {
    const teacher = await t.signIn('teacher');
    const made = await teacher
      .post('/api/rule-cards')
      .send({ title: 'Linear: hands & feet', card: card(), tags: ['linear'], level: 'advanced' });
    const res = await teacher.get(`/api/rule-cards/${made.body.ruleCard.id}/export`);
    expect(res.status).toBe(200);
    expect(res.headers['content-disposition']).toBe(
      'attachment; filename=linear-hands-feet.tensile.json',
    );
    expect(res.body).toEqual({
      format: 'tensile.rule-card',
      version: 1,
      title: 'Linear: hands & feet',
      tags: ['linear'],
      level: 'advanced',
      card: card(),
    });
    const back = await teacher.post('/api/rule-cards/import').send(res.body);
    expect(back.status).toBe(201);
    expect(back.body.ruleCard).toMatchObject({
      title: 'Linear: hands & feet',
      tags: ['linear'],
      level: 'advanced',
      card: card(),
    });
    expect(back.body.ruleCard.id).not.toBe(made.body.ruleCard.id);
  });

  it('fills the optional fields of a minimal file', async () => {
    const teacher = await t.signIn('teacher');
    const res = await teacher
      .post('/api/rule-cards/import')
      .send({ format: 'tensile.rule-card', version: 1, title: 'Bare', card: card() });
    expect(res.status).toBe(201);
    expect(res.body.ruleCard).toMatchObject({ title: 'Bare', tags: [], level: null });
  });
});

describe('import refuses hostile or foreign input with a clear message', () => {
  it.each([
    [{ format: 'other-app.card' }, 'wrong_format', 'body.format', /not a Tensile rule card file/],
    [{ format: undefined }, 'wrong_format', 'body.format', /not a Tensile rule card file/],
    [
      { version: 2 },
      'unsupported_version',
      'body.version',
      /version 2; this Tensile reads version 1/,
    ],
    [{ version: '1' }, 'unsupported_version', 'body.version', /version "1"/],
  ])('%o → %s', async (fields, code, path, message) => {
    const teacher = await t.signIn('teacher');
    const res = await teacher.post('/api/rule-cards/import').send(envelope(fields));
    expect(res.status).toBe(400);
    expect(res.body.error.code).toBe(code);
    expect(res.body.error.message).toMatch(message);
    expect(res.body.error.details.map((d: { path: string }) => d.path)).toEqual([path]);
  });

  it('names every unknown field of the file, and of the card with a hint', async () => {
    const teacher = await t.signIn('teacher');
    const res = await teacher
      .post('/api/rule-cards/import')
      .send(envelope({ author: 'someone', script: '<script>' }));
    expect(res.status).toBe(400);
    expect(res.body.error.details).toEqual([
      {
        path: 'body.author',
        message:
          'Unknown field "author": a rule card file holds format, version, title, tags, level, card.',
      },
      {
        path: 'body.script',
        message:
          'Unknown field "script": a rule card file holds format, version, title, tags, level, card.',
      },
    ]);
    const inner = card();
    inner['tempi'] = 100;
    const deep = await teacher.post('/api/rule-cards/import').send(envelope({ card: inner }));
    expect(deep.status).toBe(400);
    expect(deep.body.error.code).toBe('invalid_rule_card');
    expect(deep.body.error.details[0]).toMatchObject({ path: 'body.card.tempi' });
    expect(deep.body.error.details[0].message).toMatch(/tempo/);
  });

  it('refuses a __proto__ key instead of letting it through', async () => {
    const teacher = await t.signIn('teacher');
    const raw = JSON.stringify(envelope()).replace('{', '{"__proto__":{"admin":true},');
    const res = await teacher
      .post('/api/rule-cards/import')
      .set('Content-Type', 'application/json')
      .send(raw);
    expect(res.status).toBe(400);
    expect(res.body.error.details.map((d: { path: string }) => d.path)).toEqual(['body.__proto__']);
    expect(({} as Record<string, unknown>)['admin']).toBeUndefined();
  });

  it('checks title, tags and level, and a missing card', async () => {
    const teacher = await t.signIn('teacher');
    const res = await teacher
      .post('/api/rule-cards/import')
      .send(envelope({ title: 42, tags: 'linear', level: 'expert', card: undefined }));
    expect(res.status).toBe(400);
    const paths = res.body.error.details.map((d: { path: string }) => d.path).sort();
    expect(paths).toEqual(['body.card', 'body.level', 'body.tags', 'body.title']);
  });

  it('refuses a file over 64 KB before reading it', async () => {
    const teacher = await t.signIn('teacher');
    const big = envelope({ title: 'Big', padding: 'x'.repeat(64 * 1024) });
    const res = await teacher.post('/api/rule-cards/import').send(big);
    expect(res.status).toBe(413);
    expect(res.body.error).toEqual({
      code: 'payload_too_large',
      message: 'A rule card file may be at most 64 KB.',
    });
    // A deeply nested card is answered, not crashed on.
    let nested: unknown = 1;
    for (let i = 0; i < 2000; i += 1) nested = [nested];
    const deep = await teacher.post('/api/rule-cards/import').send(envelope({ card: nested }));
    expect(deep.status).toBe(400);
  });

  it('is for teachers: students 403', async () => {
    const student = await t.signIn('student');
    expect((await student.post('/api/rule-cards/import').send(envelope())).status).toBe(403);
  });

  it('refuses a body that is not an object', async () => {
    const teacher = await t.signIn('teacher');
    const res = await teacher
      .post('/api/rule-cards/import')
      .set('Content-Type', 'application/json')
      .send('[1,2]');
    expect(res.status).toBe(400);
    expect(res.body.error.code).toBe('invalid_body');
  });
});
