import { z } from 'zod';
import { titleSchema } from '../rule-cards/card-fields';

/** The track that holds the drums, counted from 0 as the preview lists them (optional). */
const trackField = z.coerce
  .number({ error: 'The track is a number.' })
  .int('The track is a whole number.')
  .min(0, 'The track is 0 or more.')
  .max(65535, 'There is no such track.')
  .optional();

/** Form fields beside the file for a preview. */
export const previewFieldsSchema = z.strictObject({ track: trackField });

/** Form fields beside the file for saving it as a drill. */
export const saveFieldsSchema = z.strictObject({
  track: trackField,
  title: titleSchema,
  notes: z.string().max(5000, 'Notes have at most 5000 characters.').optional(),
});
