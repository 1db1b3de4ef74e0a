import type { AddressInfo } from 'node:net';
import { createApp } from './app';
import { PasswordHasher } from './auth/passwords';
import { loadConfig } from './config';
import { createDb, migrateLatest } from './db';
import { seedDemo } from './demo/seed-demo';
import { createLogger, errorFields } from './logger';
import { createSessionStore, stopSessionStore } from './session';

/** Open connections get this long to finish after SIGTERM before the process exits anyway. */
const SHUTDOWN_GRACE_MS = 10_000;

async function main(): Promise<void> {
  const config = loadConfig();
  const logger = createLogger(config.logLevel);
  const db = createDb(config);
  const ran = await migrateLatest(db);
  if (ran.length > 0) logger.info('Database migrated', { migrations: ran });
  if (config.seedDemo) {
    const added = await seedDemo(db, new PasswordHasher(config.passwordHashCost));
    if (added > 0) logger.info('Demo accounts added', { count: added });
  }
  const sessionStore = createSessionStore(db, logger);
  const app = createApp({ config, db, logger, sessionStore });
  const server = app.listen(config.port, () => {
    const { port } = server.address() as AddressInfo;
    logger.info('Tensile is listening', {
      port,
      publicUrl: config.publicUrl,
      db: config.database.client,
    });
  });
  server.on('error', (error) => {
    logger.error('The server could not start', errorFields(error));
    process.exit(1);
  });

  let stopping = false;
  const shutdown = (signal: string) => {
    if (stopping) return;
    stopping = true;
    logger.info('Shutting down', { signal });
    const forced = setTimeout(() => {
      logger.warn('Connections still open after the grace period; exiting');
      process.exit(1);
    }, SHUTDOWN_GRACE_MS);
    forced.unref();
    server.close(() => {
      stopSessionStore(sessionStore);
      db.destroy().then(
        () => process.exit(0),
        () => process.exit(1),
      );
    });
    server.closeIdleConnections();
  };
  process.on('SIGTERM', () => shutdown('SIGTERM'));
  process.on('SIGINT', () => shutdown('SIGINT'));
}

main().catch((error: unknown) => {
  // Configuration errors carry a readable message; print it without a stack trace.
  const message = error instanceof Error ? error.message : String(error);
  process.stderr.write(`Tensile could not start: ${message}\n`);
  if (!(error instanceof Error && error.name === 'ConfigError')) {
    process.stderr.write(`${(error as Error)?.stack ?? ''}\n`);
  }
  process.exit(1);
});
