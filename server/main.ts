import type { AddressInfo } from 'node:net';
import { createApp } from './app';
import { PasswordHasher } from './auth/passwords';
import { ConfigError, loadConfig } from './config';
import { createDb, migrateLatest } from './db';
import { SignInLimiter } from './auth/sign-in-limiter';
import { UsersRepository } from './auth/users-repository';
import { DemoPasswordsError, refuseDemoPasswords } from './demo/demo-passwords';
import { seedDemo } from './demo/seed-demo';
import { seedDemoAuthoring } from './demo/seed-authoring';
import { seedDemoStudio } from './demo/seed-studio';
import { seedDemoWorksheets } from './demo/seed-worksheets';
import { seedDemoWorksheetAssignment } from './demo/seed-worksheet-assignment';
import { createLogger, errorFields } from './logger';
import { engineGenerator } from './drills/drill-generator';
import { PresetsRepository } from './presets/presets-repository';
import { PresetsService, engraveThumbnail } from './presets/presets-service';
import { syncBuiltInPresets } from './presets/sync-built-ins';
import { RuleCardsRepository } from './rule-cards/rule-cards-repository';
import { ENGINE_VERSION } from '../shared/generator/index';
import { createSessionStore, stopSessionStore } from './session';

/** Open connections get this long to finish after SIGTERM before the process exits anyway. */
const SHUTDOWN_GRACE_MS = 10_000;

async function main(): Promise<void> {
  const config = loadConfig();
  const logger = createLogger(config.logLevel);
  const db = createDb(config);
  const ran = await migrateLatest(db);
  if (ran.length > 0) logger.info('Database migrated', { migrations: ran });
  // Every start: built-in cards missing from the presets table are added, edited ones kept.
  const presetsAdded = await syncBuiltInPresets(db);
  if (presetsAdded > 0) logger.info('Built-in presets added', { count: presetsAdded });
  const passwords = new PasswordHasher(config.passwordHashCost);
  if (config.seedDemo) {
    const added = await seedDemo(db, passwords);
    if (added > 0) logger.info('Demo accounts added', { count: added });
    const material = await seedDemoAuthoring(db);
    if (material.ruleCards > 0)
      logger.info('Demo rule cards, drills and links added', { ...material });
    const studio = await seedDemoStudio(db);
    if (studio.links > 0) logger.info('Demo studio added', { ...studio });
    const worksheets = await seedDemoWorksheets(db);
    if (worksheets > 0) logger.info('Demo worksheets added', { count: worksheets });
    if ((await seedDemoWorksheetAssignment(db)) > 0) {
      logger.info('Demo worksheet assignment added');
    }
    if (config.production) {
      logger.warn(
        'SEED_DEMO=true in production: the demo accounts and their published passwords work',
      );
    }
  } else if (config.production) {
    // Refuse to serve while the README's demo passwords would open an account.
    await refuseDemoPasswords(new UsersRepository(db), passwords);
  }
  const sessionStore = createSessionStore(db, logger);
  const signInLimiter = new SignInLimiter(db);
  const stopSweeping = signInLimiter.startSweeping(logger);
  const app = createApp({ config, db, logger, sessionStore, signInLimiter });
  const server = app.listen(config.port, () => {
    const { port } = server.address() as AddressInfo;
    logger.info('Tensile is listening', {
      port,
      publicUrl: config.publicUrl,
      db: config.database.client,
    });
    // In the background, once requests are served: the gallery's thumbnails, drawn before its
    // first visitor asks (a request for one not drawn yet draws it itself).
    new PresetsService(
      new PresetsRepository(db),
      new RuleCardsRepository(db),
      engineGenerator,
      engraveThumbnail,
    )
      .drawThumbnails(ENGINE_VERSION)
      .then(
        (count) => {
          if (count > 0) logger.info('Preset thumbnails drawn', { count });
        },
        (error: unknown) => logger.warn('Preset thumbnails not drawn', errorFields(error)),
      );
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
      stopSweeping();
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
  // Configuration and demo-password refusals carry a readable message; print it without a stack.
  const message = error instanceof Error ? error.message : String(error);
  process.stderr.write(`Tensile could not start: ${message}\n`);
  if (!(error instanceof ConfigError || error instanceof DemoPasswordsError)) {
    process.stderr.write(`${(error as Error)?.stack ?? ''}\n`);
  }
  process.exit(1);
});
