import { afterAll, beforeAll, describe, expect, it } from 'vitest';
import { seedDemoStudio } from '../demo/seed-studio';
import { createTestApp, type TestApp } from '../testing/test-app';

// The app's clock, moved by the tests to cross the hour window exactly.
let clock = new Date('2026-05-04T09:00:00Z');
const at = (minutes: number) => {
  clock = new Date(Date.parse('2026-05-04T09:00:00Z') + minutes * 60_000);
};
let t: TestApp;

beforeAll(async () => {
  // Client addresses come from X-Forwarded-For, as behind the proxy TRUST_PROXY names.
  t = await createTestApp({ env: { TRUST_PROXY: 'loopback' }, deps: { now: () => clock } });
  await seedDemoStudio(t.db, clock);
});
afterAll(async () => {
  await t.close();
});

const reset = (email: string, ip = '203.0.113.5') =>
  t.agent().post('/api/password-resets').set('X-Forwarded-For', ip).send({ email });

async function outboxCount(to: string): Promise<number> {
  const [row] = await t.db('outbox').where({ to }).count<{ n: number | string }[]>({ n: '*' });
  return Number(row!.n);
}

describe('limits on reset and invitation e-mails', () => {
  it('answers 429 after 3 reset requests for one address in an hour, with Retry-After', async () => {
    at(0);
    const email = 'felix.abara@larkspur.test';
    for (let i = 0; i < 3; i += 1) expect((await reset(email)).status).toBe(202);
    at(30);
    const refused = await reset(email);
    expect(refused.status).toBe(429);
    expect(refused.body.error.code).toBe('too_many_emails');
    expect(refused.body.error.message).toMatch(/Try again in 30 minutes\./);
    expect(refused.headers['retry-after']).toBe(String(30 * 60));
    expect(await outboxCount(email)).toBe(3);
    // The same answer for an address without an account: a 429 reveals nothing.
    for (let i = 0; i < 3; i += 1) await reset('nobody@larkspur.test', '203.0.113.6');
    expect((await reset('nobody@larkspur.test', '203.0.113.6')).status).toBe(429);
    // An hour after the first request the window has moved on.
    at(60);
    expect((await reset(email)).status).toBe(202);
    expect(await outboxCount(email)).toBe(4);
  });

  it('answers 429 after 10 requests from one client, whatever the addresses', async () => {
    at(200);
    for (let i = 0; i < 10; i += 1) {
      expect((await reset(`reader${i}@larkspur.test`, '198.51.100.7')).status).toBe(202);
    }
    expect((await reset('reader10@larkspur.test', '198.51.100.7')).status).toBe(429);
    expect((await reset('reader10@larkspur.test', '198.51.100.8')).status).toBe(202);
  });

  it('counts the admin’s "send reset" with the public form per address', async () => {
    at(400);
    const admin = await t.signIn('admin');
    const users = (await admin.get('/api/users')).body.users as { id: number; email: string }[];
    const juno = users.find((u) => u.email === 'juno.marsh@larkspur.test')!;
    expect((await reset(juno.email)).status).toBe(202);
    expect((await admin.post(`/api/users/${juno.id}/password-reset`)).status).toBe(202);
    expect((await admin.post(`/api/users/${juno.id}/password-reset`)).status).toBe(202);
    const refused = await admin.post(`/api/users/${juno.id}/password-reset`);
    expect(refused.status).toBe(429);
    expect(refused.body.error.message).toMatch(/password reset e-mails/);
  });

  it('limits invitation resends per address', async () => {
    at(600);
    const teacher = await t.signIn('tomasz.reyes@larkspur.test');
    const email = 'pending.pupil@larkspur.test';
    const invite = () =>
      teacher.post('/api/studio/students').send({ name: 'Pending Pupil', email });
    expect((await invite()).status).toBe(201);
    const id = (await invite()).body.student.id as number;
    expect((await teacher.post(`/api/studio/students/${id}/invitation`)).status).toBe(200);
    expect((await teacher.post(`/api/studio/students/${id}/invitation`)).status).toBe(200);
    const refused = await teacher.post(`/api/studio/students/${id}/invitation`);
    expect(refused.status).toBe(429);
    expect(refused.body.error.message).toMatch(/invitation e-mails/);
    expect((await invite()).status).toBe(429);
    // The first invitation and three resends went out; the refused ones did not.
    expect(await outboxCount(email)).toBe(4);
    at(600 + 61);
    expect((await invite()).status).toBe(200);
  });
});
