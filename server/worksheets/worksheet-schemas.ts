import { z } from 'zod';
import { seedSchema } from '../drills/drill-schemas';
import { listQuery } from '../paging';
import { titleSchema } from '../rule-cards/card-fields';
import { WORKSHEET_SORTS } from './worksheets-repository';

/** The card's own tempo bounds (beats per minute), which a ladder's rungs must keep to. */
export const MIN_TEMPO = 20;
export const MAX_TEMPO = 320;
/** A ladder longer than this no longer fits beside its drill on paper. */
export const MAX_RUNGS = 24;
/** Drills on one worksheet. */
export const MAX_ITEMS = 24;

export const PAPERS = ['a4', 'letter'] as const;
export type Paper = (typeof PAPERS)[number];
export const paperSchema = z.enum(PAPERS, { error: 'The paper is a4 or letter.' });

const tempo = (what: string) =>
  z
    .number({ error: `The ${what} tempo is a number of beats per minute.` })
    .int(`The ${what} tempo is a whole number of beats per minute.`)
    .min(MIN_TEMPO, `The ${what} tempo is ${MIN_TEMPO} to ${MAX_TEMPO} beats per minute.`)
    .max(MAX_TEMPO, `The ${what} tempo is ${MIN_TEMPO} to ${MAX_TEMPO} beats per minute.`);

/** Start → target in steps; the ladder climbs, so start ≤ target and the step is positive. */
export const ladderSchema = z
  .strictObject({
    start: tempo('start'),
    target: tempo('target'),
    step: z
      .number({ error: 'The step is a number of beats per minute.' })
      .int('The step is a whole number of beats per minute.')
      .min(1, 'The step is at least 1 beat per minute.')
      .max(MAX_TEMPO - MIN_TEMPO, `The step is at most ${MAX_TEMPO - MIN_TEMPO} beats per minute.`),
  })
  .superRefine((ladder, ctx) => {
    // Only a ladder whose own fields are valid is checked as a whole.
    if (!validRungs(ladder)) return;
    if (ladder.start > ladder.target) {
      ctx.addIssue({
        code: 'custom',
        path: ['target'],
        message: `The target tempo (${ladder.target}) is below the start tempo (${ladder.start}): a ladder climbs.`,
      });
    } else if (rungCount(ladder) > MAX_RUNGS) {
      ctx.addIssue({
        code: 'custom',
        path: ['step'],
        message: `From ${ladder.start} to ${ladder.target} in steps of ${ladder.step} makes ${rungCount(ladder)} rungs; a ladder has at most ${MAX_RUNGS}. Take a larger step.`,
      });
    }
  });
export type Ladder = z.output<typeof ladderSchema>;

function validRungs(ladder: { start: number; target: number; step: number }): boolean {
  const inRange = (tempo: number) =>
    Number.isInteger(tempo) && tempo >= MIN_TEMPO && tempo <= MAX_TEMPO;
  return (
    inRange(ladder.start) &&
    inRange(ladder.target) &&
    Number.isInteger(ladder.step) &&
    ladder.step >= 1
  );
}

/** Rungs of a ladder: every step from start, with the target as the last rung. */
export function rungCount(ladder: Ladder): number {
  return Math.ceil((ladder.target - ladder.start) / ladder.step) + 1;
}

export const aidsSchema = z.strictObject({
  sticking: z.boolean({ error: 'Say true or false for sticking.' }).default(true),
  counts: z.boolean({ error: 'Say true or false for counts.' }).default(true),
  tension: z.boolean({ error: 'Say true or false for the tension plot.' }).default(true),
});
export type Aids = z.output<typeof aidsSchema>;

/** Where an item's drill comes from: one of the teacher's saved drills, or a preset at a seed. */
export const itemSourceSchema = z.discriminatedUnion(
  'kind',
  [
    z.strictObject({
      kind: z.literal('saved'),
      drillId: z
        .number({ error: 'The saved drill id is a number.' })
        .int('The saved drill id is a whole number.')
        .min(1, 'The saved drill id is a positive number.')
        .max(2_147_483_647, 'That saved drill id is too large.'),
    }),
    z.strictObject({
      kind: z.literal('preset'),
      presetId: z
        .string({ error: 'The preset id is text.' })
        .min(1, 'Name the preset.')
        .max(200, 'A preset id has at most 200 characters.'),
      seed: seedSchema,
    }),
  ],
  { error: 'The source is { kind: "saved", drillId } or { kind: "preset", presetId, seed }.' },
);
export type ItemSource = z.output<typeof itemSourceSchema>;

export const itemInputSchema = z.strictObject({
  source: itemSourceSchema,
  /** Left out: from 20 below the drill's tempo up to it, in steps of 4. */
  ladder: ladderSchema.optional(),
  aids: aidsSchema.default({ sticking: true, counts: true, tension: true }),
});
export type ItemInput = z.output<typeof itemInputSchema>;

const notesSchema = z
  .string({ error: 'Notes are text.' })
  .max(5000, 'Notes have at most 5000 characters.');
const itemsSchema = z
  .array(itemInputSchema, { error: 'The items are a list.' })
  .max(MAX_ITEMS, `A worksheet holds at most ${MAX_ITEMS} drills.`);

export const createWorksheetSchema = z.strictObject({
  title: titleSchema,
  notes: notesSchema.default(''),
  paper: paperSchema.default('a4'),
  items: itemsSchema.default([]),
});

/** Items, when given, replace the whole list in the order given. */
export const updateWorksheetSchema = z.strictObject({
  title: titleSchema.optional(),
  notes: notesSchema.optional(),
  paper: paperSchema.optional(),
  items: itemsSchema.optional(),
});

export const worksheetListSchema = listQuery(WORKSHEET_SORTS, 'updatedAt');

export const pdfQuerySchema = z.object({ paper: paperSchema.optional() });
