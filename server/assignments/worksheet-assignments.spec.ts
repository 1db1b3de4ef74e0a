import type request from 'supertest';
import { afterAll, beforeAll, describe, expect, it } from 'vitest';
import { seedDemoAuthoring } from '../demo/seed-authoring';
import { seedDemoStudio } from '../demo/seed-studio';
import { latestMailTo } from '../mail/outbox-reader';
import { createTestApp, type TestApp } from '../testing/test-app';

let t: TestApp;
const ids: Record<string, number> = {};
const TOMASZ = 'tomasz.reyes@larkspur.test';
const HANA = 'hana.lindqvist@larkspur.test';
const JUNO = 'juno.marsh@larkspur.test';
const FELIX = 'felix.abara@larkspur.test';
const WREN = 'wren.okoye@larkspur.test';

beforeAll(async () => {
  t = await createTestApp();
  await seedDemoAuthoring(t.db);
  await seedDemoStudio(t.db, new Date());
  for (const u of await t.db('users').select('id', 'email')) ids[u.email] = Number(u.id);
});
afterAll(async () => {
  await t.close();
});

function dayFromNow(days: number): string {
  return new Date(Date.now() + days * 86_400_000).toISOString().slice(0, 10);
}

/** A worksheet of one of the teacher's saved drills and a preset at a seed. */
async function worksheetOf(agent: request.Agent, email: string, title: string): Promise<number> {
  const drill = await t.db('saved_drills').where({ owner_id: ids[email] }).orderBy('id').first();
  const res = await agent.post('/api/worksheets').send({
    title,
    items: [
      {
        source: { kind: 'saved', drillId: Number(drill.id) },
        ladder: { start: 60, target: 84, step: 8 },
      },
      { source: { kind: 'preset', presetId: 'four-over-three', seed: 'lesson-2' } },
    ],
  });
  expect(res.status, JSON.stringify(res.body)).toBe(201);
  return res.body.worksheet.id as number;
}

function assignSheet(agent: request.Agent, worksheetId: number, studentIds: number[]) {
  return agent.post('/api/assignments').send({
    worksheetId,
    studentIds,
    dueDate: dayFromNow(7),
    startTempo: 60,
    targetTempo: 90,
    note: 'One drill a day.',
  });
}

describe('assigning a worksheet', () => {
  it('copies its drills in order; the student sees each drill and logs each', async () => {
    const tomasz = await t.signIn(TOMASZ);
    const sheet = await worksheetOf(tomasz, TOMASZ, 'Week 3 sheet');
    const res = await assignSheet(tomasz, sheet, [ids[JUNO]!, ids[FELIX]!]);
    expect(res.status, JSON.stringify(res.body)).toBe(201);
    const a = res.body.assignment;
    expect(a).toMatchObject({
      kind: 'worksheet',
      worksheetId: sheet,
      drillId: null,
      title: 'Week 3 sheet',
      noticesSent: 2,
    });
    expect(a.drills).toHaveLength(2);
    expect(a.drills[0]).toMatchObject({ position: 0, ladder: { start: 60, target: 84 } });
    expect(a.drills[1].title).toContain('(seed lesson-2)');
    expect((await latestMailTo(t.db, JUNO))?.text).toContain(`/assignments/${a.id}`);

    // Editing the worksheet later does not change what was assigned.
    expect((await tomasz.put(`/api/worksheets/${sheet}`).send({ title: 'Renamed' })).status).toBe(
      200,
    );

    const juno = await t.signIn(JUNO);
    const mine = (await juno.get(`/api/assignments/${a.id}`)).body.assignment;
    expect(mine.title).toBe('Week 3 sheet');
    expect(mine.drill).toBeNull();
    expect(mine.drills.map((d: { id: number }) => d.id)).toEqual(
      a.drills.map((d: { id: number }) => d.id),
    );
    for (const d of mine.drills) {
      expect(d.drill.bars.length).toBeGreaterThan(0);
      expect(d).toMatchObject({ bestTempo: null, logs: 0 });
    }
    const [first, second] = mine.drills as { id: number }[];
    const log = (body: Record<string, unknown>) =>
      juno.post('/api/practice/logs').send({ assignmentId: a.id, minutes: 10, rating: 3, ...body });
    const logged = await log({ assignmentDrillId: first!.id, tempo: 70 });
    expect(logged.status).toBe(201);
    expect(logged.body.log.assignmentDrillId).toBe(first!.id);
    expect((await log({ assignmentDrillId: second!.id, tempo: 64 })).status).toBe(201);
    expect((await log({ assignmentDrillId: second!.id, tempo: 66 })).status).toBe(201);

    const after = (await juno.get(`/api/assignments/${a.id}`)).body.assignment;
    expect(
      after.drills.map((d: { bestTempo: number; logs: number }) => [d.bestTempo, d.logs]),
    ).toEqual([
      [70, 1],
      [66, 2],
    ]);
    // Status and best tempo stay per assignment: the best over all its drills.
    expect(after).toMatchObject({ status: 'practising', bestTempo: 70, logs: 3 });
    const seen = (await tomasz.get(`/api/assignments/${a.id}`)).body.assignment.students;
    expect(seen.find((s: { id: number }) => s.id === ids[JUNO])).toMatchObject({
      status: 'practising',
      bestTempo: 70,
      logs: 3,
      minutes: 30,
    });
    expect(seen.find((s: { id: number }) => s.id === ids[FELIX]).status).toBe('not_started');
  });

  it('requires the drill of a worksheet assignment, one of its own, and refuses it elsewhere', async () => {
    const tomasz = await t.signIn(TOMASZ);
    const sheet = await worksheetOf(tomasz, TOMASZ, 'Drill ids');
    const a = (await assignSheet(tomasz, sheet, [ids[JUNO]!])).body.assignment;
    const other = (await assignSheet(tomasz, sheet, [ids[JUNO]!])).body.assignment;
    const juno = await t.signIn(JUNO);
    const log = (body: Record<string, unknown>) =>
      juno.post('/api/practice/logs').send({ minutes: 10, tempo: 70, rating: 3, ...body });
    const missing = await log({ assignmentId: a.id });
    expect(missing.status).toBe(400);
    expect(missing.body.error.details[0].path).toBe('body.assignmentDrillId');
    const foreign = await log({ assignmentId: a.id, assignmentDrillId: other.drills[0].id });
    expect(foreign.status).toBe(404);
    expect(foreign.body.error.details[0].path).toBe('body.assignmentDrillId');
    const loose = await log({ assignmentDrillId: a.drills[0].id });
    expect(loose.status).toBe(400);
    const drillAssignment = await tomasz.post('/api/assignments').send({
      drillId: Number((await t.db('saved_drills').where({ owner_id: ids[TOMASZ] }).first()).id),
      studentIds: [ids[JUNO]],
      dueDate: dayFromNow(3),
      startTempo: 60,
      targetTempo: 80,
    });
    const single = await log({
      assignmentId: drillAssignment.body.assignment.id,
      assignmentDrillId: a.drills[0].id,
    });
    expect(single.status).toBe(400);
    expect(single.body.error.details[0].path).toBe('body.assignmentDrillId');
  });

  it('answers 404 for another teacher’s worksheet or student, 400 for both or neither', async () => {
    const hana = await t.signIn(HANA);
    const hanaSheet = await worksheetOf(hana, HANA, 'Hana’s sheet');
    const tomasz = await t.signIn(TOMASZ);
    const theirs = await assignSheet(tomasz, hanaSheet, [ids[JUNO]!]);
    expect(theirs.status).toBe(404);
    expect(theirs.body.error.details[0].path).toBe('body.worksheetId');
    const mine = await worksheetOf(tomasz, TOMASZ, 'Mine');
    const stranger = await assignSheet(tomasz, mine, [ids[WREN]!]);
    expect(stranger.status).toBe(404);
    expect(stranger.body.error.details[0].path).toBe('body.studentIds.0');
    const both = await tomasz.post('/api/assignments').send({
      worksheetId: mine,
      drillId: 1,
      studentIds: [ids[JUNO]],
      dueDate: dayFromNow(3),
      startTempo: 60,
      targetTempo: 80,
    });
    expect(both.status).toBe(400);
    expect(both.body.error.details[0].path).toBe('body.drillId');
    const neither = await tomasz.post('/api/assignments').send({
      studentIds: [ids[JUNO]],
      dueDate: dayFromNow(3),
      startTempo: 60,
      targetTempo: 80,
    });
    expect(neither.status).toBe(400);
    // Nothing was stored by the refused requests.
    expect(await t.db('assignments').where({ worksheet_id: hanaSheet }).first()).toBeUndefined();
  });

  it('refuses an empty worksheet with 409', async () => {
    const tomasz = await t.signIn(TOMASZ);
    const empty = await tomasz.post('/api/worksheets').send({ title: 'Empty', items: [] });
    expect(empty.status).toBe(201);
    const res = await assignSheet(tomasz, empty.body.worksheet.id, [ids[JUNO]!]);
    expect(res.status).toBe(409);
    expect(res.body.error.code).toBe('empty_worksheet');
  });

  it('keeps the assignment when the worksheet is deleted', async () => {
    const tomasz = await t.signIn(TOMASZ);
    const sheet = await worksheetOf(tomasz, TOMASZ, 'Short-lived');
    const a = (await assignSheet(tomasz, sheet, [ids[JUNO]!])).body.assignment;
    expect((await tomasz.delete(`/api/worksheets/${sheet}`)).status).toBe(204);
    const juno = await t.signIn(JUNO);
    const mine = (await juno.get(`/api/assignments/${a.id}`)).body.assignment;
    expect(mine).toMatchObject({ kind: 'worksheet', worksheetId: null });
    expect(mine.drills).toHaveLength(2);
  });
});
