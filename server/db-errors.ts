/**
 * Error codes meaning the database is busy or briefly out of reach, not that the request or the
 * code is wrong: SQLite's lock errors (another process holds the write lock past the busy
 * timeout), and PostgreSQL's lock timeout, statement timeout, serialization failure, deadlock
 * and shutdown classes. Such a request may well succeed a moment later.
 */
const BUSY_CODES = new Set([
  'SQLITE_BUSY',
  'SQLITE_BUSY_SNAPSHOT',
  'SQLITE_BUSY_RECOVERY',
  'SQLITE_BUSY_TIMEOUT',
  'SQLITE_LOCKED',
  'SQLITE_LOCKED_SHAREDCACHE',
  '55P03',
  '57014',
  '40001',
  '40P01',
  '57P01',
  '57P03',
  'ECONNREFUSED',
]);

/** True for an error that says the database is busy or unreachable for now (answer 503). */
export function isDatabaseBusy(error: unknown): boolean {
  const candidate = error as { code?: unknown; name?: unknown } | null;
  // Knex gives up waiting for a pooled connection with a KnexTimeoutError.
  if (candidate?.name === 'KnexTimeoutError') return true;
  return typeof candidate?.code === 'string' && BUSY_CODES.has(candidate.code);
}
