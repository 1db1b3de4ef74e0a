import { z } from 'zod';

/** Levels a card or preset can be given. */
export const LEVELS = ['beginner', 'intermediate', 'advanced'] as const;
export type Level = (typeof LEVELS)[number];

export const levelSchema = z.enum(LEVELS, {
  error: 'The level is beginner, intermediate or advanced.',
});

/**
 * A tag: lower-case words, digits, spaces and hyphens. Keeping LIKE's wildcards and quotes out
 * lets the lists find a tag inside the stored JSON array with a plain, portable LIKE.
 */
export const tagSchema = z
  .string()
  .trim()
  .toLowerCase()
  .regex(
    /^[a-z0-9][a-z0-9 -]{0,39}$/,
    'A tag is 1 to 40 letters, digits, spaces or hyphens, starting with a letter or digit.',
  );

export const tagsSchema = z
  .array(tagSchema)
  .max(12, 'A card has at most 12 tags.')
  .transform((tags) => [...new Set(tags)]);

export const titleSchema = z
  .string({ error: 'The title is text.' })
  .trim()
  .min(1, 'Give it a title.')
  .max(200, 'A title has at most 200 characters.');

/** Matches rows whose JSON tag list (as stored) holds `tag`. */
export function tagPattern(tag: string): string {
  return `%${JSON.stringify(tag)}%`;
}

/** A file name from a title: lower-case words joined by hyphens. */
export function fileSlug(title: string): string {
  return (
    title
      .toLowerCase()
      .replace(/[^a-z0-9]+/g, '-')
      .replace(/^-+|-+$/g, '')
      .slice(0, 60) || 'rule-card'
  );
}
