import { randomUUID } from 'node:crypto';
import path from 'node:path';
import express, { Router, type Express } from 'express';
import session from 'express-session';
import connectPgSimple from 'connect-pg-simple';
import helmet from 'helmet';
import { rateLimit } from 'express-rate-limit';
import passportModule from 'passport';
import { Strategy as LocalStrategy } from 'passport-local';
import { pinoHttp } from 'pino-http';
import type { Pool } from 'pg';
import type { Sequelize } from 'sequelize';
import { errorBody, errorHandler, notFoundHandler } from './http/error-handler.js';
import { requireSignIn } from './http/authenticate.js';
import { PgRateLimitStore } from './http/pg-rate-limit-store.js';
import { AppError } from './errors.js';
import { initModels } from './db/models.js';
import { checkCredentials } from './modules/auth/auth.service.js';
import { authRouter } from './modules/auth/auth.router.js';
import { healthRouter } from './modules/health/health.router.js';
import { regionsRouter } from './modules/regions/regions.router.js';
import { sitesRouter } from './modules/sites/sites.router.js';
import { sawsRouter } from './modules/saws/saws.router.js';
import { usersRouter } from './modules/users/users.router.js';
import { auditRouter } from './modules/audit/audit.router.js';
import { siteSettingsRouter } from './modules/site-settings/site-settings.router.js';
import { invitationsRouter } from './modules/invitations/invitations.router.js';
import { mailRouter } from './modules/mail/mail.router.js';
import { QUEUES, type Jobs } from './jobs/jobs.js';
import { bladeSpecsRouter } from './modules/blade-specs/blade-specs.router.js';
import { bladeStockRouter } from './modules/blade-stock/blade-stock.router.js';
import { bladeRunsRouter } from './modules/blade-runs/blade-runs.router.js';
import { stopsRouter } from './modules/stops/stops.router.js';
import { cutLogsRouter } from './modules/cut-logs/cut-logs.router.js';
import { photosRouter } from './modules/photos/photos.router.js';
import { siteChecksRouter } from './modules/site-checks/site-checks.router.js';
import { sawTimelineRouter } from './modules/saw-timeline/saw-timeline.router.js';
import { siteSummariesRouter } from './modules/site-summaries/site-summaries.router.js';
import { DatabasePhotoStorage, type PhotoStorage } from './modules/photos/photo-storage.js';
import { fleetRouter } from './modules/fleet/fleet.router.js';
import { exchangeRatesRouter } from './modules/exchange-rates/exchange-rates.router.js';
import { budgetsRouter } from './modules/budgets/budgets.router.js';
import { outliersRouter } from './modules/outliers/outliers.router.js';
import { followUpsRouter } from './modules/follow-ups/follow-ups.router.js';

export type AppDeps = {
  sequelize: Sequelize;
  /** Pool for the session store (sessions live in PostgreSQL so any process can serve any request). */
  sessionPool: Pool;
  sessionSecret: string;
  /** Behind a TLS-terminating load balancer: trust X-Forwarded-* and mark the cookie Secure. */
  trustProxy?: boolean;
  /** Folder of the built web app; when set, the API also serves it. */
  webDist?: string;
  signInLimit?: number;
  logLevel?: string;
  /** The job runtime: services queue mail through it; server.ts also runs its workers. */
  jobs: Jobs;
  /** Folder of the local mail catcher (development and tests); set, admins get the outbox page. */
  mailCatcherDir?: string | undefined;
  /** Where photo bytes live; PostgreSQL (shared by every process) unless another store is given. */
  photoStorage?: PhotoStorage;
};

export const SESSION_COOKIE = 'kerfline.sid';

/** Builds the whole HTTP application without listening, for the server and for supertest alike. */
export function createApp(deps: AppDeps): Express {
  initModels(deps.sequelize);
  const app = express();
  app.disable('x-powered-by');
  if (deps.trustProxy) app.set('trust proxy', 1);

  app.use(
    pinoHttp({
      level: deps.logLevel ?? 'info',
      genReqId: (req, res) => {
        const id = randomUUID();
        res.setHeader('X-Request-Id', id);
        return id;
      },
      autoLogging: { ignore: (req) => req.url === '/api/health' },
      // One short line a request: no headers, so no cookies in the log.
      serializers: {
        req: (req: { id: string; method: string; url: string }) => ({ id: req.id, method: req.method, url: req.url }),
        res: (res: { statusCode: number }) => ({ statusCode: res.statusCode }),
      },
    }),
  );
  // HSTS and upgrading requests to https only make sense when a TLS-terminating proxy is in front; on plain
  // http (a plant's own server reached by address) they would break the page's own assets.
  const behindTls = Boolean(deps.trustProxy);
  app.use(
    helmet({
      strictTransportSecurity: behindTls,
      contentSecurityPolicy: { directives: { upgradeInsecureRequests: behindTls ? [] : null } },
    }),
  );
  app.use(express.json({ limit: '1mb' }));

  const PgStore = connectPgSimple(session);
  app.use(
    session({
      name: SESSION_COOKIE,
      store: new PgStore({ pool: deps.sessionPool, tableName: 'sessions', pruneSessionInterval: 15 * 60 }),
      secret: deps.sessionSecret,
      resave: false,
      saveUninitialized: false,
      rolling: true,
      cookie: { httpOnly: true, sameSite: 'lax', secure: Boolean(deps.trustProxy), maxAge: 12 * 60 * 60 * 1000 },
    }),
  );

  const passport = new passportModule.Passport();
  passport.use(
    new LocalStrategy({ usernameField: 'email', passwordField: 'password' }, (email, password, done) => {
      checkCredentials(email, password).then(
        (user) => done(null, user ? { id: user.id } : false),
        (err: unknown) => done(err),
      );
    }),
  );
  passport.serializeUser((user, done) => done(null, user.id));
  passport.deserializeUser((id: string, done) => done(null, { id }));
  app.use(passport.initialize());
  app.use(passport.session());

  const signInLimiter = rateLimit({
    windowMs: 15 * 60 * 1000,
    limit: deps.signInLimit ?? 20,
    standardHeaders: 'draft-8',
    legacyHeaders: false,
    store: new PgRateLimitStore(deps.sequelize, 'sign-in:'),
    handler: (req, res) => {
      const error = new AppError('RATE_LIMITED', 'Too many sign-in attempts; wait 15 minutes and try again');
      res.status(429).json(errorBody(error, String(req.id)));
    },
  });

  // The routes that take a mailed link's secret or mail one out: counted apart from sign-in, same allowance.
  const linkLimiter = rateLimit({
    windowMs: 15 * 60 * 1000,
    limit: deps.signInLimit ?? 20,
    standardHeaders: 'draft-8',
    legacyHeaders: false,
    store: new PgRateLimitStore(deps.sequelize, 'links:'),
    handler: (req, res) => {
      const error = new AppError('RATE_LIMITED', 'Too many attempts; wait 15 minutes and try again');
      res.status(429).json(errorBody(error, String(req.id)));
    },
  });

  const api = Router();
  api.use(healthRouter(deps.sequelize));
  api.use(authRouter({ passport, signInLimiter, linkLimiter, mail: deps.jobs }));
  api.use(invitationsRouter({ mail: deps.jobs, linkLimiter }));
  api.use(requireSignIn);
  api.use(regionsRouter());
  api.use(sitesRouter());
  api.use(siteSettingsRouter());
  api.use(sawsRouter());
  api.use(usersRouter());
  api.use(auditRouter());
  api.use(
    mailRouter({
      catcherDir: deps.mailCatcherDir,
      runSchedule: (schedule) =>
        deps.jobs.fire(schedule === 'weekly-digest' ? QUEUES.weeklyDigest : QUEUES.monthlySummary),
    }),
  );
  api.use(bladeSpecsRouter());
  api.use(bladeStockRouter());
  api.use(bladeRunsRouter());
  api.use(stopsRouter());
  api.use(cutLogsRouter());
  api.use(photosRouter(deps.photoStorage ?? new DatabasePhotoStorage(deps.sequelize)));
  api.use(siteChecksRouter());
  api.use(sawTimelineRouter());
  api.use(siteSummariesRouter());
  api.use(fleetRouter());
  api.use(exchangeRatesRouter());
  api.use(budgetsRouter());
  api.use(outliersRouter());
  api.use(followUpsRouter());
  api.use(notFoundHandler);
  app.use('/api', api);

  if (deps.webDist) {
    const root = path.resolve(deps.webDist);
    app.use(express.static(root, { index: false, maxAge: '1h' }));
    // Every other path is a page of the single-page app.
    app.get('/{*splat}', (_req, res) => res.sendFile(path.join(root, 'index.html')));
  }

  app.use(errorHandler);
  return app;
}
