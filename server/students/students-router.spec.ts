import request from 'supertest';
import { afterAll, beforeAll, describe, expect, it } from 'vitest';
import type { PublicUser } from '../auth/roles';
import { createTestApp, type TestApp } from '../testing/test-app';
import { seedDemoStudio } from '../demo/seed-studio';
import { StudentsService } from './students-service';

let t: TestApp;
beforeAll(async () => {
  t = await createTestApp();
  await seedDemoStudio(t.db);
});
afterAll(async () => {
  await t.close();
});

/** The four demo students, as a teacher's list should show them: by name. */
const DEMO_STUDENTS = [
  { name: 'Felix Abara', email: 'felix.abara@larkspur.test' },
  { name: 'Juno Marsh', email: 'juno.marsh@larkspur.test' },
  { name: 'Noor Castellan', email: 'noor.castellan@larkspur.test' },
  { name: 'Wren Okoye', email: 'wren.okoye@larkspur.test' },
];

/** The demo studios: Tomasz teaches three of them, Hana one. */
const STUDIO_OF: Record<string, string[]> = {
  'tomasz.reyes@larkspur.test': ['Felix Abara', 'Juno Marsh', 'Noor Castellan'],
  'hana.lindqvist@larkspur.test': ['Wren Okoye'],
  'imogen.vale@larkspur.test': DEMO_STUDENTS.map((s) => s.name),
};

describe('GET /api/students (teachers and admins)', () => {
  it.each(Object.keys(STUDIO_OF))(
    'lists %s their own active students (an admin: all), by name, id/name/email only',
    async (who) => {
      const agent = await t.signIn(who);
      const res = await agent.get('/api/students');
      expect(res.status).toBe(200);
      expect(res.body).toEqual({
        students: DEMO_STUDENTS.filter((s) => STUDIO_OF[who]!.includes(s.name)).map((s) => ({
          id: expect.any(Number),
          ...s,
        })),
      });
      for (const student of res.body.students as object[])
        expect(Object.keys(student).sort()).toEqual(['email', 'id', 'name']);
    },
  );

  it('answers 403 with the error shape for a student, listing no one', async () => {
    const agent = await t.signIn('student');
    const res = await agent.get('/api/students');
    expect(res.status).toBe(403);
    expect(res.body).toEqual({
      error: { code: 'forbidden', message: 'Only teachers and admins can do this.' },
    });
  });

  it('answers 401 when signed out', async () => {
    const res = await request(t.app).get('/api/students');
    expect(res.status).toBe(401);
    expect(res.body).toEqual({
      error: { code: 'unauthenticated', message: 'Sign in to continue.' },
    });
  });

  it('leaves out a disabled student', async () => {
    const teacher = await t.signIn('teacher');
    await t
      .db('users')
      .where({ email: 'noor.castellan@larkspur.test' })
      .update({ disabled_at: new Date().toISOString() });
    try {
      const res = await teacher.get('/api/students');
      expect(res.status).toBe(200);
      expect((res.body.students as { email: string }[]).map((s) => s.email)).toEqual([
        'felix.abara@larkspur.test',
        'juno.marsh@larkspur.test',
      ]);
    } finally {
      await t
        .db('users')
        .where({ email: 'noor.castellan@larkspur.test' })
        .update({ disabled_at: null });
    }
  });
});

describe('StudentsService', () => {
  it('sorts names as read, ignoring case and accents, then by id', async () => {
    const rows: PublicUser[] = [
      { id: 4, name: 'Zola Finch', email: 'zola.finch@larkspur.test', role: 'student' },
      { id: 3, name: 'de Vries Ana', email: 'ana.devries@larkspur.test', role: 'student' },
      { id: 2, name: 'Élan Moss', email: 'elan.moss@larkspur.test', role: 'student' },
      { id: 1, name: 'Élan Moss', email: 'elan.moss2@larkspur.test', role: 'student' },
    ];
    const service = new StudentsService(
      { listActiveByRole: async () => rows },
      { activeStudents: async () => [] },
    );
    const admin = { id: 9, name: 'Admin', email: 'a@larkspur.test', role: 'admin' } as const;
    const names = (await service.listStudents(admin)).map((s) => `${s.name}#${s.id}`);
    expect(names).toEqual(['de Vries Ana#3', 'Élan Moss#1', 'Élan Moss#2', 'Zola Finch#4']);
  });
});
