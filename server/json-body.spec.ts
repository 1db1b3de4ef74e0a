import { brotliCompressSync, deflateSync, gzipSync } from 'node:zlib';
import request from 'supertest';
import { afterAll, beforeAll, describe, expect, it } from 'vitest';
import { createTestApp, findAccount, type TestApp } from './testing/test-app';

let t: TestApp;
beforeAll(async () => {
  t = await createTestApp();
});
afterAll(async () => {
  await t.close();
});

const teacher = findAccount('teacher');
const credentials = JSON.stringify({ email: teacher.email, password: teacher.password });

async function sessionCount(): Promise<number> {
  return Number((await t.db('sessions').count({ n: '*' }))[0]?.n);
}

/** Posts a raw body to sign-in, where a success would create a session. */
function postSignIn(body: string | Buffer, encoding?: string): request.Test {
  const req = request(t.app).post('/api/auth/sign-in').set('Content-Type', 'application/json');
  if (encoding) req.set('Content-Encoding', encoding);
  // superagent would JSON-serialise a Buffer under a JSON content type; send the bytes as they are.
  return req.serialize((bytes) => bytes as string).send(body);
}

/** The request was refused before it did anything, and nothing was logged as a server fault. */
async function expectRefusedQuietly(res: request.Response, sessionsBefore: number) {
  expect(res.headers['set-cookie']).toBeUndefined();
  expect(await sessionCount()).toBe(sessionsBefore);
  expect(t.logLines.filter((line) => line.includes('"level":"error"'))).toEqual([]);
}

describe('a body whose Content-Encoding does not match it', () => {
  it.each(['gzip', 'deflate', 'br', 'GZIP'])(
    'answers 400 invalid_body_encoding for an uncompressed body sent as %s',
    async (encoding) => {
      const before = await sessionCount();
      const res = await postSignIn(credentials, encoding);
      expect(res.status).toBe(400);
      expect(res.body).toEqual({
        error: {
          code: 'invalid_body_encoding',
          message: 'The request body could not be decompressed.',
        },
      });
      await expectRefusedQuietly(res, before);
    },
  );

  it('answers 400 for a gzip body cut short', async () => {
    const before = await sessionCount();
    const whole = gzipSync(credentials);
    const res = await postSignIn(whole.subarray(0, whole.length - 12), 'gzip');
    expect(res.status).toBe(400);
    expect(res.body.error.code).toBe('invalid_body_encoding');
    await expectRefusedQuietly(res, before);
  });

  it.each([
    ['gzip', gzipSync],
    ['deflate', deflateSync],
    ['br', brotliCompressSync],
  ] as const)('still accepts a body really compressed with %s', async (encoding, compress) => {
    const res = await postSignIn(compress(credentials), encoding);
    expect(res.status).toBe(200);
    expect(res.body.user.email).toBe(teacher.email);
  });

  it('keeps refusing an encoding it does not know with 415', async () => {
    const res = await postSignIn(credentials, 'compress');
    expect(res.status).toBe(415);
    expect(res.body.error.code).toBe('unsupported_encoding');
  });
});

describe('a JSON body that is not an object', () => {
  it.each([
    ['null', 'null'],
    ['a string', JSON.stringify(credentials)],
    ['an array', `[${credentials}]`],
    ['a number', '42'],
    ['a boolean', ' true '],
  ])('answers %s with 400 invalid_body', async (_what, body) => {
    const before = await sessionCount();
    const res = await postSignIn(body);
    expect(res.status).toBe(400);
    expect(res.body).toEqual({
      error: { code: 'invalid_body', message: 'The request body must be a JSON object.' },
    });
    await expectRefusedQuietly(res, before);
  });

  it('still calls broken JSON invalid JSON', async () => {
    const res = await postSignIn('{"email": ');
    expect(res.status).toBe(400);
    expect(res.body.error.code).toBe('invalid_json');
  });

  it('lets a request without a body through to the route', async () => {
    const res = await request(t.app).post('/api/auth/sign-out');
    expect(res.status).toBe(204);
  });

  it('treats an empty JSON body as an empty object, so the route lists the missing fields', async () => {
    const res = await postSignIn('');
    expect(res.status).toBe(400);
    expect(res.body.error.code).toBe('validation_failed');
  });
});
