import { z } from 'zod';
import { listQuery } from '../paging';

const optionalId = (what: string) =>
  z.coerce
    .number({ error: `The ${what} id is a number.` })
    .int(`The ${what} id is a whole number.`)
    .min(1, `The ${what} id is a positive number.`)
    .optional();

export const logPracticeBody = z.strictObject({
  assignmentId: z
    .number({ error: 'The assignment id is a number.' })
    .int('The assignment id is a whole number.')
    .min(1, 'The assignment id is a positive number.')
    .nullable()
    .default(null),
  assignmentDrillId: z
    .number({ error: 'The worksheet drill id is a number.' })
    .int('The worksheet drill id is a whole number.')
    .min(1, 'The worksheet drill id is a positive number.')
    .nullable()
    .default(null),
  minutes: z
    .number({ error: 'Give the minutes you practised.' })
    .int('Minutes are a whole number.')
    .min(1, 'Log at least 1 minute.')
    .max(600, 'Log at most 600 minutes at once.'),
  tempo: z
    .number({ error: 'Give the highest tempo you played cleanly.' })
    .int('The tempo is a whole number of beats per minute.')
    .min(20, 'The tempo is at least 20 BPM.')
    .max(300, 'The tempo is at most 300 BPM.'),
  rating: z
    .number({ error: 'Rate the session from 1 to 5.' })
    .int('Rate the session from 1 to 5.')
    .min(1, 'Rate the session from 1 to 5.')
    .max(5, 'Rate the session from 1 to 5.'),
  note: z.string().trim().max(2000, 'A note has at most 2000 characters.').default(''),
});

export const practiceListQuery = listQuery(['practisedAt'], 'practisedAt').extend({
  studentId: optionalId('student'),
  assignmentId: optionalId('assignment'),
});

export const progressQuery = z
  .object({ studentId: optionalId('student'), assignmentId: optionalId('assignment') })
  .strict();
