import request from 'supertest';
import { afterAll, beforeAll, describe, expect, it } from 'vitest';
import { DEMO_ACCOUNTS } from '../demo/seed-demo';
import { createTestApp, type TestApp } from '../testing/test-app';

let t: TestApp;
beforeAll(async () => {
  t = await createTestApp();
});
afterAll(async () => {
  await t.close();
});

describe('GET /api/users (admin only)', () => {
  it('lists every account, public fields only, for an admin', async () => {
    const admin = await t.signIn('admin');
    const res = await admin.get('/api/users');
    expect(res.status).toBe(200);
    const users = res.body.users as Record<string, unknown>[];
    expect(users.map((u) => u['email']).sort()).toEqual(DEMO_ACCOUNTS.map((a) => a.email).sort());
    for (const user of users)
      expect(Object.keys(user).sort()).toEqual(['email', 'id', 'name', 'role', 'status']);
    expect(users[0]?.['role']).toBe('admin');
  });

  it.each(['student', 'teacher'] as const)(
    'answers 403 with the error shape for a %s',
    async (role) => {
      const agent = await t.signIn(role);
      const res = await agent.get('/api/users');
      expect(res.status).toBe(403);
      expect(res.body).toEqual({
        error: { code: 'forbidden', message: 'Only admins can do this.' },
      });
    },
  );

  it('answers 401 when signed out', async () => {
    const res = await request(t.app).get('/api/users');
    expect(res.status).toBe(401);
    expect(res.body.error.code).toBe('unauthenticated');
  });
});
