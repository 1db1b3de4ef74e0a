import bcrypt from 'bcryptjs';
import request from 'supertest';
import { afterAll, beforeAll, describe, expect, it, vi } from 'vitest';
import { AuthService } from './auth-service';
import { PasswordHasher } from './passwords';
import { UsersRepository } from './users-repository';
import { createTestApp, findAccount, type TestApp } from '../testing/test-app';
import { SESSION_COOKIE } from '../session';

let t: TestApp;
beforeAll(async () => {
  t = await createTestApp();
});
afterAll(async () => {
  await t.close();
});

const teacher = findAccount('teacher');

function sessionCookie(res: request.Response): string | undefined {
  const cookies = (res.headers['set-cookie'] as unknown as string[] | undefined) ?? [];
  return cookies.find((c) => c.startsWith(`${SESSION_COOKIE}=`));
}

function sessionId(cookie: string | undefined): string | undefined {
  return cookie?.split(';')[0]?.split('=')[1];
}

describe('POST /api/auth/sign-in', () => {
  it('signs in with the right password and returns only the public fields', async () => {
    const res = await request(t.app)
      .post('/api/auth/sign-in')
      .send({ email: teacher.email, password: teacher.password });
    expect(res.status).toBe(200);
    expect(res.body).toEqual({
      user: { id: expect.any(Number), email: teacher.email, name: teacher.name, role: 'teacher' },
    });
  });

  it('matches the e-mail without regard to case or spaces', async () => {
    const res = await request(t.app)
      .post('/api/auth/sign-in')
      .send({ email: `  ${teacher.email.toUpperCase()} `, password: teacher.password });
    expect(res.status).toBe(200);
    expect(res.body.user.email).toBe(teacher.email);
  });

  it('sets an HttpOnly, SameSite=Lax session cookie, not Secure over plain http', async () => {
    const res = await request(t.app)
      .post('/api/auth/sign-in')
      .send({ email: teacher.email, password: teacher.password });
    const cookie = sessionCookie(res);
    expect(cookie).toBeDefined();
    expect(cookie).toMatch(/; HttpOnly/);
    expect(cookie).toMatch(/; SameSite=Lax/);
    expect(cookie).not.toMatch(/; Secure/);
  });

  it('gives the same 401 for a wrong password and an unknown e-mail', async () => {
    const wrong = await request(t.app)
      .post('/api/auth/sign-in')
      .send({ email: teacher.email, password: 'not-the-password' });
    const unknown = await request(t.app)
      .post('/api/auth/sign-in')
      .send({ email: 'nobody@larkspur.test', password: 'whatever' });
    for (const res of [wrong, unknown]) {
      expect(res.status).toBe(401);
      expect(res.body).toEqual({
        error: { code: 'invalid_credentials', message: 'Email or password is not correct.' },
      });
      expect(sessionCookie(res)).toBeUndefined();
    }
  });

  it('refuses a disabled account with the same message', async () => {
    const student = findAccount('wren.okoye@larkspur.test');
    await t
      .db('users')
      .where({ email: student.email })
      .update({ disabled_at: new Date().toISOString() });
    try {
      const res = await request(t.app)
        .post('/api/auth/sign-in')
        .send({ email: student.email, password: student.password });
      expect(res.status).toBe(401);
      expect(res.body.error.code).toBe('invalid_credentials');
    } finally {
      await t.db('users').where({ email: student.email }).update({ disabled_at: null });
    }
  });

  it('answers missing fields with 400 and a detail per field', async () => {
    const res = await request(t.app).post('/api/auth/sign-in').send({ email: '' });
    expect(res.status).toBe(400);
    expect(res.body.error.code).toBe('validation_failed');
    expect(res.body.error.message).toMatch(/\.$/);
    const paths = (res.body.error.details as { path: string }[]).map((d) => d.path).sort();
    expect(paths).toEqual(['body.email', 'body.password']);
  });

  it('trims and lower-cases the e-mail before looking the account up', async () => {
    const lookup = vi.spyOn(UsersRepository.prototype, 'findByEmail');
    try {
      await request(t.app)
        .post('/api/auth/sign-in')
        .send({ email: '\t Tomasz.REYES@Larkspur.Test  ', password: 'not-the-password' });
      expect(lookup).toHaveBeenCalledWith('tomasz.reyes@larkspur.test');
    } finally {
      lookup.mockRestore();
    }
  });

  it('keeps accepting unknown extra fields', async () => {
    const res = await request(t.app)
      .post('/api/auth/sign-in')
      .send({ email: teacher.email, password: teacher.password, rememberMe: true });
    expect(res.status).toBe(200);
  });

  it.each([
    ['password', { email: teacher.email, password: 'p'.repeat(10_240) }, 'body.password'],
    ['e-mail', { email: `${'e'.repeat(10_240)}@larkspur.test`, password: 'x' }, 'body.email'],
  ])('answers a 10 kB %s with 400 without checking any password', async (_what, body, path) => {
    const check = vi.spyOn(AuthService.prototype, 'verifyCredentials');
    try {
      const res = await request(t.app).post('/api/auth/sign-in').send(body);
      expect(res.status).toBe(400);
      expect(res.body.error.code).toBe('validation_failed');
      expect(res.body.error.details).toEqual([{ path, message: expect.stringMatching(/at most/) }]);
      expect(check).not.toHaveBeenCalled();
      // Control: the spy does see a check of an ordinary-sized attempt.
      await request(t.app).post('/api/auth/sign-in').send({ email: teacher.email, password: 'x' });
      expect(check).toHaveBeenCalledTimes(1);
    } finally {
      check.mockRestore();
    }
  });

  it.each([
    [
      'e-mail',
      { email: `${'e'.repeat(5_000)}@larkspur.test`, password: 'x' },
      /e-mail address has at most 254 characters/,
    ],
    [
      'password',
      { email: teacher.email, password: 'p'.repeat(5_000) },
      /password has at most 200 characters/,
    ],
  ])('says how long a 5,000-character %s may be', async (_what, body, message) => {
    const res = await request(t.app).post('/api/auth/sign-in').send(body);
    expect(res.status).toBe(400);
    expect(res.body.error.message).toMatch(message);
    expect(res.body.error.message).not.toMatch(/missing|like/);
  });

  it('answers a body that is not JSON at all with 400', async () => {
    const res = await request(t.app).post('/api/auth/sign-in').type('text/plain').send('hello');
    expect(res.status).toBe(400);
    expect(res.body.error.code).toBe('validation_failed');
  });

  it('gives a new session id at sign-in (no session fixation)', async () => {
    const agent = t.agent();
    // A wrong attempt with saveUninitialized=false creates no session; force one with a first
    // sign-in, then sign in again and compare ids.
    const first = await agent
      .post('/api/auth/sign-in')
      .send({ email: teacher.email, password: teacher.password });
    const second = await agent
      .post('/api/auth/sign-in')
      .send({ email: teacher.email, password: teacher.password });
    const firstId = sessionId(sessionCookie(first));
    const secondId = sessionId(sessionCookie(second));
    expect(firstId).toBeDefined();
    expect(secondId).toBeDefined();
    expect(secondId).not.toBe(firstId);
    // The old id no longer signs anyone in.
    const stale = await request(t.app)
      .get('/api/auth/me')
      .set('Cookie', `${SESSION_COOKIE}=${firstId}`);
    expect(stale.status).toBe(401);
  });

  it('writes no password to the log', async () => {
    await request(t.app)
      .post('/api/auth/sign-in')
      .send({ email: teacher.email, password: 'leaky-secret-1' });
    expect(t.logLines.join('\n')).not.toContain('leaky-secret-1');
  });
});

describe('password hashes at sign-in', () => {
  const storedHash = async (email: string) =>
    ((await t.db('users').where({ email }).first()) as { password_hash: string }).password_hash;

  it('replaces an old bcrypt hash with scrypt at the next successful sign-in', async () => {
    const student = findAccount('noor.castellan@larkspur.test');
    await t
      .db('users')
      .where({ email: student.email })
      .update({ password_hash: await bcrypt.hash(student.password, 4) });
    const wrong = await request(t.app)
      .post('/api/auth/sign-in')
      .send({ email: student.email, password: 'not-it' });
    expect(wrong.status).toBe(401);
    expect(await storedHash(student.email)).toMatch(/^\$2[aby]\$/);

    const right = await request(t.app)
      .post('/api/auth/sign-in')
      .send({ email: student.email, password: student.password });
    expect(right.status).toBe(200);
    const upgraded = await storedHash(student.email);
    expect(upgraded).toMatch(/^\$scrypt\$ln=10,r=8,p=1\$/);
    // The new hash works, and is not replaced again.
    const again = await request(t.app)
      .post('/api/auth/sign-in')
      .send({ email: student.email, password: student.password });
    expect(again.status).toBe(200);
    expect(await storedHash(student.email)).toBe(upgraded);
  });

  it('checks one scrypt hash for an unknown e-mail too, so timing does not reveal accounts', async () => {
    const verify = vi.spyOn(PasswordHasher.prototype, 'verify');
    try {
      const res = await request(t.app)
        .post('/api/auth/sign-in')
        .send({ email: 'not-a-student@larkspur.test', password: 'anything' });
      expect(res.status).toBe(401);
      expect(verify).toHaveBeenCalledTimes(1);
      expect(verify.mock.calls[0]![1]).toMatch(/^\$scrypt\$ln=10,/);
    } finally {
      verify.mockRestore();
    }
  });
});

describe('GET /api/auth/me and POST /api/auth/sign-out', () => {
  it('answers 401 with the error shape when signed out', async () => {
    const res = await request(t.app).get('/api/auth/me');
    expect(res.status).toBe(401);
    expect(res.body).toEqual({
      error: { code: 'unauthenticated', message: 'Sign in to continue.' },
    });
  });

  it('returns the signed-in user, then 401 after sign-out', async () => {
    const agent = await t.signIn('student');
    const me = await agent.get('/api/auth/me');
    expect(me.status).toBe(200);
    expect(me.body.user).toMatchObject({ email: findAccount('student').email, role: 'student' });
    expect(Object.keys(me.body.user).sort()).toEqual(['email', 'id', 'name', 'role']);

    const out = await agent.post('/api/auth/sign-out');
    expect(out.status).toBe(204);
    expect((await agent.get('/api/auth/me')).status).toBe(401);
  });

  it('deletes the session row at sign-out', async () => {
    const before = Number((await t.db('sessions').count({ n: '*' }))[0]?.n);
    const agent = await t.signIn('admin');
    expect(Number((await t.db('sessions').count({ n: '*' }))[0]?.n)).toBe(before + 1);
    await agent.post('/api/auth/sign-out');
    expect(Number((await t.db('sessions').count({ n: '*' }))[0]?.n)).toBe(before);
  });

  it('signs out a session whose account was disabled since', async () => {
    const agent = await t.signIn('felix.abara@larkspur.test');
    await t
      .db('users')
      .where({ email: 'felix.abara@larkspur.test' })
      .update({ disabled_at: new Date().toISOString() });
    try {
      expect((await agent.get('/api/auth/me')).status).toBe(401);
    } finally {
      await t
        .db('users')
        .where({ email: 'felix.abara@larkspur.test' })
        .update({ disabled_at: null });
    }
  });

  it('answers sign-out without a session with 204', async () => {
    expect((await request(t.app).post('/api/auth/sign-out')).status).toBe(204);
  });
});

describe('cookies behind an https address', () => {
  it('marks the session cookie Secure when the proxy reports https', async () => {
    // An https address is production: the production hash cost applies.
    const secure = await createTestApp({
      env: {
        PUBLIC_URL: 'https://studio.larkspur.test',
        PASSWORD_HASH_COST: '15',
        TRUST_PROXY: 'loopback',
      },
    });
    try {
      const res = await request(secure.app)
        .post('/api/auth/sign-in')
        .set('X-Forwarded-Proto', 'https')
        .send({ email: teacher.email, password: teacher.password });
      expect(res.status).toBe(200);
      expect(sessionCookie(res)).toMatch(/; Secure/);
      expect(res.headers['strict-transport-security']).toBeDefined();
      expect(secure.logLines.join('\n')).not.toContain('plain http');
      // Straight over http (proxy bypassed): no cookie can be set, and the log says why.
      const direct = await request(secure.app)
        .post('/api/auth/sign-in')
        .send({ email: teacher.email, password: teacher.password });
      expect(sessionCookie(direct)).toBeUndefined();
      expect(secure.logLines.join('\n')).toContain('TRUST_PROXY');
    } finally {
      await secure.close();
    }
  });
});
