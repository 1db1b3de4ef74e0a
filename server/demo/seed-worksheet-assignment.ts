import type { Knex } from 'knex';
import { AssignmentsRepository } from '../assignments/assignments-repository';
import { UsersRepository, toPublicUser } from '../auth/users-repository';
import { engineGenerator } from '../drills/drill-generator';
import { DrillsRepository } from '../drills/drills-repository';
import { resolveDrillSource } from '../exports/drill-source';
import { PresetsRepository } from '../presets/presets-repository';
import { WorksheetsRepository } from '../worksheets/worksheets-repository';

const TEACHER = 'tomasz.reyes@larkspur.test';
const STUDENT = 'juno.marsh@larkspur.test';
const DAY_MS = 86_400_000;

/**
 * Assigns the demo teacher's first worksheet to one of his students, with two weeks of invented
 * practice on each of its drills, so a worksheet assignment shows in the studio and on the
 * student's home. Runs only while no worksheet assignment exists, after the studio and the
 * worksheets are seeded; the history is a fixed pattern counted back from `now`.
 */
export async function seedDemoWorksheetAssignment(
  db: Knex,
  now: Date = new Date(),
): Promise<number> {
  if (await db('assignments').where({ kind: 'worksheet' }).first()) return 0;
  const users = new UsersRepository(db);
  const [teacher, student] = [await users.findByEmail(TEACHER), await users.findByEmail(STUDENT)];
  if (!teacher || !student) return 0;
  const linked = await db('studio_students')
    .where({ teacher_id: teacher.id, student_id: student.id })
    .first();
  const first = await db('worksheets').where({ owner_id: teacher.id }).orderBy('id').first();
  if (!linked || !first) return 0;
  const sheet = await new WorksheetsRepository(db).find(Number(teacher.id), Number(first.id));
  if (!sheet || sheet.items.length === 0) return 0;
  const sources = {
    presets: new PresetsRepository(db),
    drills: new DrillsRepository(db),
    generate: engineGenerator,
  };
  const drills = [];
  for (const item of sheet.items) {
    const resolved = await resolveDrillSource(sources, toPublicUser(teacher), item.source);
    const seed = item.source.kind === 'preset' ? ` (seed ${item.source.seed})` : '';
    drills.push({ title: `${resolved.title}${seed}`, drill: resolved.drill, ladder: item.ladder });
  }
  const repo = new AssignmentsRepository(db);
  const id = await repo.create({
    teacherId: Number(teacher.id),
    kind: 'worksheet',
    drillId: null,
    worksheetId: sheet.id,
    drills,
    createdAt: new Date(now.getTime() - 14 * DAY_MS),
    title: sheet.title,
    dueDate: new Date(now.getTime() + 5 * DAY_MS).toISOString().slice(0, 10),
    // The whole sheet's span: best tempo and status are counted per assignment, over its drills.
    startTempo: Math.min(...drills.map((d) => d.ladder.start)),
    targetTempo: Math.max(...drills.map((d) => d.ladder.target)),
    note: 'One drill a day, in order; log each one.',
    studentIds: [Number(student.id)],
  });
  const stored = await repo.drills([id]);
  const logs: Record<string, unknown>[] = [];
  for (let day = 13; day >= 1; day -= 1) {
    if (day % 3 === 0) continue; // a rest day in three
    // Drills in turn, one a practice day.
    const drill = stored[logs.length % stored.length]!;
    const week = day > 7 ? 0 : 1;
    logs.push({
      student_id: student.id,
      assignment_id: id,
      assignment_drill_id: drill.id,
      minutes: 10 + (day % 2) * 5,
      tempo: drill.ladder.start + week * 4 + (day % 2) * 2,
      rating: 3 + (day % 2),
      note: day % 4 === 0 ? 'Two clean passes in a row at the end.' : '',
      practised_at: new Date(
        now.getTime() - day * DAY_MS + 18 * 3_600_000 - (now.getTime() % DAY_MS),
      ),
    });
  }
  await db('practice_logs').insert(logs);
  return 1;
}
