import { mkdtemp, rm, writeFile } from 'node:fs/promises';
import os from 'node:os';
import path from 'node:path';
import request from 'supertest';
import { afterAll, beforeAll, describe, expect, it } from 'vitest';
import { findBuiltInPreset } from '../../shared/generator/presets/index';
import { createTestApp, type TestApp } from '../testing/test-app';

let t: TestApp;
let dist: string;
beforeAll(async () => {
  // A stand-in build, so the page route can be checked without running `ng build`.
  dist = await mkdtemp(path.join(os.tmpdir(), 'tensile-dist-'));
  await writeFile(path.join(dist, 'index.html'), '<!doctype html><title>Tensile app shell</title>');
  t = await createTestApp({ deps: { browserDist: dist } });
});
afterAll(async () => {
  await t.close();
  await rm(dist, { recursive: true, force: true });
});

async function savedDrill(agent: request.Agent) {
  const res = await agent.post('/api/drills').send({
    title: 'Quintuplet study',
    card: findBuiltInPreset('quintuplets-hihat-1-3-5')!.card,
    seed: 'share-me',
  });
  expect(res.status).toBe(201);
  return res.body.drill as { id: number; snapshot: unknown; card: unknown };
}

describe('seed links', () => {
  it('shares a drill with an unguessable code, opens it signed out, counts views and revokes it', async () => {
    const teacher = await t.signIn('tomasz.reyes@larkspur.test');
    const drill = await savedDrill(teacher);

    const shared = await teacher.post(`/api/drills/${drill.id}/share`);
    expect(shared.status).toBe(201);
    const link = shared.body.link as { code: string; url: string; views: number; revokedAt: null };
    // 16 random bytes in base64url: 22 characters of [A-Za-z0-9_-], 128 bits.
    expect(link.code).toMatch(/^[A-Za-z0-9_-]{22}$/);
    expect(link).toMatchObject({ url: `/s/${link.code}`, views: 0, revokedAt: null });
    expect(new Date((shared.body.link as { createdAt: string }).createdAt).getTime()).not.toBeNaN();

    // Sharing again returns the live link as it is.
    const again = await teacher.post(`/api/drills/${drill.id}/share`);
    expect(again.status).toBe(200);
    expect(again.body.link.code).toBe(link.code);

    const anonymous = request(t.app);
    for (let i = 0; i < 3; i += 1) {
      const open = await anonymous.get(`/api/seed-links/${link.code}`);
      expect(open.status).toBe(200);
      expect(open.body).toEqual({
        drill: {
          title: 'Quintuplet study',
          snapshot: drill.snapshot,
          card: drill.card,
          teacherName: 'Tomasz Reyes',
        },
      });
      // No session is started for an anonymous visitor.
      expect(open.headers['set-cookie']).toBeUndefined();
    }
    // Signed in as someone else works too.
    const student = await t.signIn('student');
    expect((await student.get(`/api/seed-links/${link.code}`)).status).toBe(200);

    const counted = await teacher.get(`/api/drills/${drill.id}`);
    expect(counted.body.drill.shareLink).toMatchObject({
      code: link.code,
      views: 4,
      revokedAt: null,
    });

    expect((await teacher.delete(`/api/drills/${drill.id}/share`)).status).toBe(204);
    const gone = await anonymous.get(`/api/seed-links/${link.code}`);
    expect(gone.status).toBe(410);
    expect(gone.body.error).toEqual({
      code: 'withdrawn',
      message: 'The teacher has withdrawn this drill.',
    });
    const after = await teacher.get(`/api/drills/${drill.id}`);
    expect(after.body.drill.shareLink.views).toBe(4);
    expect(after.body.drill.shareLink.revokedAt).not.toBeNull();

    // Sharing after a revocation makes a new code; the old one stays withdrawn.
    const renewed = await teacher.post(`/api/drills/${drill.id}/share`);
    expect(renewed.status).toBe(201);
    expect(renewed.body.link.code).not.toBe(link.code);
    expect((await anonymous.get(`/api/seed-links/${link.code}`)).status).toBe(410);
    expect((await anonymous.get(`/api/seed-links/${renewed.body.link.code}`)).status).toBe(200);
  });

  it('gives every link its own code', async () => {
    const teacher = await t.signIn('teacher');
    const codes = new Set<string>();
    for (let i = 0; i < 5; i += 1) {
      const drill = await savedDrill(teacher);
      codes.add((await teacher.post(`/api/drills/${drill.id}/share`)).body.link.code);
    }
    expect(codes.size).toBe(5);
  });

  it('answers 404 for an unknown code and 400 for a malformed one', async () => {
    const res = await request(t.app).get('/api/seed-links/AAAAAAAAAAAAAAAAAAAAAA');
    expect(res.status).toBe(404);
    expect((await request(t.app).get('/api/seed-links/short')).status).toBe(400);
    expect((await request(t.app).get('/api/seed-links/has%20space%20in%20it-xx')).status).toBe(400);
  });

  it('answers 410 withdrawn for every link of a deleted drill, live or revoked before', async () => {
    const teacher = await t.signIn('teacher');
    const drill = await savedDrill(teacher);
    const first = (await teacher.post(`/api/drills/${drill.id}/share`)).body.link.code as string;
    expect((await teacher.delete(`/api/drills/${drill.id}/share`)).status).toBe(204);
    const live = (await teacher.post(`/api/drills/${drill.id}/share`)).body.link.code as string;
    const other = await savedDrill(teacher);
    const kept = (await teacher.post(`/api/drills/${other.id}/share`)).body.link.code as string;

    expect((await teacher.delete(`/api/drills/${drill.id}`)).status).toBe(204);
    for (const code of [first, live]) {
      const gone = await request(t.app).get(`/api/seed-links/${code}`);
      expect(gone.status).toBe(410);
      expect(gone.body.error).toEqual({
        code: 'withdrawn',
        message: 'The teacher has withdrawn this drill.',
      });
    }
    // Only that drill's links: another drill's link still opens, an unknown code is still 404.
    expect((await request(t.app).get(`/api/seed-links/${kept}`)).status).toBe(200);
    expect((await request(t.app).get('/api/seed-links/BBBBBBBBBBBBBBBBBBBBBB')).status).toBe(404);
  });

  it('serves the app shell for the /s/<code> page, signed out', async () => {
    const res = await request(t.app).get('/s/AAAAAAAAAAAAAAAAAAAAAA');
    expect(res.status).toBe(200);
    expect(res.text).toContain('Tensile app shell');
  });
});
