/**
 * The Express application, built from its dependencies and apart from `listen()`, so tests run it
 * in-process on an in-memory database with a fake clock.
 */
import express, { type Express } from 'express';
import type { Logger } from 'pino';
import type { Config } from './config';
import type { Clock } from './clock';
import type { Database } from './db/client';
import type { Mailer } from './mail/mailer';
import type { AppContext } from './context';
import { readVersion } from './version';
import { DEFAULT_SCRYPT, type ScryptParams } from './auth/passwords';
import { createLogger, requestLogging } from './http/logging';
import { noStore, requireSameOrigin, securityHeaders } from './http/security';
import { refuseUnknownHosts } from './http/allowedHosts';
import { apiNotFound, errorHandler, sendFailure } from './http/errorHandler';
import { clientFiles } from './http/clientFiles';
import { healthRouter } from './routes/health';
import { authRouter } from './routes/auth';
import { signUpRouter } from './routes/signUp';
import { invitationsRouter } from './routes/invitations';
import { adminRouter } from './routes/admin';
import { adminStatusRouter } from './routes/adminStatus';
import { programsRouter } from './routes/programs';
import { draftsRouter } from './routes/drafts';
import { proofSheetsRouter } from './routes/proofSheets';
import { classesRouter } from './routes/classes';
import { uploadsRouter } from './routes/uploads';
import { authenticate } from './http/authenticate';
import { requireJsonBody } from './http/reply';
import { trustProxySetting } from './http/trustProxy';
import { createGradingPool, type DocumentWork, type Grader } from './grading/pool';
import type { JobQueue } from './jobs/jobQueue';
import { refuseDeepJson, refuseNulCharacters } from './http/bodyGuards';
import { expensiveCallLimits } from './http/userLimits';
import { labsRouter } from './routes/labs';
import { labAttachmentsRouter } from './routes/labAttachments';
import { submissionsRouter } from './routes/submissions';
import { gradebookRouter } from './routes/gradebook';
import { teachingRouter } from './routes/teaching';
import { adminConsoleRouter } from './routes/adminConsole';

/** What `createApp` needs. */
export interface AppDependencies {
  db: Database;
  mailer: Mailer;
  clock: Clock;
  config: Config;
  /** The built client (`dist`); omitted in API tests. */
  clientDir?: string;
  logger?: Logger;
  /** Signs session tokens (HS256); see `auth/sessionKey.ts`. */
  sessionKey: Uint8Array;
  /** Cost of new password hashes; defaults to `DEFAULT_SCRYPT`. */
  passwordParams?: ScryptParams;
  /** Grades submissions; defaults to a pool of warm worker threads, started on first use. */
  grader?: Grader;
  /** Exports and imports program files; defaults to `grader` when it is a pool, else a pool of its own. */
  documents?: DocumentWork;
  /** Submissions go to this queue (a shared PostgreSQL database) instead of `grader`. */
  jobQueue?: JobQueue;
}

/** Builds the app: security headers, logging, the API under `/api`, then the client. */
export function createApp(deps: AppDependencies): Express {
  const logger = deps.logger ?? createLogger(deps.config.LOG_LEVEL);
  const grader = deps.grader ?? createGradingPool();
  const documents = deps.documents ?? ('exportProgram' in grader ? (grader as Grader & DocumentWork) : createGradingPool());
  const ctx: AppContext = {
    orm: deps.db.orm,
    driver: deps.db.driver,
    mailer: deps.mailer,
    clock: deps.clock,
    config: deps.config,
    logger,
    version: readVersion(),
    sessionKey: deps.sessionKey,
    passwordParams: deps.passwordParams ?? DEFAULT_SCRYPT,
    grader,
    documents,
    backup: deps.db.dump ?? null,
    jobQueue: deps.jobQueue,
  };

  const app = express();
  app.disable('x-powered-by');
  // No ETag on `res.send`/`res.json`: every API answer is `no-store`, so a hash of each body (a whole
  // program document on a load or a save) was work nobody used. Static files keep theirs (serve-static).
  app.disable('etag');
  app.set('trust proxy', trustProxySetting(deps.config.TRUST_PROXY));
  app.use(securityHeaders());
  app.use(requestLogging(logger));
  app.use(refuseUnknownHosts(deps.config));

  const api = express.Router();
  api.use(noStore);
  api.use(requireSameOrigin);
  api.use(authenticate(ctx));
  api.use(expensiveCallLimits(ctx));
  api.use(healthRouter(ctx));
  // Uploads read multipart bodies, so they come before the JSON-only rule.
  api.use(uploadsRouter(ctx));
  api.use(labAttachmentsRouter(ctx));
  api.use(requireJsonBody);
  api.use(express.json({ limit: '1mb', verify: refuseDeepJson }));
  api.use(refuseNulCharacters);
  // Programs first among the JSON routers: loads and saves are most of the traffic, and every
  // router ahead of them is one more stack of paths each request is matched against. No router
  // before or after shares a path with it (drafts and proof sheets have their own sub-paths).
  api.use(programsRouter(ctx));
  api.use(authRouter(ctx));
  api.use(signUpRouter(ctx));
  api.use(invitationsRouter(ctx));
  api.use(adminRouter(ctx));
  api.use(adminStatusRouter(ctx));
  api.use(draftsRouter(ctx));
  api.use(proofSheetsRouter(ctx));
  api.use(classesRouter(ctx));
  api.use(labsRouter(ctx));
  api.use(submissionsRouter(ctx));
  api.use(gradebookRouter(ctx));
  api.use(teachingRouter(ctx));
  api.use(adminConsoleRouter(ctx));
  api.use(apiNotFound);
  app.use('/api', api);

  if (deps.clientDir) app.use(clientFiles(deps.clientDir));
  app.use((req, res) => sendFailure(res, { code: 'not_found', message: `Nothing at ${req.method} ${req.path}` }));
  app.use(errorHandler((err) => logger.error({ err }, 'unhandled error')));
  return app;
}
