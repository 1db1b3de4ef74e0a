import request from 'supertest';
import { afterAll, beforeAll, describe, expect, it } from 'vitest';
import { hashLinkToken } from '../auth/tokens';
import { latestMailTo, linkToken } from '../mail/outbox-reader';
import { createTestApp, type TestApp } from '../testing/test-app';

let t: TestApp;
beforeAll(async () => {
  t = await createTestApp();
});
afterAll(async () => {
  await t.close();
});

const TOMASZ = 'tomasz.reyes@larkspur.test';
const HANA = 'hana.lindqvist@larkspur.test';

async function invite(who: string, name: string, email: string) {
  const teacher = await t.signIn(who);
  const res = await teacher.post('/api/studio/students').send({ name, email });
  return { teacher, res };
}

describe('inviting a student (POST /api/studio/students)', () => {
  it('adds an invited student to the roster and e-mails a single-use link, stored hashed', async () => {
    const { teacher, res } = await invite(TOMASZ, 'Ada Quill', 'Ada.Quill@larkspur.test');
    expect(res.status).toBe(201);
    expect(res.body.student).toMatchObject({
      name: 'Ada Quill',
      email: 'ada.quill@larkspur.test',
      status: 'invited',
      lastPractice: null,
      openAssignments: 0,
      streak: 0,
    });
    const mail = await latestMailTo(t.db, 'ada.quill@larkspur.test');
    expect(mail?.subject).toBe('Tomasz Reyes invited you to Tensile');
    // Branded, a plain-text part, no images.
    expect(mail?.text).toContain('Tensile');
    expect(mail?.html).toContain('Tensile');
    expect(mail?.html).not.toMatch(/<img|url\(/i);
    const token = linkToken(mail, 'invitations');
    expect(mail?.text).toContain(`${t.config.publicUrl}/invitations/${token}`);
    // Only the hash is stored.
    const rows = await t.db('invitations').select('token_hash');
    expect(rows.map((r) => r.token_hash)).toContain(hashLinkToken(token));
    expect(JSON.stringify(rows)).not.toContain(token);

    // Not signed in yet: the account is closed until the password is chosen.
    const closed = await request(t.app)
      .post('/api/auth/sign-in')
      .send({ email: 'ada.quill@larkspur.test', password: 'anything-at-all' });
    expect(closed.status).toBe(401);

    const roster = await teacher.get('/api/studio/students');
    expect(roster.body.students.map((s: { email: string }) => s.email)).toEqual([
      'ada.quill@larkspur.test',
    ]);
  });

  it('answers 400 with field paths for a bad name or e-mail, and unknown fields', async () => {
    const teacher = await t.signIn(TOMASZ);
    const res = await teacher
      .post('/api/studio/students')
      .send({ name: '', email: 'not-an-address', extra: 1 });
    expect(res.status).toBe(400);
    const paths = (res.body.error.details as { path: string }[]).map((d) => d.path).sort();
    expect(paths).toEqual(['body', 'body.email', 'body.name']);
  });

  it('answers 409 email_taken when the address is an account outside the studio', async () => {
    const { res } = await invite(TOMASZ, 'Juno again', 'juno.marsh@larkspur.test');
    expect(res.status).toBe(409);
    expect(res.body.error.code).toBe('email_taken');
  });

  it.each(['student', 'admin'])('answers 403 to a %s', async (role) => {
    const agent = await t.signIn(role);
    expect((await agent.get('/api/studio/students')).status).toBe(403);
    const res = await agent
      .post('/api/studio/students')
      .send({ name: 'X', email: 'x@larkspur.test' });
    expect(res.status).toBe(403);
  });

  it('answers 401 signed out', async () => {
    expect((await request(t.app).get('/api/studio/students')).status).toBe(401);
  });
});

describe('accepting an invitation (/api/invitations/:token)', () => {
  it('shows who is invited, sets the password, signs in, and works only once', async () => {
    await invite(TOMASZ, 'Bo Lindgren', 'bo.lindgren@larkspur.test');
    const token = linkToken(await latestMailTo(t.db, 'bo.lindgren@larkspur.test'), 'invitations');
    const shown = await request(t.app).get(`/api/invitations/${token}`);
    expect(shown.status).toBe(200);
    expect(shown.body.invitation).toEqual({
      name: 'Bo Lindgren',
      email: 'bo.lindgren@larkspur.test',
      role: 'student',
    });

    const short = await request(t.app)
      .post(`/api/invitations/${token}`)
      .send({ password: 'short' });
    expect(short.status).toBe(400);
    expect(short.body.error.details).toEqual([
      { path: 'body.password', message: 'A password has at least 10 characters.' },
    ]);

    const agent = t.agent();
    const accepted = await agent
      .post(`/api/invitations/${token}`)
      .send({ password: 'bo-plays-brushes' });
    expect(accepted.status).toBe(200);
    expect(accepted.body.user).toMatchObject({
      email: 'bo.lindgren@larkspur.test',
      role: 'student',
    });
    expect((await agent.get('/api/auth/me')).body.user.email).toBe('bo.lindgren@larkspur.test');

    const again = await request(t.app)
      .post(`/api/invitations/${token}`)
      .send({ password: 'another-password' });
    expect(again.status).toBe(410);
    expect(again.body.error.code).toBe('link_used');
    expect((await request(t.app).get(`/api/invitations/${token}`)).status).toBe(410);

    const signIn = await request(t.app)
      .post('/api/auth/sign-in')
      .send({ email: 'bo.lindgren@larkspur.test', password: 'bo-plays-brushes' });
    expect(signIn.status).toBe(200);

    const teacher = await t.signIn(TOMASZ);
    const roster = await teacher.get('/api/studio/students');
    const bo = roster.body.students.find((s: { name: string }) => s.name === 'Bo Lindgren');
    expect(bo.status).toBe('active');
  });

  it('refuses an expired link (7 days) with 410', async () => {
    await invite(TOMASZ, 'Cy Varga', 'cy.varga@larkspur.test');
    const token = linkToken(await latestMailTo(t.db, 'cy.varga@larkspur.test'), 'invitations');
    const row = await t
      .db('invitations')
      .where({ token_hash: hashLinkToken(token) })
      .first();
    const issued = Number(new Date(row.created_at));
    const expires = Number(new Date(row.expires_at));
    expect(expires - issued).toBeGreaterThanOrEqual(7 * 86_400_000 - 1000);
    expect(expires - issued).toBeLessThanOrEqual(7 * 86_400_000 + 1000);
    await t
      .db('invitations')
      .where({ id: row.id })
      .update({ expires_at: new Date(Date.now() - 1000) });
    const res = await request(t.app)
      .post(`/api/invitations/${token}`)
      .send({ password: 'too-late-for-this' });
    expect(res.status).toBe(410);
    expect(res.body.error.code).toBe('link_expired');
  });

  it('answers 404 for an unknown token and 400 for a malformed one', async () => {
    const unknown = await request(t.app).get(`/api/invitations/${'A'.repeat(43)}`);
    expect(unknown.status).toBe(404);
    expect(unknown.body.error.code).toBe('invalid_link');
    const malformed = await request(t.app).get('/api/invitations/%3Cscript%3E');
    expect(malformed.status).toBe(400);
    expect(malformed.body.error.details[0].path).toBe('params.token');
  });
});

describe('the studio is the teacher’s own', () => {
  it('shows teacher B nothing of teacher A’s students, and 404s removing them', async () => {
    const { res } = await invite(TOMASZ, 'Dee Orr', 'dee.orr@larkspur.test');
    const hana = await t.signIn(HANA);
    const roster = await hana.get('/api/studio/students');
    expect(roster.body.students.map((s: { name: string }) => s.name)).not.toContain('Dee Orr');
    const remove = await hana.delete(`/api/studio/students/${res.body.student.id}`);
    expect(remove.status).toBe(404);
  });
});

describe('removing a student (DELETE /api/studio/students/:id)', () => {
  it('keeps them on the roster as removed and disables their sign-in', async () => {
    await invite(TOMASZ, 'Eli Park', 'eli.park@larkspur.test');
    const token = linkToken(await latestMailTo(t.db, 'eli.park@larkspur.test'), 'invitations');
    const student = t.agent();
    await student.post(`/api/invitations/${token}`).send({ password: 'eli-keeps-time' });
    const teacher = await t.signIn(TOMASZ);
    const eli = (await teacher.get('/api/studio/students')).body.students.find(
      (s: { name: string }) => s.name === 'Eli Park',
    );
    expect((await teacher.delete(`/api/studio/students/${eli.id}`)).status).toBe(204);
    expect((await teacher.delete(`/api/studio/students/${eli.id}`)).status).toBe(404);

    const after = (await teacher.get('/api/studio/students')).body.students.find(
      (s: { name: string }) => s.name === 'Eli Park',
    );
    expect(after.status).toBe('removed');
    expect(after.removedAt).toEqual(expect.any(String));
    // The open session loses access; signing in again is refused.
    expect((await student.get('/api/auth/me')).status).toBe(401);
    const signIn = await request(t.app)
      .post('/api/auth/sign-in')
      .send({ email: 'eli.park@larkspur.test', password: 'eli-keeps-time' });
    expect(signIn.status).toBe(401);
    // No longer offered when assigning.
    const students = await teacher.get('/api/students');
    expect(students.body.students.map((s: { name: string }) => s.name)).not.toContain('Eli Park');
  });

  it('answers 400 for a bad id', async () => {
    const teacher = await t.signIn(TOMASZ);
    const res = await teacher.delete('/api/studio/students/abc');
    expect(res.status).toBe(400);
    expect(res.body.error.details[0].path).toBe('params.id');
  });
});
