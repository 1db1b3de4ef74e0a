import request from 'supertest';
import { afterAll, beforeAll, describe, expect, it } from 'vitest';
import { createTestApp, type TestApp } from './testing/test-app';

let t: TestApp;
beforeAll(async () => {
  t = await createTestApp();
});
afterAll(async () => {
  await t.close();
});

describe('a wrong method on an existing API route', () => {
  it.each([
    ['post', '/api/health', 'GET, HEAD'],
    ['delete', '/api/health', 'GET, HEAD'],
    ['get', '/api/auth/sign-in', 'POST'],
    ['put', '/api/auth/sign-out', 'POST'],
    ['post', '/api/auth/me', 'GET, HEAD'],
    ['delete', '/api/users', 'GET, HEAD, POST'],
    ['patch', '/api/students', 'GET, HEAD'],
    ['post', '/api/presets', 'GET, HEAD'],
    ['patch', '/api/presets/backbeat-basics', 'GET, HEAD, PUT'],
    ['patch', '/api/rule-cards/1', 'DELETE, GET, HEAD, PUT'],
  ] as const)('answers %s %s with 405 and Allow: %s', async (method, path, allow) => {
    const agent = await t.signIn('admin');
    const res = await agent[method](path).send({});
    expect(res.status).toBe(405);
    expect(res.headers['allow']).toBe(allow);
    expect(res.body).toEqual({
      error: {
        code: 'method_not_allowed',
        message: `${path} does not take ${method.toUpperCase()}; it takes ${allow}.`,
      },
    });
  });

  it('answers 405 to anyone: the method is wrong whoever asks', async () => {
    const res = await request(t.app).delete('/api/users');
    expect(res.status).toBe(405);
    expect(res.headers['allow']).toBe('GET, HEAD, POST');
  });

  it('answers OPTIONS with 204 and the Allow header', async () => {
    const res = await request(t.app).options('/api/auth/sign-in');
    expect(res.status).toBe(204);
    expect(res.headers['allow']).toBe('POST');
  });

  it('still serves the right methods, HEAD included, and 404s a path no route has', async () => {
    expect((await request(t.app).get('/api/health')).status).toBe(200);
    expect((await request(t.app).head('/api/health')).status).toBe(200);
    const missing = await request(t.app).post('/api/no-such-route');
    expect(missing.status).toBe(404);
    expect(missing.body.error.code).toBe('not_found');
    expect(missing.headers['allow']).toBeUndefined();
  });
});
