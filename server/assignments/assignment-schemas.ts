import { z } from 'zod';
import { listQuery } from '../paging';

const tempo = (what: string) =>
  z
    .number({ error: `The ${what} is a number of beats per minute.` })
    .int(`The ${what} is a whole number of beats per minute.`)
    .min(20, `The ${what} is at least 20 BPM.`)
    .max(300, `The ${what} is at most 300 BPM.`);

const positiveId = (what: string) =>
  z
    .number({ error: `The ${what} id is a number.` })
    .int(`The ${what} id is a whole number.`)
    .min(1, `The ${what} id is a positive number.`);

/** A calendar date `YYYY-MM-DD` that exists. */
export const calendarDate = z
  .string({ error: 'Give the due date as YYYY-MM-DD.' })
  .regex(/^\d{4}-\d{2}-\d{2}$/, 'Give the due date as YYYY-MM-DD.')
  .refine((day) => {
    const date = new Date(`${day}T00:00:00Z`);
    return !Number.isNaN(date.getTime()) && date.toISOString().slice(0, 10) === day;
  }, 'That due date does not exist.');

export const createAssignmentBody = z
  .strictObject({
    drillId: positiveId('drill').optional(),
    worksheetId: positiveId('worksheet').optional(),
    studentIds: z
      .array(positiveId('student'), { error: 'Choose at least one student.' })
      .min(1, 'Choose at least one student.')
      .max(100, 'Assign to at most 100 students at once.'),
    dueDate: calendarDate,
    startTempo: tempo('start tempo'),
    targetTempo: tempo('target tempo'),
    note: z.string().trim().max(2000, 'A note has at most 2000 characters.').default(''),
  })
  .refine((body) => (body.drillId === undefined) !== (body.worksheetId === undefined), {
    message: 'Assign either a saved drill (drillId) or a worksheet (worksheetId).',
    path: ['drillId'],
  })
  .refine((body) => body.targetTempo >= body.startTempo, {
    message: 'The target tempo is at least the start tempo.',
    path: ['targetTempo'],
  });

export const assignmentListQuery = listQuery(['dueDate'], 'dueDate').extend({
  studentId: z.coerce
    .number({ error: 'The student id is a number.' })
    .int('The student id is a whole number.')
    .min(1, 'The student id is a positive number.')
    .optional(),
});
