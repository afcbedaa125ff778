/**
 * `createTestApp()`: the real app on a fresh in-memory copy of the migrated template, a fake clock,
 * the real local SMTP fake, listening on loopback so requests carry a stable Host/Origin.
 */
import { readFileSync } from 'node:fs';
import type { AddressInfo } from 'node:net';
import type { Server } from 'node:http';
import { inject } from 'vitest';
import request from 'supertest';
import { createApp } from '../../../server/app';
import { readConfig, type Config } from '../../../server/config';
import { openDatabase, type Database } from '../../../server/db/client';
import { openMailer } from '../../../server/mail/openMailer';
import type { Mailer } from '../../../server/mail/mailer';
import { createLogger } from '../../../server/http/logging';
import { copyTemplateDatabase } from './postgresDatabases';
import { createFakeClock, type FakeClock } from './fakeClock';
import type { ScryptParams } from '../../../server/auth/passwords';
import { createGradingPool, type Grader } from '../../../server/grading/pool';

/** Cheap hashes keep tests fast; the production cost is measured in the benchmark, not here. */
export const TEST_SCRYPT: ScryptParams = { N: 1024, r: 8, p: 1 };

export interface TestApp {
  server: Server;
  /** `http://127.0.0.1:<port>`; also the Origin state-changing requests must send. */
  origin: string;
  database: Database;
  clock: FakeClock;
  mailer: Mailer;
  config: Config;
  /** supertest bound to the listening server. */
  http: ReturnType<typeof request>;
  /** The app's grader (the pool this helper made, or the one passed in). */
  grader: Grader;
  /** Stops the server, the grader's workers, the mailer and the database. */
  close(): Promise<void>;
}

export interface TestAppOptions {
  /** Grades the app's submissions; default a fresh worker pool. Closed by `close()` either way. */
  grader?: Grader;
  /** A built client to serve after the API, as `npm start` does with `dist`. */
  clientDir?: string;
  /** Wraps the real mailer the app sends through (e.g. to hold mail back and see what waits for it). */
  wrapMailer?: (mailer: Mailer) => Mailer;
}

/** True in the `api-pg` project (the API tests on a PostgreSQL server). */
export function onPostgres(): boolean {
  return Boolean(inject('pgTemplate'));
}

/**
 * A fresh copy of the migrated template: in the `api` project an in-memory PGlite loaded from the
 * dump globalSetup wrote; in `api-pg` a new PostgreSQL database copied from the template database
 * (dropped when the returned database is closed).
 */
export async function openTemplateDatabase(): Promise<Database> {
  if (onPostgres()) {
    const copy = await copyTemplateDatabase(inject('pgAdminUrl'), inject('pgTemplate'));
    const database = await openDatabase({ kind: 'postgres', url: copy.url, poolSize: 10 }, { migrate: false });
    return {
      ...database,
      async close() {
        await database.close();
        await copy.drop();
      },
    };
  }
  const bytes = readFileSync(inject('templateDumpPath'));
  return openDatabase({ kind: 'dump', dump: new Blob([bytes]) }, { migrate: false });
}

export async function createTestApp(env: Record<string, string> = {}, options: TestAppOptions = {}): Promise<TestApp> {
  const configResult = readConfig({ NODE_ENV: 'test', LOG_LEVEL: 'silent', DATA_DIR: '.tmp/unused', AUTH_RATE_LIMIT: '1000', ...env });
  if (!configResult.ok) throw new Error(configResult.error);
  const config = configResult.config;
  const database = await openTemplateDatabase();
  const clock = createFakeClock();
  const mailer = await openMailer(config, database.orm, clock);
  const grader = options.grader ?? createGradingPool();
  const app = createApp({
    grader,
    db: database,
    mailer: options.wrapMailer ? options.wrapMailer(mailer) : mailer,
    clock,
    config,
    logger: createLogger('silent'),
    sessionKey: new TextEncoder().encode('test-session-key-0123456789abcdef'),
    passwordParams: TEST_SCRYPT,
    clientDir: options.clientDir,
  });
  const server = await new Promise<Server>((resolve) => {
    const s = app.listen(0, '127.0.0.1', () => resolve(s));
  });
  const { port } = server.address() as AddressInfo;
  return {
    server,
    origin: `http://127.0.0.1:${port}`,
    database,
    clock,
    mailer,
    config,
    http: request(server),
    grader,
    async close() {
      await new Promise<void>((resolve) => server.close(() => resolve()));
      await grader.close();
      await mailer.close();
      await database.close();
    },
  };
}
