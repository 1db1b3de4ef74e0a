import { Router } from 'express';
import type { Knex } from 'knex';
import { allowAnyone } from '../auth/require-role';
import { APP_VERSION } from '../version';

/** How long the database check may take before the service counts as unhealthy. */
const DB_CHECK_TIMEOUT_MS = 2_000;

/**
 * `GET /api/health` (anyone) → 200 `{ status: "ok", db: "ok", version }`, or 503 with
 * `status: "error", db: "error"` when the database does not answer.
 */
export function createHealthRouter(db: Knex): Router {
  const router = Router();
  router.get('/', allowAnyone, async (_req, res) => {
    const dbOk = await pingDatabase(db);
    res.setHeader('Cache-Control', 'no-store');
    res
      .status(dbOk ? 200 : 503)
      .json({ status: dbOk ? 'ok' : 'error', db: dbOk ? 'ok' : 'error', version: APP_VERSION });
  });
  return router;
}

async function pingDatabase(db: Knex): Promise<boolean> {
  let timer: NodeJS.Timeout | undefined;
  const timeout = new Promise<false>((resolve) => {
    timer = setTimeout(() => resolve(false), DB_CHECK_TIMEOUT_MS);
  });
  try {
    const ping = db.raw('select 1').then(
      () => true,
      () => false,
    );
    return await Promise.race([ping, timeout]);
  } finally {
    clearTimeout(timer);
  }
}
