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

async function userId(email: string): Promise<number> {
  return Number((await t.db('users').where({ email }).first()).id);
}

describe('admin: users', () => {
  it('creates a teacher by invitation; the invited teacher chooses a password', async () => {
    const admin = await t.signIn('admin');
    const res = await admin
      .post('/api/users')
      .send({ name: 'Ines Faro', email: 'ines.faro@larkspur.test' });
    expect(res.status).toBe(201);
    expect(res.body.user).toMatchObject({ name: 'Ines Faro', role: 'teacher', status: 'invited' });
    const token = linkToken(await latestMailTo(t.db, 'ines.faro@larkspur.test'), 'invitations');
    const agent = t.agent();
    const accepted = await agent
      .post(`/api/invitations/${token}`)
      .send({ password: 'ines-teaches-now' });
    expect(accepted.body.user.role).toBe('teacher');
    const list = await admin.get('/api/users');
    const ines = list.body.users.find(
      (u: { email: string }) => u.email === 'ines.faro@larkspur.test',
    );
    expect(ines.status).toBe('active');
  });

  it('answers 400 with field paths and 409 for a taken address', async () => {
    const admin = await t.signIn('admin');
    const bad = await admin.post('/api/users').send({ name: ' ', email: 'x' });
    expect(bad.status).toBe(400);
    expect(bad.body.error.details.map((d: { path: string }) => d.path).sort()).toEqual([
      'body.email',
      'body.name',
    ]);
    const taken = await admin
      .post('/api/users')
      .send({ name: 'Again', email: 'tomasz.reyes@larkspur.test' });
    expect(taken.status).toBe(409);
  });

  it('changes a role, deactivates and reactivates', async () => {
    const admin = await t.signIn('admin');
    const felix = await userId('felix.abara@larkspur.test');
    const promoted = await admin.patch(`/api/users/${felix}`).send({ role: 'teacher' });
    expect(promoted.status).toBe(200);
    expect(promoted.body.user.role).toBe('teacher');
    const off = await admin.patch(`/api/users/${felix}`).send({ active: false });
    expect(off.body.user.status).toBe('deactivated');
    const signIn = await request(t.app)
      .post('/api/auth/sign-in')
      .send({ email: 'felix.abara@larkspur.test', password: 'larkspur-student' });
    expect(signIn.status).toBe(401);
    const on = await admin.patch(`/api/users/${felix}`).send({ active: true, role: 'student' });
    expect(on.body.user).toMatchObject({ status: 'active', role: 'student' });
  });

  it('never demotes or deactivates the last active admin', async () => {
    const admin = await t.signIn('admin');
    const imogen = await userId('imogen.vale@larkspur.test');
    const demote = await admin.patch(`/api/users/${imogen}`).send({ role: 'teacher' });
    expect(demote.status).toBe(409);
    expect(demote.body.error.code).toBe('last_admin');
    const deactivate = await admin.patch(`/api/users/${imogen}`).send({ active: false });
    expect(deactivate.status).toBe(409);
    // With a second admin, the first may step down.
    const hana = await userId('hana.lindqvist@larkspur.test');
    await admin.patch(`/api/users/${hana}`).send({ role: 'admin' });
    const stepDown = await admin.patch(`/api/users/${imogen}`).send({ role: 'teacher' });
    expect(stepDown.status).toBe(200);
    // Now Hana is the last admin.
    const hanaAgent = await t.signIn('hana.lindqvist@larkspur.test');
    expect((await hanaAgent.patch(`/api/users/${hana}`).send({ active: false })).status).toBe(409);
    await hanaAgent.patch(`/api/users/${imogen}`).send({ role: 'admin' });
    await hanaAgent.patch(`/api/users/${hana}`).send({ role: 'teacher' });
  });

  it('retires the open invitation of an account it deactivates', async () => {
    const admin = await t.signIn('admin');
    const created = await admin
      .post('/api/users')
      .send({ name: 'Otto Brandt', email: 'otto.brandt@larkspur.test' });
    const token = linkToken(await latestMailTo(t.db, 'otto.brandt@larkspur.test'), 'invitations');
    await admin.patch(`/api/users/${created.body.user.id}`).send({ active: false });
    const res = await request(t.app)
      .post(`/api/invitations/${token}`)
      .send({ password: 'otto-tries-anyway' });
    expect(res.status).toBe(410);
    const list = await admin.get('/api/users');
    const otto = list.body.users.find((u: { id: number }) => u.id === created.body.user.id);
    expect(otto.status).toBe('deactivated');
  });

  it('answers 400 for an empty change, 404 for an unknown user', async () => {
    const admin = await t.signIn('admin');
    const empty = await admin.patch('/api/users/1').send({});
    expect(empty.status).toBe(400);
    const role = await admin.patch('/api/users/1').send({ role: 'owner' });
    expect(role.body.error.details[0].path).toBe('body.role');
    expect((await admin.patch('/api/users/99999').send({ active: true })).status).toBe(404);
    expect((await admin.post('/api/users/99999/password-reset')).status).toBe(404);
  });

  it.each(['teacher', 'student'])('answers 403 to a %s on every admin route', async (role) => {
    const agent = await t.signIn(role);
    expect(
      (await agent.post('/api/users').send({ name: 'A', email: 'a@larkspur.test' })).status,
    ).toBe(403);
    expect((await agent.patch('/api/users/1').send({ active: false })).status).toBe(403);
    expect((await agent.post('/api/users/1/password-reset')).status).toBe(403);
    expect((await agent.get('/api/outbox')).status).toBe(403);
    expect((await agent.get('/api/outbox/1')).status).toBe(403);
  });
});

describe('password reset', () => {
  it('answers the same whether or not the address has an account', async () => {
    const known = await request(t.app)
      .post('/api/password-resets')
      .send({ email: 'juno.marsh@larkspur.test' });
    const unknown = await request(t.app)
      .post('/api/password-resets')
      .send({ email: 'nobody@larkspur.test' });
    expect(known.status).toBe(202);
    expect(unknown.status).toBe(202);
    expect(unknown.body).toEqual(known.body);
    expect(await latestMailTo(t.db, 'nobody@larkspur.test')).toBeUndefined();
    expect((await latestMailTo(t.db, 'juno.marsh@larkspur.test'))?.subject).toBe(
      'Reset your Tensile password',
    );
  });

  it('resets once with a hashed, 1-hour token; the old password stops working', async () => {
    const admin = await t.signIn('admin');
    const hana = await userId('hana.lindqvist@larkspur.test');
    expect((await admin.post(`/api/users/${hana}/password-reset`)).status).toBe(202);
    const token = linkToken(
      await latestMailTo(t.db, 'hana.lindqvist@larkspur.test'),
      'reset-password',
    );
    const row = await t
      .db('password_resets')
      .where({ token_hash: hashLinkToken(token) })
      .first();
    expect(row).toBeDefined();
    expect(JSON.stringify(await t.db('password_resets'))).not.toContain(token);
    const ttl = Number(new Date(row.expires_at)) - Number(new Date(row.created_at));
    expect(Math.abs(ttl - 3_600_000)).toBeLessThan(1000);

    const shown = await request(t.app).get(`/api/password-resets/${token}`);
    expect(shown.body.reset).toEqual({ email: 'hana.lindqvist@larkspur.test' });
    const bad = await request(t.app).post(`/api/password-resets/${token}`).send({ password: 'x' });
    expect(bad.status).toBe(400);
    expect(bad.body.error.details[0].path).toBe('body.password');
    const done = await request(t.app)
      .post(`/api/password-resets/${token}`)
      .send({ password: 'hana-new-password' });
    expect(done.status).toBe(204);
    const again = await request(t.app)
      .post(`/api/password-resets/${token}`)
      .send({ password: 'hana-other-password' });
    expect(again.status).toBe(410);

    const oldPassword = await request(t.app)
      .post('/api/auth/sign-in')
      .send({ email: 'hana.lindqvist@larkspur.test', password: 'larkspur-teacher' });
    expect(oldPassword.status).toBe(401);
    const newPassword = await request(t.app)
      .post('/api/auth/sign-in')
      .send({ email: 'hana.lindqvist@larkspur.test', password: 'hana-new-password' });
    expect(newPassword.status).toBe(200);
  });

  it('refuses an expired reset link and a newer link retires the older one', async () => {
    await request(t.app).post('/api/password-resets').send({ email: 'wren.okoye@larkspur.test' });
    const first = linkToken(await latestMailTo(t.db, 'wren.okoye@larkspur.test'), 'reset-password');
    await request(t.app).post('/api/password-resets').send({ email: 'wren.okoye@larkspur.test' });
    const second = linkToken(
      await latestMailTo(t.db, 'wren.okoye@larkspur.test'),
      'reset-password',
    );
    expect((await request(t.app).get(`/api/password-resets/${first}`)).status).toBe(410);
    await t
      .db('password_resets')
      .where({ token_hash: hashLinkToken(second) })
      .update({ expires_at: new Date(Date.now() - 1) });
    const late = await request(t.app)
      .post(`/api/password-resets/${second}`)
      .send({ password: 'wren-too-late-now' });
    expect(late.status).toBe(410);
    expect(late.body.error.code).toBe('link_expired');
  });

  it('sends nothing to a deactivated account and answers 400 to a bad address', async () => {
    const admin = await t.signIn('admin');
    const noor = await userId('noor.castellan@larkspur.test');
    await admin.patch(`/api/users/${noor}`).send({ active: false });
    await request(t.app)
      .post('/api/password-resets')
      .send({ email: 'noor.castellan@larkspur.test' });
    expect(await latestMailTo(t.db, 'noor.castellan@larkspur.test')).toBeUndefined();
    expect((await admin.post(`/api/users/${noor}/password-reset`)).status).toBe(409);
    const bad = await request(t.app).post('/api/password-resets').send({ email: 'nope' });
    expect(bad.status).toBe(400);
    expect(bad.body.error.details[0].path).toBe('body.email');
  });
});

describe('admin: outbox', () => {
  it('lists messages newest first and shows one with both parts', async () => {
    const admin = await t.signIn('admin');
    const list = await admin.get('/api/outbox?pageSize=5');
    expect(list.status).toBe(200);
    expect(list.body.items.length).toBeGreaterThan(0);
    expect(list.body.pageSize).toBe(5);
    const ids = list.body.items.map((m: { id: number }) => m.id);
    expect(ids).toEqual([...ids].sort((a: number, b: number) => b - a));
    const one = await admin.get(`/api/outbox/${ids[0]}`);
    expect(one.body.message).toMatchObject({
      id: ids[0],
      text: expect.stringContaining('Tensile'),
      html: expect.stringContaining('<html'),
    });
    const filtered = await admin.get('/api/outbox?to=juno.marsh@larkspur.test');
    for (const m of filtered.body.items) expect(m.to).toBe('juno.marsh@larkspur.test');
    expect((await admin.get('/api/outbox/999999')).status).toBe(404);
    expect((await admin.get('/api/outbox?pageSize=500')).status).toBe(400);
  });
});
