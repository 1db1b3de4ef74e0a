import express from 'express';
import request from 'supertest';
import { afterAll, beforeAll, describe, expect, it } from 'vitest';
import { errorHandler } from './error-handler';
import { createLogger } from './logger';
import { createTestApp, type TestApp } from './testing/test-app';

let t: TestApp;
beforeAll(async () => {
  t = await createTestApp();
});
afterAll(async () => {
  await t.close();
});

describe('the API error shape', () => {
  it('answers unknown /api paths with a JSON 404', async () => {
    const res = await request(t.app).get('/api/no-such-thing?x=1');
    expect(res.status).toBe(404);
    expect(res.type).toBe('application/json');
    expect(res.body).toEqual({
      error: { code: 'not_found', message: 'There is no API route GET /api/no-such-thing.' },
    });
  });

  it('answers malformed JSON with 400 invalid_json and changes nothing', async () => {
    const before = await t.db('sessions').count({ n: '*' });
    const res = await request(t.app)
      .post('/api/auth/sign-in')
      .set('Content-Type', 'application/json')
      .send('{"email": "imogen.vale@larkspur.test", "password": ');
    expect(res.status).toBe(400);
    expect(res.body).toEqual({
      error: { code: 'invalid_json', message: 'The request body is not valid JSON.' },
    });
    expect(res.headers['set-cookie']).toBeUndefined();
    expect(await t.db('sessions').count({ n: '*' })).toEqual(before);
  });

  it('answers an oversized body with 413', async () => {
    const res = await request(t.app)
      .post('/api/auth/sign-in')
      .set('Content-Type', 'application/json')
      .send(JSON.stringify({ email: 'a@larkspur.test', password: 'x'.repeat(300_000) }));
    expect(res.status).toBe(413);
    expect(res.body.error.code).toBe('payload_too_large');
  });

  it.each(['/api/presets/%E0%A4%A', '/api/presets/%00%ff'])(
    'answers a malformed percent-encoding in %s with 400 invalid_path',
    async (path) => {
      const agent = await t.signIn('student');
      const res = await agent.get(path);
      expect(res.status).toBe(400);
      expect(res.body).toEqual({
        error: {
          code: 'invalid_path',
          message: 'The address contains malformed percent-encoding.',
        },
      });
      expect(t.logLines.filter((line) => line.includes('"level":"error"'))).toEqual([]);
    },
  );

  it('answers a malformed page address outside /api with 400, not 500', async () => {
    const res = await request(t.app).get('/drills/%E0%A4%A');
    expect(res.status).toBe(400);
    expect(res.body.error.code).toBe('invalid_path');
  });

  it('sends no-store on API answers', async () => {
    const res = await request(t.app).get('/api/auth/me');
    expect(res.headers['cache-control']).toBe('no-store');
  });
});

/** A bare app whose one route throws `error`, with the error handler logging into `lines`. */
function appThrowing(error: unknown, lines: string[]) {
  const app = express();
  app.get('/boom', async () => {
    throw error;
  });
  app.use(errorHandler(createLogger('info', (line) => lines.push(line))));
  return app;
}

function clientError(status: number, key: 'status' | 'statusCode', message: string): Error {
  return Object.assign(new Error(message), { [key]: status });
}

describe('errorHandler', () => {
  it.each([
    [400, 'status', 'bad_request', 'The server could not accept this request (400 Bad Request).'],
    [404, 'statusCode', 'not_found', 'The server could not accept this request (404 Not Found).'],
    [
      415,
      'status',
      'unsupported_media_type',
      'The server could not accept this request (415 Unsupported Media Type).',
    ],
  ] as const)(
    'passes a library error carrying %i (as %s) through, without echoing its message',
    async (status, key, code, message) => {
      const lines: string[] = [];
      const res = await request(
        appThrowing(clientError(status, key, 'Failed at /internal/x'), lines),
      ).get('/boom');
      expect(res.status).toBe(status);
      expect(res.body).toEqual({ error: { code, message } });
      expect(res.text).not.toContain('internal');
      expect(lines).toEqual([]);
    },
  );

  it.each([
    ['a 5xx status', clientError(503, 'status', 'upstream down')],
    ['a status that is not a number', clientError(Number.NaN, 'status', 'odd')],
    ['a URIError of its own', new URIError('URI malformed')],
  ])('still answers an error with %s as a logged 500', async (_what, error) => {
    const lines: string[] = [];
    const res = await request(appThrowing(error, lines)).get('/boom');
    expect(res.status).toBe(500);
    expect(res.body.error.code).toBe('internal_error');
    expect(lines).toHaveLength(1);
  });

  it.each([
    ['SQLite held past the busy timeout', { code: 'SQLITE_BUSY' }],
    ['a PostgreSQL lock timeout', { code: '55P03' }],
    ['no pooled connection in time', { name: 'KnexTimeoutError' }],
  ])(
    'answers a busy database (%s) with 503 and Retry-After, and logs it',
    async (_what, fields) => {
      const lines: string[] = [];
      const res = await request(appThrowing(Object.assign(new Error('busy'), fields), lines)).get(
        '/boom',
      );
      expect(res.status).toBe(503);
      expect(res.headers['retry-after']).toBe('5');
      expect(res.body).toEqual({
        error: {
          code: 'service_unavailable',
          message: 'The server is busy just now. Please try again in a moment.',
        },
      });
      expect(lines).toHaveLength(1);
    },
  );

  it('turns an unexpected error into a 500 without the stack, and logs it', async () => {
    const lines: string[] = [];
    const app = express();
    app.get('/boom', async () => {
      throw new Error('database exploded at /secret/path');
    });
    app.use(errorHandler(createLogger('info', (line) => lines.push(line))));
    const res = await request(app).get('/boom');
    expect(res.status).toBe(500);
    expect(res.body).toEqual({
      error: {
        code: 'internal_error',
        message: 'Something went wrong on the server. Please try again.',
      },
    });
    expect(res.text).not.toContain('exploded');
    expect(res.text).not.toContain('at ');
    expect(lines).toHaveLength(1);
    expect(JSON.parse(lines[0]!)).toMatchObject({
      level: 'error',
      path: '/boom',
      error: { message: 'database exploded at /secret/path' },
    });
  });
});
