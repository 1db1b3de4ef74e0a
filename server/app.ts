import express, { type Express } from 'express';
import type { Knex } from 'knex';
import type session from 'express-session';
import { createAuthRouter } from './auth/auth-router';
import { BrandingRepository } from './branding/branding-repository';
import { createBrandingRouter } from './branding/branding-router';
import { BrandingService } from './branding/branding-service';
import { AuthService } from './auth/auth-service';
import { createPassport } from './auth/passport-setup';
import { PasswordHasher } from './auth/passwords';
import { SignInLimiter } from './auth/sign-in-limiter';
import { UsersRepository } from './auth/users-repository';
import type { Config } from './config';
import { apiNotFound, errorHandler } from './error-handler';
import { createHealthRouter } from './health/health-router';
import { createImportsRouter } from './imports/imports-router';
import { ImportsService } from './imports/imports-service';
import { jsonBody } from './json-body';
import { answerWrongMethods } from './method-not-allowed';
import { createLogger, type Logger } from './logger';
import { createPdfRouter } from './pdf/pdf-router';
import { PdfService } from './pdf/pdf-service';
import { ENGINE_VERSION } from '../shared/generator/index';
import { engineGenerator, type DrillGenerator } from './drills/drill-generator';
import { DrillsRepository } from './drills/drills-repository';
import { createDrillsRouter } from './drills/drills-router';
import { createExportsRouter } from './exports/exports-router';
import { ExportsService } from './exports/exports-service';
import { DrillsService } from './drills/drills-service';
import { PresetsRepository } from './presets/presets-repository';
import { createPresetsRouter } from './presets/presets-router';
import {
  PresetsService,
  engraveThumbnail,
  type ThumbnailRenderer,
} from './presets/presets-service';
import { importBody } from './rule-cards/import-body';
import { RuleCardsRepository } from './rule-cards/rule-cards-repository';
import { createRuleCardsRouter } from './rule-cards/rule-cards-router';
import { RuleCardsService } from './rule-cards/rule-cards-service';
import { SeedLinksRepository } from './seed-links/seed-links-repository';
import { createSeedLinksRouter } from './seed-links/seed-links-router';
import { SeedLinksService } from './seed-links/seed-links-service';
import { requestLog } from './request-log';
import { requireSameOrigin } from './same-origin';
import { securityHeaders } from './security-headers';
import {
  SESSION_COOKIE,
  createSessionMiddleware,
  createSessionStore,
  refreshSession,
  warnWhenCookiesCannotBeSent,
} from './session';
import { StudentsService } from './students/students-service';
import { createStudentsRouter } from './students/students-router';
import { createUsersRouter } from './users/users-router';
import { engravingJobs, renderWorksheetPdf } from './pdf/render-worksheet';
import { sharedPrintEngraver, type PrintEngraver } from './pdf/print-engraver';
import { HttpError } from './http-error';
import { worksheetPrint, type WorksheetPdfDeps } from './worksheets/worksheet-pdf';
import { WorksheetsRepository } from './worksheets/worksheets-repository';
import { createWorksheetsRouter, type WorksheetPdfRoute } from './worksheets/worksheets-router';
import { WorksheetsService } from './worksheets/worksheets-service';
import { createSpaRouter } from './web/spa';
import { MailService, type Mailer } from './mail/mail-service';
import { OutboxRepository } from './mail/outbox-repository';
import { AccountLinksService } from './auth/account-links-service';
import { MailLimiter } from './auth/mail-limiter';
import { createInvitationsRouter, createPasswordResetsRouter } from './auth/account-links-router';
import { AssignmentsService } from './assignments/assignments-service';
import { createAssignmentsRouter } from './assignments/assignments-router';
import { PracticeService } from './practice/practice-service';
import { createPracticeRouter } from './practice/practice-router';
import { StudioRepository } from './studio/studio-repository';
import { StudioService } from './studio/studio-service';
import { createStudioRouter } from './studio/studio-router';
import { UsersService } from './users/users-service';
import { createOutboxRouter } from './mail/outbox-router';

/** What {@link createApp} needs; everything but `config` and `db` has a default. */
export interface AppDeps {
  readonly config: Config;
  readonly db: Knex;
  readonly logger?: Logger;
  /** Session store; defaults to one on `db`. Pass one to control its clean-up timer. */
  readonly sessionStore?: session.Store;
  /** The built browser app; defaults to `dist/tensile/browser`. */
  readonly browserDist?: string;
  /** Sign-in attempt limits; defaults to {@link SignInLimiter}'s own, counted in `db`. */
  readonly signInLimiter?: SignInLimiter;
  /** The drill engine; tests inject another to stand for a later engine version. */
  readonly generateDrill?: DrillGenerator;
  /** The engine version thumbnails are cached under (with `generateDrill`). */
  readonly engineVersion?: string;
  /** Engraves preset thumbnails; defaults to the server's VexFlow renderer. */
  readonly renderThumbnail?: ThumbnailRenderer;
  /** Outgoing mail; defaults to SMTP_URL, or the outbox table without it. */
  readonly mailer?: Mailer;
  /** Lays out worksheet PDFs; tests inject a slow one to cancel a download midway. */
  readonly renderWorksheetPdf?: WorksheetPdfRoute['render'];
  /** Engraves and keeps worksheet drawings; tests inject one whose engravings they count. */
  readonly printEngraver?: PrintEngraver;
  /**
   * The server's clock: practice times, days and weeks (counted in UTC), token expiry and rate
   * limits read it. Tests pass a fixed one to cross day and week boundaries deterministically.
   */
  readonly now?: () => Date;
  /** Limits on reset and invitation e-mails; defaults to {@link MailLimiter}'s own. */
  readonly mailLimiter?: MailLimiter;
}

/** Largest JSON body accepted; rule cards and drills are far smaller. */
const JSON_BODY_LIMIT = '256kb';

/**
 * Builds the Express app without listening. The database must already be migrated.
 */
export function createApp(deps: AppDeps): Express {
  const { config, db } = deps;
  const now = deps.now ?? (() => new Date());
  const logger = deps.logger ?? createLogger(config.logLevel);
  const users = new UsersRepository(db);
  const passwords = new PasswordHasher(config.passwordHashCost);
  const auth = new AuthService(users, passwords, logger);
  const passport = createPassport(auth);
  const store = deps.sessionStore ?? createSessionStore(db, logger);
  const outbox = new OutboxRepository(db);
  const mailer =
    deps.mailer ??
    new MailService({ smtpUrl: config.smtpUrl, publicUrl: config.publicUrl, outbox }, logger);

  const app = express();
  app.disable('x-powered-by');
  app.set('trust proxy', config.trustProxy);

  app.use(securityHeaders({ https: config.secureCookies }));
  app.use('/api', requestLog(logger));
  app.use('/api', (_req, res, next) => {
    // API answers depend on who asks; never let a shared cache keep them.
    res.setHeader('Cache-Control', 'no-store');
    next();
  });
  app.use('/api', requireSameOrigin(config.publicUrl));
  // Imported rule card files have a smaller limit of their own, checked before parsing.
  app.use('/api/rule-cards/import', importBody());
  app.use('/api', jsonBody({ limit: JSON_BODY_LIMIT }));
  // Before the session: a health check must not depend on the session store answering.
  app.use('/api/health', answerWrongMethods(createHealthRouter(db)));
  if (config.secureCookies) app.use('/api', warnWhenCookiesCannotBeSent(logger));
  app.use('/api', createSessionMiddleware(config, store));
  app.use('/api', passport.initialize());
  app.use('/api', passport.session());
  app.use('/api', refreshSession());

  // Feature routers; each route states the roles it allows, and a wrong method gets a 405.
  app.use(
    '/api/auth',
    answerWrongMethods(
      createAuthRouter({
        passport,
        limiter: deps.signInLimiter ?? new SignInLimiter(db),
        cookieName: SESSION_COOKIE,
      }),
    ),
  );
  const generate = deps.generateDrill ?? engineGenerator;
  const presets = new PresetsRepository(db);
  const ruleCards = new RuleCardsRepository(db);
  const drills = new DrillsRepository(db);
  const links = new AccountLinksService(db, passwords, mailer, config.publicUrl, now);
  const mailLimiter = deps.mailLimiter ?? new MailLimiter(now);
  app.use(
    '/api/users',
    answerWrongMethods(createUsersRouter(new UsersService(db, links), mailLimiter)),
  );
  app.use(
    '/api/students',
    answerWrongMethods(createStudentsRouter(new StudentsService(users, new StudioRepository(db)))),
  );
  app.use('/api/invitations', answerWrongMethods(createInvitationsRouter(links)));
  app.use(
    '/api/password-resets',
    answerWrongMethods(createPasswordResetsRouter(links, mailLimiter)),
  );
  app.use(
    '/api/studio',
    answerWrongMethods(createStudioRouter(new StudioService(db, links, now), mailLimiter)),
  );
  app.use(
    '/api/assignments',
    answerWrongMethods(
      createAssignmentsRouter(
        new AssignmentsService(db, mailer, config.publicUrl, now, { presets, drills, generate }),
      ),
    ),
  );
  app.use('/api/practice', answerWrongMethods(createPracticeRouter(new PracticeService(db, now))));
  const seedLinks = new SeedLinksService(new SeedLinksRepository(db), drills);
  app.use(
    '/api/presets',
    answerWrongMethods(
      createPresetsRouter(
        new PresetsService(presets, ruleCards, generate, deps.renderThumbnail ?? engraveThumbnail),
        deps.engineVersion ?? ENGINE_VERSION,
      ),
    ),
  );
  app.use(
    '/api/rule-cards',
    answerWrongMethods(createRuleCardsRouter(new RuleCardsService(ruleCards, presets))),
  );
  const drillsService = new DrillsService(
    drills,
    ruleCards,
    presets,
    new SeedLinksRepository(db),
    generate,
  );
  app.use('/api/drills', answerWrongMethods(createDrillsRouter(drillsService, seedLinks)));
  app.use(
    '/api/imports',
    answerWrongMethods(createImportsRouter(new ImportsService(drills, drillsService))),
  );
  // Anyone may open a share link: its routes state `allowAnyone`, and sessions stay optional.
  app.use('/api/seed-links', answerWrongMethods(createSeedLinksRouter(seedLinks)));
  const engraver = () => deps.printEngraver ?? sharedPrintEngraver();
  const worksheetRows = new WorksheetsRepository(db);
  const worksheets = new WorksheetsService(worksheetRows, drills, presets);
  const worksheetPdf: WorksheetPdfDeps = {
    worksheets: worksheetRows,
    sources: { presets, drills, generate },
    links: new SeedLinksRepository(db),
    publicUrl: config.publicUrl,
    branding: (user) =>
      new BrandingService(new BrandingRepository(db)).forPrint(user.id, user.name),
  };
  app.use(
    '/api/worksheets',
    answerWrongMethods(
      createWorksheetsRouter(worksheets, {
        print: (user, id, paper) => worksheetPrint(worksheetPdf, user, id, paper),
        render:
          deps.renderWorksheetPdf ??
          ((print, signal) => renderWorksheetPdf(print, signal, engraver())),
        prepare: (user, id) => {
          void worksheetPrint(worksheetPdf, user, id)
            .then((print) => engraver().prepare(engravingJobs(print)))
            .catch((error: unknown) => {
              // An empty sheet or a withdrawn preset is refused at export, in the teacher's words.
              if (error instanceof HttpError) return;
              logger.warn('worksheet engraving failed', { error: String(error) });
            });
        },
      }),
    ),
  );
  app.use('/api/outbox', answerWrongMethods(createOutboxRouter(outbox)));
  const exportsService = new ExportsService({ presets, drills, generate });
  app.use('/api/exports', answerWrongMethods(createExportsRouter(exportsService)));
  const branding = new BrandingService(new BrandingRepository(db));
  app.use('/api/branding', answerWrongMethods(createBrandingRouter(branding)));
  const pdf = new PdfService({ presets, drills, generate }, branding, config.publicUrl);
  app.use('/api/pdf', answerWrongMethods(createPdfRouter(pdf)));
  app.use('/api', apiNotFound);

  app.use(createSpaRouter(deps.browserDist));
  app.use(errorHandler(logger));
  return app;
}
