import { randomUUID } from 'node:crypto';
import path from 'node:path';
import express, { Router, type Express } from 'express';
import session from 'express-session';
import helmet from 'helmet';
import expressStaticGzip from 'express-static-gzip';
import passportModule from 'passport';
import { Strategy as LocalStrategy } from 'passport-local';
import { pinoHttp } from 'pino-http';
import type { DestinationStream } from 'pino';
import type { Pool } from 'pg';
import type { Sequelize } from 'sequelize';
import { errorHandler, notFoundHandler } from './http/error-handler.js';
import { requireSignIn } from './http/authenticate.js';
import { jsonBodiesOnly, noStore, sameOriginOnly } from './http/request-guards.js';
import { sessionLifetime } from './http/session-lifetime.js';
import { createSessionStore, touchIntervalMs } from './http/session-store.js';
import {
  AttemptCounters,
  DEFAULT_ATTEMPT_LIMITS,
  clientAddress,
  emailKey,
  type AttemptLimitSettings,
} from './security/attempt-limits.js';
import { initModels } from './db/models.js';
import { readYourWrites } from './db/read-routing.js';
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
import { noticeIfBelowReorderPoint } from './jobs/low-stock.js';
import { stopsRouter } from './modules/stops/stops.router.js';
import { cutLogsRouter } from './modules/cut-logs/cut-logs.router.js';
import { photosRouter } from './modules/photos/photos.router.js';
import { siteChecksRouter } from './modules/site-checks/site-checks.router.js';
import { sawTimelineRouter } from './modules/saw-timeline/saw-timeline.router.js';
import { siteSummariesRouter } from './modules/site-summaries/site-summaries.router.js';
import { DatabasePhotoStorage, type PhotoStorage } from './modules/photos/photo-storage.js';
import { importsRouter } from './modules/imports/imports.router.js';
import { removedRecordsRouter } from './modules/removed-records/removed-records.router.js';
import { DEFAULT_IMPORT_LIMITS, type ImportLimits } from './modules/imports/imports.service.js';
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
  /** Sign-in and link attempt limits (README: SIGN_IN_LIMIT and the others); unset ones keep their defaults. */
  attemptLimits?: Partial<AttemptLimitSettings>;
  /** Idle timeout and absolute lifetime of a session (README: SESSION_IDLE_HOURS, SESSION_MAX_DAYS). */
  sessionIdleMs?: number;
  sessionMaxMs?: number;
  /** The address people open Kerfline at: requests from its origin count as Kerfline's own (CSRF check). */
  publicUrl?: string | undefined;
  logLevel?: string;
  /** Where the request log goes (standard output unless given; the floor benchmark sends it to /dev/null). */
  logDestination?: DestinationStream;
  /** The job runtime: services queue mail through it; server.ts also runs its workers. */
  jobs: Jobs;
  /** Folder of the local mail catcher (development and tests); set, admins get the outbox page. */
  mailCatcherDir?: string | undefined;
  /** Where photo bytes live; PostgreSQL (shared by every process) unless another store is given. */
  photoStorage?: PhotoStorage;
  /** The largest file and the most rows one import takes (IMPORT_MAX_BYTES, IMPORT_MAX_ROWS). */
  importLimits?: ImportLimits;
  /** Set when reads go to a replica: a session's reads stay on the primary this long after it wrote. */
  readYourWritesMs?: number;
};

export const SESSION_COOKIE = 'kerfline.sid';

/**
 * The routes that take a multipart upload (matched on the path under the app); every other state-changing
 * route takes JSON only. A new upload route must be added here, or its requests answer 415.
 */
export const MULTIPART_ROUTES: readonly RegExp[] = [
  /^\/api\/blade-runs\/[^/]+\/photos$/,
  /^\/api\/check-records\/[^/]+\/photos$/,
  /^\/api\/imports(\/check)?$/,
];

/** Builds the whole HTTP application without listening, for the server and for supertest alike. */
export function createApp(deps: AppDeps): Express {
  initModels(deps.sequelize);
  const app = express();
  app.disable('x-powered-by');
  // API answers are never cached (noStore below), so an ETag is a hash of every body that no client keeps; the
  // web app's files get theirs from the static handler, which keeps its own.
  app.set('etag', false);
  if (deps.trustProxy) app.set('trust proxy', 1);

  app.use(
    pinoHttp(
      {
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
      },
      deps.logDestination,
    ),
  );
  // HSTS and upgrading requests to https only make sense when a TLS-terminating proxy is in front; on plain
  // http (a plant's own server reached by address) they would break the page's own assets.
  const behindTls = Boolean(deps.trustProxy);
  app.use(
    helmet({
      strictTransportSecurity: behindTls,
      // The import wizard reads files in a Web Worker; papaparse and the workbook reader may start blob: workers.
      contentSecurityPolicy: {
        directives: { upgradeInsecureRequests: behindTls ? [] : null, workerSrc: ["'self'", 'blob:'] },
      },
    }),
  );
  // Before anything reads the body or the session (DEVELOPERS.md, "Security and reliability"): API answers are
  // never cached; a state-changing request from another origin is refused (CSRF); bodies are JSON only, except
  // multipart on the upload routes.
  app.use('/api', noStore);
  app.use(sameOriginOnly({ publicUrl: deps.publicUrl }));
  app.use(jsonBodiesOnly({ multipartPaths: MULTIPART_ROUTES }));
  app.use(express.json({ limit: '1mb' }));

  const sessionIdleMs = deps.sessionIdleMs ?? 12 * 60 * 60 * 1000;
  app.use(
    session({
      name: SESSION_COOKIE,
      store: createSessionStore(deps.sessionPool, { touchEveryMs: touchIntervalMs(sessionIdleMs) }),
      secret: deps.sessionSecret,
      resave: false,
      saveUninitialized: false,
      rolling: true,
      cookie: { httpOnly: true, sameSite: 'lax', secure: Boolean(deps.trustProxy), maxAge: sessionIdleMs },
    }),
  );
  app.use(sessionLifetime({ idleMs: sessionIdleMs, maxMs: deps.sessionMaxMs ?? 7 * 24 * 60 * 60 * 1000 }));

  const attempts = new AttemptCounters(deps.sequelize, { ...DEFAULT_ATTEMPT_LIMITS, ...deps.attemptLimits });
  const passport = new passportModule.Passport();
  passport.use(
    new LocalStrategy(
      { usernameField: 'email', passwordField: 'password', passReqToCallback: true },
      (req, email, password, done) => {
        // Counted per address and per account before the password is checked; see security/attempt-limits.ts.
        attempts
          .signIn(req, email, () => checkCredentials(email, password))
          .then(
            (outcome) =>
              outcome.user
                ? done(null, { id: outcome.user.id })
                : done(null, false, { message: String(outcome.lockedForSeconds ?? '') }),
            (err: unknown) => done(err),
          );
      },
    ),
  );
  passport.serializeUser((user, done) => done(null, user.id));
  passport.deserializeUser((id: string, done) => done(null, { id }));
  app.use(passport.initialize());
  app.use(passport.session());
  if (deps.readYourWritesMs !== undefined) app.use(readYourWrites(deps.readYourWritesMs));

  // Each route that takes a secret has its own counter (attempt-limits.ts); a limit read from the settings.
  const limits = attempts.settings;
  const byAddress = (req: express.Request) => clientAddress(req);
  const api = Router();
  api.use(healthRouter(deps.sequelize));
  api.use(
    authRouter({
      passport,
      mail: deps.jobs,
      passwordChangeLimit: attempts.failureLimit(
        'password-change',
        () => limits.passwordChangePerPerson,
        (_req, res) => String((res.locals.signedIn as { user: { id: string } }).user.id),
        'Too many failed password changes in the last 15 minutes',
      ),
      resetRequestLimits: [
        attempts.requestLimit(
          'reset-request',
          () => limits.resetRequestsPerAddress,
          byAddress,
          'Too many reset links asked for from this network in the last 15 minutes',
        ),
        attempts.requestLimit(
          'reset-request-email',
          () => limits.resetRequestsPerEmail,
          (_req, res) => emailKey((res.locals.body as { email: string }).email),
          'Reset links for this address were asked for several times in the last 15 minutes; use the newest e-mail',
        ),
      ],
      clearSignInWait: (email) => attempts.clearAccount(email),
      resetLimit: attempts.failureLimit(
        'reset',
        () => limits.linkFailuresPerAddress,
        byAddress,
        'Too many reset links refused from this network in the last 15 minutes',
      ),
    }),
  );
  api.use(
    invitationsRouter({
      mail: deps.jobs,
      linkLimit: attempts.failureLimit(
        'invitation',
        () => limits.linkFailuresPerAddress,
        byAddress,
        'Too many invitation links refused from this network in the last 15 minutes',
      ),
    }),
  );
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
  const photoStorage = deps.photoStorage ?? new DatabasePhotoStorage(deps.sequelize);
  api.use(
    bladeRunsRouter(photoStorage, (actor, siteId, specId) =>
      noticeIfBelowReorderPoint(deps.jobs, actor.ability, siteId, specId),
    ),
  );
  api.use(stopsRouter());
  api.use(cutLogsRouter());
  api.use(photosRouter(photoStorage));
  api.use(siteChecksRouter(photoStorage));
  api.use(sawTimelineRouter());
  api.use(siteSummariesRouter());
  api.use(importsRouter(deps.importLimits ?? DEFAULT_IMPORT_LIMITS));
  api.use(fleetRouter());
  api.use(exchangeRatesRouter());
  api.use(budgetsRouter());
  api.use(outliersRouter());
  api.use(followUpsRouter());
  api.use(removedRecordsRouter(photoStorage));
  api.use(notFoundHandler);
  app.use('/api', api);

  if (deps.webDist) {
    const root = path.resolve(deps.webDist);
    // Source maps are not served: the build emits none, and one left in the folder stays private.
    app.use((req, res, next) => (req.path.endsWith('.map') ? res.status(404).end() : next()));
    // The build writes each text file also as .br and .gz; a browser that accepts one gets it (Content-Encoding,
    // Vary). Files under assets/ carry a hash of their content in their name, so a browser keeps them for good;
    // index.html (sent below) is asked for again each time, so a new build is seen at the next page load.
    app.use(
      expressStaticGzip(root, {
        enableBrotli: true,
        orderPreference: ['br', 'gz'],
        index: false,
        serveStatic: {
          index: false,
          setHeaders: (res, file) =>
            res.setHeader(
              'Cache-Control',
              path.relative(root, file).startsWith(`assets${path.sep}`)
                ? 'public, max-age=31536000, immutable'
                : 'public, max-age=3600',
            ),
        },
      }),
    );
    // Every other path is a page of the single-page app.
    app.get('/{*splat}', (_req, res) =>
      res.sendFile(path.join(root, 'index.html'), { headers: { 'Cache-Control': 'no-cache' } }),
    );
  }

  app.use(errorHandler);
  return app;
}
