import type { Knex } from 'knex';
import { UsersRepository } from '../auth/users-repository';

/** Who teaches whom in the demo school. */
const DEMO_STUDIOS: readonly { teacher: string; students: readonly string[] }[] = [
  {
    teacher: 'tomasz.reyes@larkspur.test',
    students: [
      'juno.marsh@larkspur.test',
      'felix.abara@larkspur.test',
      'noor.castellan@larkspur.test',
    ],
  },
  { teacher: 'hana.lindqvist@larkspur.test', students: ['wren.okoye@larkspur.test'] },
];

/** Weeks of invented practice history behind each demo assignment. */
const HISTORY_WEEKS = 6;
const DAY_MS = 86_400_000;

/** What {@link seedDemoStudio} added. */
export interface StudioSeedCounts {
  readonly links: number;
  readonly assignments: number;
  readonly logs: number;
}

const NOTHING: StudioSeedCounts = { links: 0, assignments: 0, logs: 0 };

/**
 * Gives the demo teachers their students, assignments of their saved drills and several weeks of
 * invented practice, so the roster, statuses and charts have something to show. Runs only while
 * no studio link exists (a restart adds nothing); dates count back from `now`. The history is
 * a fixed pattern (no randomness): each student practises on set weekdays and gains tempo slowly.
 */
export async function seedDemoStudio(db: Knex, now: Date = new Date()): Promise<StudioSeedCounts> {
  return db.transaction(async (trx) => {
    if (await trx('studio_students').first()) return NOTHING;
    const users = new UsersRepository(trx);
    const counts = { links: 0, assignments: 0, logs: 0 };
    for (const studio of DEMO_STUDIOS) {
      const teacher = await users.findByEmail(studio.teacher);
      if (!teacher) continue;
      const students = [];
      for (const email of studio.students) {
        const student = await users.findByEmail(email);
        if (!student) continue;
        const joined = new Date(now.getTime() - (HISTORY_WEEKS * 7 + 3) * DAY_MS);
        await trx('studio_students').insert({
          teacher_id: teacher.id,
          student_id: student.id,
          created_at: joined,
        });
        students.push(student);
        counts.links += 1;
      }
      const drills = (await trx('saved_drills')
        .where({ owner_id: teacher.id })
        .orderBy('id')
        .limit(2)
        .select('id', 'title')) as { id: number; title: string }[];
      for (const [index, drill] of drills.entries()) {
        // The first assignment is due in 10 days; the second was due 4 days ago.
        const due = new Date(now.getTime() + (index === 0 ? 10 : -4) * DAY_MS);
        const [row] = (await trx('assignments')
          .insert({
            teacher_id: teacher.id,
            saved_drill_id: drill.id,
            title: drill.title,
            due_date: due.toISOString().slice(0, 10),
            start_tempo: 70 + index * 10,
            target_tempo: 100 + index * 10,
            note:
              index === 0
                ? 'Keep the ghost notes soft; count out loud for the first minute.'
                : 'Loop the two hardest bars before playing it through.',
            created_at: new Date(now.getTime() - HISTORY_WEEKS * 7 * DAY_MS),
          })
          .returning('id')) as ({ id: number } | number)[];
        const assignmentId = typeof row === 'object' ? Number(row.id) : Number(row);
        counts.assignments += 1;
        for (const [s, student] of students.entries()) {
          await trx('assignment_students').insert({
            assignment_id: assignmentId,
            student_id: student.id,
          });
          const logs = practiceHistory(now, s, index, 70 + index * 10).map((log) => ({
            ...log,
            student_id: student.id,
            assignment_id: assignmentId,
          }));
          if (logs.length > 0) await trx('practice_logs').insert(logs);
          counts.logs += logs.length;
        }
      }
    }
    return counts;
  });
}

const NOTES = [
  'Felt steady once I slowed down.',
  'Left hand ghost notes still too loud.',
  'Counted out loud, the bar 3 fill is cleaner.',
  '',
  'Short session, hands were tired.',
];

/**
 * One student's logs on one assignment: practice on 3 or 4 days a week for the history, tempo
 * rising a few BPM a week. Student `s` and assignment `a` shift the pattern so lines differ.
 */
function practiceHistory(now: Date, s: number, a: number, start: number) {
  const logs = [];
  const days = HISTORY_WEEKS * 7;
  for (let day = days; day >= 1; day -= 1) {
    const weekday = (day + s) % 7;
    // Student 2 (the third) took the last two weeks off from the second assignment.
    if (a === 1 && s === 2 && day < 14) continue;
    if (![0, 2, 4, ...(s === 0 ? [5] : [])].includes(weekday)) continue;
    const week = Math.floor((days - day) / 7);
    const tempo = start + week * (3 + s) + (day % 2);
    logs.push({
      minutes: 10 + ((day * (s + 3)) % 4) * 5,
      tempo,
      rating: 2 + ((day + s) % 4),
      note: NOTES[(day + s + a) % NOTES.length]!,
      practised_at: new Date(
        now.getTime() - day * DAY_MS + (17 + s) * 3_600_000 - (now.getTime() % DAY_MS),
      ),
    });
  }
  return logs;
}
