import './linear-regexp';
import { existsSync } from 'node:fs';
import path from 'node:path';
import express, { Router } from 'express';
import session from 'express-session';
import helmet from 'helmet';
import { Passport } from 'passport';
import { Strategy as LocalStrategy } from 'passport-local';
import { csrfSync } from 'csrf-sync';
import { targetOf, type Db } from './db/knex';
import { SessionStore, takeSessionUserRow } from './db/session-store';
import { toUser, usersRepo } from './db/users-repo';
import { catalogRepo } from './db/catalog-repo';
import { settingsRepo } from './db/settings-repo';
import { usersService } from './services/users';
import { catalogService } from './services/catalog';
import { apiNotFound, errorHandler } from './middleware/errors';
import { uploadLimit } from './middleware/upload-limit';
import { leanSessionReads } from './middleware/lean-session';
import { fixedHeaders } from './middleware/fixed-headers';
import { mount, type RouteDef } from './routes/route-table';
import { authRoutes } from './routes/auth';
import { userRoutes } from './routes/users';
import { catalogRoutes } from './routes/catalog';
import { settingsRoutes } from './routes/settings';
import { templateRoutes } from './routes/templates';
import { stockCheckRoutes } from './routes/stock-check';
import { namingRoutes } from './routes/naming';
import { reviewRoutes } from './routes/reviews';
import { homeRoutes } from './routes/home';
import { homeService } from './services/home';
import { reviewsRepo } from './db/reviews-repo';
import { auditRoutes } from './routes/audit';
import { jobRoutes } from './routes/jobs';
import { dxfRoutes } from './routes/dxf';
import { partProgramRoutes } from './routes/part-programs';
import { partProgramsService } from './services/part-programs';
import { manifestRoutes } from './routes/manifest';
import { manifestService } from './services/manifest';
import { jobsRepo } from './db/jobs-repo';
import { jobsService } from './services/jobs';
import { loadListService } from './services/load-list';
import { barsDraftService } from './services/bars-draft';
import { auditRepo } from './db/audit-repo';
import { reviewsService } from './services/reviews';
import { namingRepo } from './db/naming-repo';
import { namingService } from './services/naming';
import { templatesRepo } from './db/templates-repo';
import { templatesService } from './services/templates';
import { createMailer, type Mailer } from './mail/mailer';
import { outboxRepo } from './db/outbox-repo';
import { userTokensRepo } from './db/user-tokens-repo';
import { accountLinksService } from './services/account-links';
import { accountLinkRoutes } from './routes/account-links';
import { outboxRoutes } from './routes/outbox';
import type { FileStore } from './storage/file-store';
import { localFileStore } from './storage/local-store';
import { originalFilesService } from './services/original-files';
import { originalFileRoutes } from './routes/original-files';
import { outlineImportService } from './services/outline-import';
import { sharedWorkerPool, type WorkerPool } from './workers/pool';

export interface AppDeps {
  db: Db;
  sessionSecret: string;
  /** The data folder: multer's temporary upload files, and the kept files unless `files` says otherwise. */
  dataDir: string;
  /** Where kept files live (DXF originals, the local outbox's .eml files); the data folder by default, a bucket when S3_URL is set. */
  files?: FileStore;
  /** Built client (vite build output); served with a single-page fallback when present. */
  clientDir?: string;
  uploadLimitBytes?: number;
  /** Sends every mail (invitations, password resets, review notices); by default the local outbox (rows, and .eml files when files are local). */
  mailer?: Mailer;
  /** The address links in mails point at. */
  publicUrl?: string;
  /** Where unexpected errors are logged; tests pass a collector. */
  log?: (err: unknown) => void;
  /** Uploads one signed-in user may send in 15 minutes (UPLOAD_LIMIT by default); the fuzz tests raise it to reach the readers. */
  uploadsPer15Minutes?: number;
  /** Served to browsers over HTTPS (GRIDSET_HTTPS=1): every answer then asks for HTTPS only. */
  https?: boolean;
  /** Express's `trust proxy` (TRUST_PROXY): which proxies' X-Forwarded-* headers to believe; loopback by default. */
  trustProxy?: string | boolean | number;
  /** The threads that read heavy uploads (DXF, manifests, bars files); the process's shared pool by default. */
  workers?: WorkerPool;
}

export type GridsetApp = express.Express & {
  /**
   * whenIdle resolves once mails sent after an answer (password resets) are out: for tests and shutdown.
   * close does that, then ends the worker processes once the files they are reading are done (a later upload starts them again).
   */
  locals: { routes: RouteDef[]; whenIdle: () => Promise<void>; close: () => Promise<void> };
};

const SESSION_COOKIE = 'gridset.sid';

/** Builds the whole app from its dependencies; never listens (server/index.ts does). */
export function createApp(deps: AppDeps): GridsetApp {
  const { db } = deps;
  const audit = auditRepo(db);
  const naming = namingService(namingRepo(db), audit);
  const userRows = usersRepo(db);
  const userTokens = userTokensRepo(db);
  const users = usersService(userRows, audit, userTokens);
  const files = deps.files ?? localFileStore(deps.dataDir);
  const mailer = deps.mailer ?? createMailer({ db, emlFiles: files.kind === 'local' ? files : undefined });
  const accountLinks = accountLinksService({ db, users: userRows, tokens: userTokens, audit, mailer, publicUrl: deps.publicUrl ?? 'http://localhost:3000', log: deps.log ?? console.error });
  const catalog = catalogService(catalogRepo(db), naming, audit);
  const templates = templatesService({ db, templates: templatesRepo(db), catalog: catalogRepo(db), naming, audit });
  const jobs = jobsService({ db, jobs: jobsRepo(db), templates, audit });
  const reviews = reviewsService({ db, templates, users: userRows, naming, mailer, publicUrl: deps.publicUrl ?? 'http://localhost:3000' });
  const settings = settingsRepo(db);
  const workers = deps.workers ?? sharedWorkerPool();
  const programs = partProgramsService({ db, jobs, audit, workers });

  const app = express() as GridsetApp;
  app.disable('x-powered-by');
  app.set('trust proxy', deps.trustProxy ?? 'loopback');
  // HTTPS-only headers (HSTS, upgrade-insecure-requests) only where the browser came over HTTPS: on
  // a plain-HTTP shop network they would make http://server:3000 load no script at all.
  // Helmet's headers here are fixed (no nonce, no directive computed per request): set in one step.
  const overHttp = fixedHeaders(helmet({ contentSecurityPolicy: { directives: { upgradeInsecureRequests: null } }, strictTransportSecurity: false }));
  const overHttps = fixedHeaders(helmet());
  // req.secure asks the trust-proxy rule (an address parse) each time; a plain socket can only be
  // secure through a forwarded protocol header, so the rule is asked only when one came.
  const overHttpsRequest = (req: express.Request) => deps.https || (req.socket as { encrypted?: boolean }).encrypted === true || (req.headers['x-forwarded-proto'] !== undefined && req.secure);
  app.use((req, res, next) => (overHttpsRequest(req) ? overHttps : overHttp)(req, res, next));

  const api = Router();
  // GET and HEAD carry no body (RFC 9110, 9.3.1 and 9.3.2: content has no defined meaning), so the
  // hot reads skip the JSON parser's checks.
  const json = express.json({ limit: '10mb' });
  api.use((req, res, next) => (req.method === 'GET' || req.method === 'HEAD' ? next() : json(req, res, next)));
  const sessionStore = new SessionStore(db);
  const sessions = session({
    name: SESSION_COOKIE,
    secret: deps.sessionSecret,
    resave: false,
    saveUninitialized: false,
    store: sessionStore,
    cookie: { httpOnly: true, sameSite: 'lax', secure: 'auto', maxAge: 12 * 60 * 60 * 1000 },
  });

  // One passport instance per app: the default export is shared by every app in a process.
  const passport = new Passport();
  passport.use(
    new LocalStrategy({ usernameField: 'email' }, (email, password, done) => {
      users.authenticate(email, password).then((u) => done(null, u ?? false), done);
    }),
  );
  passport.serializeUser((user, done) => done(null, (user as Express.User).id));
  passport.deserializeUser((req: express.Request, id: number, done: (err: unknown, user?: Express.User | false) => void) => {
    // A deactivated user's existing sessions stop working at their next request: the user is read
    // from the database on every request, with the session itself (SessionStore.get) or else by id.
    const row = takeSessionUserRow(req, id);
    if (row !== undefined) {
      const u = row && toUser(row);
      done(null, u && u.active ? u : false);
      return;
    }
    userRows.findById(id).then((u) => done(null, u && u.active ? u : false), done);
  });
  const passportSession = passport.session();
  const sessionThenUser: express.RequestHandler = (req, res, next) => sessions(req, res, (err?: unknown) => (err ? next(err) : passportSession(req, res, next)));
  api.use(leanSessionReads({ store: sessionStore, cookieName: SESSION_COOKIE, secrets: [deps.sessionSecret], full: sessionThenUser }));

  const { generateToken, csrfSynchronisedProtection } = csrfSync({
    getTokenFromRequest: (req) => req.headers['x-csrf-token'] as string | undefined,
    errorConfig: {
      statusCode: 403,
      code: 'csrf-invalid',
      message: 'The request is missing a valid CSRF token; fetch one from GET /api/auth/csrf and send it in the X-CSRF-Token header.',
    },
  });
  api.use(csrfSynchronisedProtection);
  api.use(uploadLimit(db, deps.uploadsPer15Minutes));

  const routes: RouteDef[] = [
    { method: 'get', path: '/health', access: 'public', handler: async (_req, res) => {
      await db.raw('select 1');
      res.json({ ok: true });
    } },
    ...authRoutes({ users, passport, csrfToken: (req, overwrite) => generateToken(req, overwrite), db }),
    ...userRoutes(users),
    ...accountLinkRoutes(accountLinks, db),
    ...outboxRoutes(outboxRepo(db)),
    ...catalogRoutes(catalog),
    ...settingsRoutes(settings, audit, { files, database: targetOf(db) }),
    ...templateRoutes(templates, settings),
    ...stockCheckRoutes({ dataDir: deps.dataDir, uploadLimitBytes: deps.uploadLimitBytes ?? 20 * 1024 * 1024, workers }),
    ...namingRoutes(naming),
    ...reviewRoutes(reviews),
    ...homeRoutes(homeService({ templates, templatesRows: templatesRepo(db), jobs: jobsRepo(db), reviews: reviewsRepo(db), audit })),
    ...auditRoutes(audit),
    ...jobRoutes(jobs, loadListService({ db, jobs, audit }), programs, barsDraftService({ db, jobs, audit })),
    ...manifestRoutes({ manifest: manifestService({ db, catalog: catalogRepo(db), naming, audit, workers }), templates, dataDir: deps.dataDir, uploadLimitBytes: deps.uploadLimitBytes ?? 20 * 1024 * 1024 }),
    ...dxfRoutes({ dataDir: deps.dataDir, files, uploadLimitBytes: deps.uploadLimitBytes ?? 20 * 1024 * 1024, catalog, jobs, outlines: outlineImportService({ workers, naming, catalog, jobs, files, dataDir: deps.dataDir }) }),
    ...originalFileRoutes(originalFilesService({ files, catalog, jobs })),
    ...partProgramRoutes({ dataDir: deps.dataDir, uploadLimitBytes: deps.uploadLimitBytes ?? 20 * 1024 * 1024, programs }),
  ];
  mount(api, routes);
  api.use(apiNotFound);
  api.use(errorHandler(deps.log));
  app.use('/api', api);
  app.locals.routes = routes;
  app.locals.whenIdle = () => accountLinks.whenIdle();
  app.locals.close = async () => {
    await accountLinks.whenIdle();
    await workers.close();
  };

  if (deps.clientDir && existsSync(path.join(deps.clientDir, 'index.html'))) {
    const clientDir = deps.clientDir;
    app.use(express.static(clientDir, { index: false, maxAge: '1h' }));
    app.get('/{*splat}', (_req, res) => res.sendFile(path.join(clientDir, 'index.html')));
  }
  app.use(errorHandler(deps.log));
  return app;
}
