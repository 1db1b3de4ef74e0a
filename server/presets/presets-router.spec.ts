import request from 'supertest';
import { afterAll, beforeAll, describe, expect, it } from 'vitest';
import { parseRuleCard } from '../../shared/generator/index';
import { BUILT_IN_PRESETS } from '../../shared/generator/presets/index';
import { createTestApp, type TestApp } from '../testing/test-app';
import { meterText, subdivisionWord } from './preset-summary';

let t: TestApp;
beforeAll(async () => {
  t = await createTestApp();
});
afterAll(async () => {
  await t.close();
});

describe('GET /api/presets (any signed-in role)', () => {
  it('has built-in presets to serve', () => {
    expect(BUILT_IN_PRESETS.length).toBeGreaterThan(0);
  });

  it.each(['admin', 'teacher', 'student'] as const)(
    'lists every built-in preset for a %s',
    async (role) => {
      const agent = await t.signIn(role);
      const res = await agent.get('/api/presets');
      expect(res.status).toBe(200);
      const presets = res.body.presets as Record<string, unknown>[];
      expect(presets.map((p) => p['id'])).toEqual(BUILT_IN_PRESETS.map((p) => p.id));
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
        });
        expect(preset['meter']).toMatch(/^\d+\/\d+$/);
      }
    },
  );

  it('answers 401 when signed out', async () => {
    expect((await request(t.app).get('/api/presets')).status).toBe(401);
    expect((await request(t.app).get(`/api/presets/${BUILT_IN_PRESETS[0]!.id}`)).status).toBe(401);
  });
});

describe('GET /api/presets/:id', () => {
  it('returns one preset by id', async () => {
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
