import { z } from 'zod';
import { drillSourceSchema } from '../exports/drill-source';

const bpm = (what: string) =>
  z
    .number({ error: `The ${what} is a number of beats per minute.` })
    .int(`The ${what} is a whole number.`)
    .min(20, `The ${what} is at least 20 BPM.`)
    .max(320, `The ${what} is at most 320 BPM.`);

export const ladderSchema = z.strictObject({
  start: bpm('start tempo'),
  target: bpm('target tempo'),
  step: z
    .number({ error: 'The ladder step is a number of beats per minute.' })
    .int('The ladder step is a whole number.')
    .min(1, 'The ladder step is at least 1 BPM.')
    .max(100, 'The ladder step is at most 100 BPM.'),
});

export const aidsSchema = z.strictObject({
  sticking: z.boolean({ error: 'Say whether to print the sticking (true or false).' }),
  counts: z.boolean({ error: 'Say whether to print the counts (true or false).' }),
  tension: z.boolean({ error: 'Say whether to print the tension plot (true or false).' }),
});

export const paperSchema = z.enum(['a4', 'letter'], { error: 'The paper is "a4" or "letter".' });

/** `POST /api/pdf/drill`: one drill on a sheet of its own. */
export const drillPdfSchema = z.strictObject({
  source: drillSourceSchema,
  paper: paperSchema.default('a4'),
  ladder: ladderSchema.optional(),
  aids: aidsSchema.optional(),
});
