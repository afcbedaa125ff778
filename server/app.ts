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
import { createLogger, requestLogging } from './http/logging';
import { requireSameOrigin, securityHeaders } from './http/security';
import { apiNotFound, errorHandler, sendFailure } from './http/errorHandler';
import { clientFiles } from './http/clientFiles';
import { healthRouter } from './routes/health';

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
}

/** Builds the app: security headers, logging, the API under `/api`, then the client. */
export function createApp(deps: AppDependencies): Express {
  const logger = deps.logger ?? createLogger(deps.config.LOG_LEVEL);
  const ctx: AppContext = {
    orm: deps.db.orm,
    driver: deps.db.driver,
    mailer: deps.mailer,
    clock: deps.clock,
    config: deps.config,
    logger,
    version: readVersion(),
    sessionKey: deps.sessionKey,
  };

  const app = express();
  app.disable('x-powered-by');
  app.set('trust proxy', 'loopback');
  app.use(securityHeaders());
  app.use(requestLogging(logger));

  const api = express.Router();
  api.use(requireSameOrigin);
  api.use(express.json({ limit: '1mb' }));
  api.use(healthRouter(ctx));
  api.use(apiNotFound);
  app.use('/api', api);

  if (deps.clientDir) app.use(clientFiles(deps.clientDir));
  app.use((req, res) => sendFailure(res, { code: 'not_found', message: `Nothing at ${req.method} ${req.path}` }));
  app.use(errorHandler((err) => logger.error({ err }, 'unhandled error')));
  return app;
}
