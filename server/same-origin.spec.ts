import request from 'supertest';
import { afterAll, beforeAll, describe, expect, it } from 'vitest';
import { createTestApp, findAccount, type TestApp } from './testing/test-app';

let t: TestApp;
beforeAll(async () => {
  t = await createTestApp({ env: { PUBLIC_URL: 'http://studio.larkspur.test:8080' } });
});
afterAll(async () => {
  await t.close();
});

const admin = findAccount('admin');
const signIn = (origin?: string) => {
  const req = request(t.app).post('/api/auth/sign-in');
  if (origin) req.set('Origin', origin);
  return req.send({ email: admin.email, password: admin.password });
};

describe('requireSameOrigin', () => {
  it('refuses a POST from another origin with 403', async () => {
    const res = await signIn('http://evil.larkspur.test');
    expect(res.status).toBe(403);
    expect(res.body.error.code).toBe('cross_origin');
    expect(res.headers['set-cookie']).toBeUndefined();
  });

  it('accepts the public origin, the request’s own origin, and no Origin at all', async () => {
    expect((await signIn('http://studio.larkspur.test:8080')).status).toBe(200);
    const own = request(t.app)
      .post('/api/auth/sign-in')
      .set('Host', 'localhost:4200')
      .set('Origin', 'http://localhost:4200');
    expect((await own.send({ email: admin.email, password: admin.password })).status).toBe(200);
    expect((await signIn()).status).toBe(200);
  });

  it('lets cross-origin GETs through (they change nothing)', async () => {
    const res = await request(t.app).get('/api/health').set('Origin', 'http://evil.larkspur.test');
    expect(res.status).toBe(200);
  });
});
