import { afterAll, beforeAll, describe, expect, it } from 'vitest';
import { seedDemoAuthoring } from '../demo/seed-authoring';
import { seedDemoStudio } from '../demo/seed-studio';
import { latestMailTo, linkToken } from '../mail/outbox-reader';
import { createTestApp, type TestApp } from '../testing/test-app';

let t: TestApp;
const TOMASZ = 'tomasz.reyes@larkspur.test';
const HANA = 'hana.lindqvist@larkspur.test';

beforeAll(async () => {
  t = await createTestApp();
  await seedDemoAuthoring(t.db);
  await seedDemoStudio(t.db, new Date());
});
afterAll(async () => {
  await t.close();
});

async function outboxCount(to: string): Promise<number> {
  const [row] = await t.db('outbox').where({ to }).count<{ n: number | string }[]>({ n: '*' });
  return Number(row!.n);
}

describe('inviting an address again', () => {
  it('resends a pending invitation: the old link stops working, the new one opens the account', async () => {
    const tomasz = await t.signIn(TOMASZ);
    const email = 'ada.pending@larkspur.test';
    const first = await tomasz.post('/api/studio/students').send({ name: 'Ada Pending', email });
    expect(first.status).toBe(201);
    expect(first.body.outcome).toBe('invited');
    const oldToken = linkToken(await latestMailTo(t.db, email), 'invitations');

    const again = await tomasz.post('/api/studio/students').send({ name: 'Ada Pending', email });
    expect(again.status).toBe(200);
    expect(again.body).toMatchObject({ outcome: 'resent', student: { status: 'invited' } });
    const byId = await tomasz.post(`/api/studio/students/${first.body.student.id}/invitation`);
    expect(byId.status).toBe(200);
    expect(await outboxCount(email)).toBe(3);
    const newToken = linkToken(await latestMailTo(t.db, email), 'invitations');
    expect(newToken).not.toBe(oldToken);

    const visitor = t.agent();
    expect((await visitor.get(`/api/invitations/${oldToken}`)).status).toBe(410);
    const accepted = await visitor
      .post(`/api/invitations/${newToken}`)
      .send({ password: 'a long new password 7' });
    expect(accepted.status).toBe(200);
    // Joined: nothing left to resend, and inviting again says so.
    const joined = await tomasz.post(`/api/studio/students/${first.body.student.id}/invitation`);
    expect(joined.status).toBe(409);
    expect(joined.body.error.code).toBe('not_pending');
    const current = await tomasz.post('/api/studio/students').send({ name: 'Ada', email });
    expect(current.status).toBe(409);
    expect(current.body.error.code).toBe('already_in_studio');
  });

  it('brings a removed student back with their history', async () => {
    const tomasz = await t.signIn(TOMASZ);
    const juno = 'juno.marsh@larkspur.test';
    const roster = (await tomasz.get('/api/studio/students')).body.students as {
      id: number;
      email: string;
    }[];
    const id = roster.find((s) => s.email === juno)!.id;
    const logsBefore = (await tomasz.get(`/api/practice/logs?studentId=${id}`)).body.total;
    expect(logsBefore).toBeGreaterThan(0);
    expect((await tomasz.delete(`/api/studio/students/${id}`)).status).toBe(204);
    expect(
      (await t.agent().post('/api/auth/sign-in').send({ email: juno, password: 'x' })).status,
    ).not.toBe(200);
    const removedResend = await tomasz.post(`/api/studio/students/${id}/invitation`);
    expect(removedResend.status).toBe(409);

    const back = await tomasz
      .post('/api/studio/students')
      .send({ name: 'Juno Marsh', email: juno });
    expect(back.status).toBe(200);
    expect(back.body).toMatchObject({ outcome: 'rejoined', student: { id, status: 'invited' } });
    const token = linkToken(await latestMailTo(t.db, juno), 'invitations');
    const student = t.agent();
    expect(
      (await student.post(`/api/invitations/${token}`).send({ password: 'back again password 3' }))
        .status,
    ).toBe(200);
    const after = (await tomasz.get('/api/studio/students')).body.students.find(
      (s: { id: number }) => s.id === id,
    );
    expect(after.status).toBe('active');
    expect((await tomasz.get(`/api/practice/logs?studentId=${id}`)).body.total).toBe(logsBefore);
    expect((await student.get('/api/practice/logs')).body.total).toBe(logsBefore);
  });

  it('answers 409 email_taken, in words, for another teacher’s student or a teacher', async () => {
    const tomasz = await t.signIn(TOMASZ);
    for (const email of ['wren.okoye@larkspur.test', HANA]) {
      const res = await tomasz.post('/api/studio/students').send({ name: 'Someone', email });
      expect(res.status).toBe(409);
      expect(res.body.error.code).toBe('email_taken');
      expect(res.body.error.details).toEqual([
        { path: 'body.email', message: expect.stringMatching(/someone else’s account/) },
      ]);
    }
    const hana = await t.signIn(HANA);
    const ids = (await tomasz.get('/api/studio/students')).body.students.map(
      (s: { id: number }) => s.id,
    );
    expect((await hana.post(`/api/studio/students/${ids[0]}/invitation`)).status).toBe(404);
  });
});
