/** Helpers for reading rows written by either database driver. */

/**
 * A stored timestamp as ISO 8601. SQLite (through Knex) keeps the epoch milliseconds it was
 * given; PostgreSQL returns a Date.
 */
export function isoTime(value: Date | number | string): string {
  return new Date(
    typeof value === 'string' && /^\d+$/.test(value) ? Number(value) : value,
  ).toISOString();
}

/** Like {@link isoTime}, keeping `null` for a timestamp not set. */
export function isoTimeOrNull(value: Date | number | string | null | undefined): string | null {
  return value === null || value === undefined ? null : isoTime(value);
}

/** SQLite answers booleans as 0 and 1. */
export function bool(value: boolean | number): boolean {
  return value === true || value === 1;
}

/** JSON text this server wrote itself. */
export function fromJson<T>(text: string): T {
  return JSON.parse(text) as T;
}
