import { z } from 'zod';
import { HIT_SOURCES, VOICE_IDS } from '../../shared/generator/index';
import { listQuery } from '../paging';
import { titleSchema } from '../rule-cards/card-fields';
import { DRILL_SORTS } from './drills-repository';

/** Seeds are short words a teacher can read out (`lesson-12`). */
export const seedSchema = z
  .string({ error: 'The seed is text.' })
  .trim()
  .min(1, 'Give a seed.')
  .max(64, 'A seed has at most 64 characters.');

const hitSchema = z.strictObject({
  beat: z.number().int().min(1).max(32),
  slot: z.number().int().min(0).max(31),
  voice: z.enum(VOICE_IDS),
  dynamic: z.enum(['ghost', 'normal', 'accent']),
  hand: z.enum(['R', 'L']).nullable(),
  source: z.enum(HIT_SOURCES),
});

/** A bar the teacher pinned, as drawn in the preview. */
export const drillBarSchema = z.strictObject({
  bar: z.number().int().min(1).max(64),
  beats: z.array(z.number().int().min(1).max(32)).min(1).max(32),
  tension: z.number().min(0).max(1),
  hits: z.array(hitSchema).max(2048),
});

export const saveDrillSchema = z.strictObject({
  ruleCardId: z.number().int().min(1).optional(),
  presetId: z.string().min(1).max(200).optional(),
  title: titleSchema,
  notes: z.string().max(5000, 'Notes have at most 5000 characters.').optional(),
  card: z.unknown().refine((card) => card !== undefined, 'The rule card ("card") is missing.'),
  seed: seedSchema,
  keep: z.array(drillBarSchema).max(64, 'At most 64 bars can be pinned.').optional(),
});

export const updateDrillSchema = z.strictObject({
  title: titleSchema.optional(),
  notes: z.string().max(5000, 'Notes have at most 5000 characters.').optional(),
});

export const drillListSchema = listQuery(DRILL_SORTS, 'updatedAt').extend({
  ruleCardId: z.coerce
    .number({ error: 'The rule card id is a number.' })
    .int('The rule card id is a whole number.')
    .min(1, 'The rule card id is a positive number.')
    .optional(),
});
