import type { Knex } from 'knex';
import { z } from 'zod';

/** One page of a list, as every paged API list answers. */
export interface Page<T> {
  readonly items: readonly T[];
  readonly total: number;
  readonly page: number;
  readonly pageSize: number;
}

/** Largest page a client may ask for: a table never needs more rows at once. */
export const MAX_PAGE_SIZE = 100;

/**
 * The common list query (`page`, `pageSize`, `sort`, `direction`, `q`) for a list whose sortable
 * fields are `sorts`; the list's own filters are added with `.extend(...)`.
 */
export function listQuery<const S extends readonly [string, ...string[]]>(
  sorts: S,
  byDefault: S[number],
) {
  return z.object({
    page: z.coerce
      .number()
      .int('The page number is a whole number.')
      .min(0, 'Pages are counted from 0.')
      .max(100_000, 'That page number is too large.')
      .default(0),
    pageSize: z.coerce
      .number()
      .int('The page size is a whole number.')
      .min(1, 'A page holds at least 1 row.')
      .max(MAX_PAGE_SIZE, `A page holds at most ${MAX_PAGE_SIZE} rows.`)
      .default(20),
    sort: z
      .enum(sorts, { error: `Sort by one of: ${sorts.join(', ')}.` })
      .default(byDefault as never),
    direction: z.enum(['asc', 'desc'], { error: 'The direction is asc or desc.' }).optional(),
    q: z.string().trim().max(200, 'Search text has at most 200 characters.').optional(),
  });
}

/** `true`/`false` in a query string. */
export const queryBoolean = z
  .enum(['true', 'false'], { error: 'Use true or false.' })
  .transform((value) => value === 'true');

/** A LIKE pattern that finds `text` anywhere, with LIKE's wildcards taken literally. */
export function containsPattern(text: string): string {
  return `%${text.toLowerCase().replace(/[\\%_]/g, (c) => `\\${c}`)}%`;
}

/**
 * Adds "lower(column) contains text", for any of the columns when several are given (portable:
 * an explicit ESCAPE works in SQLite and PostgreSQL).
 */
export function whereContains(
  query: Knex.QueryBuilder,
  column: string | readonly string[],
  text: string,
): void {
  const pattern = containsPattern(text);
  const columns = typeof column === 'string' ? [column] : column;
  query.where((any) => {
    for (const name of columns) any.orWhereRaw(`lower(??) like ? escape '\\'`, [name, pattern]);
  });
}

/** Total rows of a filtered query (run on a clone, without order or limit). */
export async function countRows(query: Knex.QueryBuilder): Promise<number> {
  const rows = (await query.clone().clearSelect().clearOrder().count({ n: '*' })) as {
    n: number | string;
  }[];
  return Number(rows[0]?.n ?? 0);
}
