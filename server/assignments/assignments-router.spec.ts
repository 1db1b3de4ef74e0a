import request from 'supertest';
import { afterAll, beforeAll, describe, expect, it } from 'vitest';
import { seedDemoAuthoring } from '../demo/seed-authoring';
import { seedDemoStudio } from '../demo/seed-studio';
import { latestMailTo } from '../mail/outbox-reader';
import { createTestApp, type TestApp } from '../testing/test-app';

let t: TestApp;
let tomaszDrill: number;
let hanaDrill: number;
const ids: Record<string, number> = {};

beforeAll(async () => {
  t = await createTestApp();
  await seedDemoAuthoring(t.db);
  const now = new Date();
  await seedDemoStudio(t.db, now);
  for (const u of await t.db('users').select('id', 'email')) ids[u.email] = Number(u.id);
  const drill = async (email: string) =>
    Number((await t.db('saved_drills').where({ owner_id: ids[email] }).first()).id);
  tomaszDrill = await drill('tomasz.reyes@larkspur.test');
  hanaDrill = await drill('hana.lindqvist@larkspur.test');
});
afterAll(async () => {
  await t.close();
});

const JUNO = 'juno.marsh@larkspur.test';
const FELIX = 'felix.abara@larkspur.test';
const WREN = 'wren.okoye@larkspur.test';

function dayFromNow(days: number): string {
  return new Date(Date.now() + days * 86_400_000).toISOString().slice(0, 10);
}

async function assign(studentIds: number[], extra: Record<string, unknown> = {}) {
  const teacher = await t.signIn('teacher');
  return teacher.post('/api/assignments').send({
    drillId: tomaszDrill,
    studentIds,
    dueDate: dayFromNow(7),
    startTempo: 60,
    targetTempo: 90,
    note: 'Slow and relaxed.',
    ...extra,
  });
}

describe('assigning a saved drill (POST /api/assignments)', () => {
  it('assigns to the teacher’s students, e-mails each one, and starts as not started', async () => {
    const res = await assign([ids[JUNO]!, ids[FELIX]!]);
    expect(res.status).toBe(201);
    expect(res.body.assignment).toMatchObject({
      drillId: tomaszDrill,
      startTempo: 60,
      targetTempo: 90,
      note: 'Slow and relaxed.',
      noticesSent: 2,
    });
    expect(res.body.assignment.students.map((s: { status: string }) => s.status)).toEqual([
      'not_started',
      'not_started',
    ]);
    const mail = await latestMailTo(t.db, FELIX);
    expect(mail?.subject).toMatch(/^New assignment: /);
    expect(mail?.text).toContain(`/assignments/${res.body.assignment.id}`);
  });

  it('answers 400 with field paths', async () => {
    const res = await assign([], { dueDate: '2026-02-30', startTempo: 10, targetTempo: 'fast' });
    expect(res.status).toBe(400);
    expect(res.body.error.details.map((d: { path: string }) => d.path).sort()).toEqual([
      'body.dueDate',
      'body.startTempo',
      'body.studentIds',
      'body.targetTempo',
    ]);
    const slower = await assign([ids[JUNO]!], { startTempo: 100, targetTempo: 90 });
    expect(slower.body.error.details).toEqual([
      { path: 'body.targetTempo', message: 'The target tempo is at least the start tempo.' },
    ]);
  });

  it('answers 404 for another teacher’s student or drill', async () => {
    const stranger = await assign([ids[JUNO]!, ids[WREN]!]);
    expect(stranger.status).toBe(404);
    expect(stranger.body.error.details).toEqual([
      { path: 'body.studentIds.1', message: 'No student with this id in your studio.' },
    ]);
    const theirDrill = await assign([ids[JUNO]!], { drillId: hanaDrill });
    expect(theirDrill.status).toBe(404);
    expect(theirDrill.body.error.details[0].path).toBe('body.drillId');
  });

  it('answers 403 to students and admins, 401 signed out', async () => {
    for (const role of ['student', 'admin']) {
      const agent = await t.signIn(role);
      expect((await agent.get('/api/assignments')).status).toBe(403);
      expect((await agent.post('/api/assignments').send({})).status).toBe(403);
    }
    expect((await request(t.app).get('/api/assignments/mine')).status).toBe(401);
    const teacher = await t.signIn('teacher');
    expect((await teacher.get('/api/assignments/mine')).status).toBe(403);
  });
});

describe('reading assignments', () => {
  it('lists a teacher’s own only; another teacher gets 404 on it', async () => {
    const created = (await assign([ids[JUNO]!])).body.assignment;
    const tomasz = await t.signIn('teacher');
    const list = await tomasz.get('/api/assignments?pageSize=100');
    expect(list.body.items.map((a: { id: number }) => a.id)).toContain(created.id);
    const hana = await t.signIn('hana.lindqvist@larkspur.test');
    const theirs = await hana.get('/api/assignments?pageSize=100');
    expect(theirs.body.items.map((a: { id: number }) => a.id)).not.toContain(created.id);
    expect((await hana.get(`/api/assignments/${created.id}`)).status).toBe(404);
    expect((await hana.delete(`/api/assignments/${created.id}`)).status).toBe(404);
  });

  it('gives a student their own, due soonest first, with the drill; others’ answer 404', async () => {
    const later = (await assign([ids[JUNO]!], { dueDate: dayFromNow(30) })).body.assignment;
    const sooner = (await assign([ids[JUNO]!], { dueDate: dayFromNow(1) })).body.assignment;
    const juno = await t.signIn(JUNO);
    const mine = (await juno.get('/api/assignments/mine')).body.assignments as {
      id: number;
      dueDate: string;
    }[];
    const dues = mine.map((a) => a.dueDate);
    expect(dues).toEqual([...dues].sort());
    expect(mine.findIndex((a) => a.id === sooner.id)).toBeLessThan(
      mine.findIndex((a) => a.id === later.id),
    );
    const one = await juno.get(`/api/assignments/${sooner.id}`);
    expect(one.body.assignment).toMatchObject({
      status: 'not_started',
      bestTempo: null,
      targetTempo: 90,
    });
    expect(one.body.assignment.drill.bars.length).toBeGreaterThan(0);
    const felix = await t.signIn(FELIX);
    expect((await felix.get(`/api/assignments/${sooner.id}`)).status).toBe(404);
  });
});

describe('practice logs and status', () => {
  it('moves a student from practising to target reached; overdue when late', async () => {
    const a = (await assign([ids[JUNO]!, ids[FELIX]!])).body.assignment;
    const juno = await t.signIn(JUNO);
    const first = await juno
      .post('/api/practice/logs')
      .send({ assignmentId: a.id, minutes: 20, tempo: 72, rating: 3, note: 'Steady.' });
    expect(first.status).toBe(201);
    expect(first.body.log).toMatchObject({ minutes: 20, tempo: 72, rating: 3, note: 'Steady.' });
    const teacher = await t.signIn('teacher');
    let status = (await teacher.get(`/api/assignments/${a.id}`)).body.assignment.students;
    expect(status.find((s: { id: number }) => s.id === ids[JUNO]).status).toBe('practising');
    await juno
      .post('/api/practice/logs')
      .send({ assignmentId: a.id, minutes: 15, tempo: 92, rating: 4 });
    status = (await teacher.get(`/api/assignments/${a.id}`)).body.assignment.students;
    expect(status.find((s: { id: number }) => s.id === ids[JUNO])).toMatchObject({
      status: 'target_reached',
      bestTempo: 92,
      logs: 2,
      minutes: 35,
    });
    await t
      .db('assignments')
      .where({ id: a.id })
      .update({ due_date: dayFromNow(-1) });
    status = (await teacher.get(`/api/assignments/${a.id}`)).body.assignment.students;
    expect(status.find((s: { id: number }) => s.id === ids[FELIX]).status).toBe('overdue');
    expect(status.find((s: { id: number }) => s.id === ids[JUNO]).status).toBe('target_reached');

    const mine = (await juno.get('/api/assignments/mine')).body.assignments;
    expect(mine.find((x: { id: number }) => x.id === a.id)).toMatchObject({ bestTempo: 92 });
  });

  it('validates a log with field paths; 404 for an assignment not theirs', async () => {
    const juno = await t.signIn(JUNO);
    const bad = await juno
      .post('/api/practice/logs')
      .send({ minutes: 0, tempo: 400, rating: 6, note: 3 });
    expect(bad.status).toBe(400);
    expect(bad.body.error.details.map((d: { path: string }) => d.path).sort()).toEqual([
      'body.minutes',
      'body.note',
      'body.rating',
      'body.tempo',
    ]);
    const wren = await t.signIn(WREN);
    const a = (await assign([ids[JUNO]!])).body.assignment;
    const other = await wren
      .post('/api/practice/logs')
      .send({ assignmentId: a.id, minutes: 5, tempo: 60, rating: 2 });
    expect(other.status).toBe(404);
    expect(other.body.error.details[0].path).toBe('body.assignmentId');
    const teacher = await t.signIn('teacher');
    expect(
      (await teacher.post('/api/practice/logs').send({ minutes: 5, tempo: 60, rating: 2 })).status,
    ).toBe(403);
  });

  it('keeps each student’s logs their own (404), and a teacher reads only their studio’s', async () => {
    const juno = await t.signIn(JUNO);
    const log = (await juno.post('/api/practice/logs').send({ minutes: 10, tempo: 70, rating: 2 }))
      .body.log;
    const felix = await t.signIn(FELIX);
    expect((await felix.get(`/api/practice/logs/${log.id}`)).status).toBe(404);
    expect((await felix.get(`/api/practice/logs?studentId=${ids[JUNO]}`)).status).toBe(404);
    expect((await felix.get(`/api/practice/progress?studentId=${ids[JUNO]}`)).status).toBe(404);
    expect((await juno.get(`/api/practice/logs/${log.id}`)).body.log.id).toBe(log.id);
    const own = await juno.get('/api/practice/logs?pageSize=2');
    expect(own.body.items).toHaveLength(2);
    expect(own.body.total).toBeGreaterThan(2);

    const tomasz = await t.signIn('teacher');
    expect((await tomasz.get(`/api/practice/logs/${log.id}`)).status).toBe(200);
    const list = await tomasz.get(`/api/practice/logs?studentId=${ids[JUNO]}`);
    expect(list.body.items[0].id).toBe(log.id);
    const noStudent = await tomasz.get('/api/practice/logs');
    expect(noStudent.status).toBe(400);
    expect(noStudent.body.error.details[0].path).toBe('query.studentId');
    const hana = await t.signIn('hana.lindqvist@larkspur.test');
    expect((await hana.get(`/api/practice/logs/${log.id}`)).status).toBe(404);
    expect((await hana.get(`/api/practice/logs?studentId=${ids[JUNO]}`)).status).toBe(404);
    expect((await hana.get(`/api/practice/progress?studentId=${ids[JUNO]}`)).status).toBe(404);
    const admin = await t.signIn('admin');
    expect((await admin.get('/api/practice/logs')).status).toBe(403);
  });

  it('gives chart data from the demo history: tempo over time and minutes per week', async () => {
    const tomasz = await t.signIn('teacher');
    const progress = (await tomasz.get(`/api/practice/progress?studentId=${ids[FELIX]}`)).body
      .progress;
    expect(progress.tempo.length).toBeGreaterThan(20);
    const times = progress.tempo.map((p: { practisedAt: string }) => p.practisedAt);
    expect(times).toEqual([...times].sort());
    expect(progress.minutesPerWeek.length).toBeGreaterThanOrEqual(6);
    const total = progress.minutesPerWeek.reduce(
      (n: number, w: { minutes: number }) => n + w.minutes,
      0,
    );
    const logs = await t
      .db('practice_logs')
      .where({ student_id: ids[FELIX] })
      .sum({ m: 'minutes' });
    expect(total).toBe(Number(logs[0]!.m));

    const demo = (await tomasz.get('/api/assignments?pageSize=100')).body.items.find(
      (a: { note: string }) => a.note.startsWith('Keep the ghost notes'),
    );
    const byAssignment = await tomasz.get(`/api/practice/progress?assignmentId=${demo.id}`);
    const students = new Set(
      byAssignment.body.progress.tempo.map((p: { studentId: number }) => p.studentId),
    );
    expect(students.size).toBe(3);
    const hana = await t.signIn('hana.lindqvist@larkspur.test');
    expect((await hana.get(`/api/practice/progress?assignmentId=${demo.id}`)).status).toBe(404);
  });

  it('shows the demo roster with last practice, open assignments and a streak', async () => {
    const tomasz = await t.signIn('teacher');
    const roster = (await tomasz.get('/api/studio/students')).body.students as {
      name: string;
      lastPractice: string | null;
      openAssignments: number;
      streak: number;
      status: string;
    }[];
    expect(roster.map((s) => s.name)).toEqual(['Felix Abara', 'Juno Marsh', 'Noor Castellan']);
    for (const s of roster) {
      expect(s.status).toBe('active');
      expect(s.lastPractice).not.toBeNull();
      expect(s.openAssignments).toBeGreaterThanOrEqual(0);
      expect(s.streak).toBeGreaterThanOrEqual(0);
    }
    // Juno logged today in the tests above: her streak counts today.
    expect(roster.find((s) => s.name === 'Juno Marsh')!.streak).toBeGreaterThanOrEqual(1);
  });

  it('deletes an assignment; its logs stay with the student', async () => {
    const a = (await assign([ids[JUNO]!])).body.assignment;
    const juno = await t.signIn(JUNO);
    const log = (
      await juno
        .post('/api/practice/logs')
        .send({ assignmentId: a.id, minutes: 5, tempo: 61, rating: 1 })
    ).body.log;
    const tomasz = await t.signIn('teacher');
    expect((await tomasz.delete(`/api/assignments/${a.id}`)).status).toBe(204);
    expect((await juno.get(`/api/assignments/${a.id}`)).status).toBe(404);
    expect((await juno.get(`/api/practice/logs/${log.id}`)).body.log.assignmentId).toBeNull();
  });
});
