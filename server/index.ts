/**
 * The server process (`tsx server/index.ts`): check the environment, lock DATA_DIR, open and
 * migrate the database, seed a first start, start mail, serve the API and the built client.
 * With DATABASE_URL the database is a PostgreSQL server other processes share: no DATA_DIR lock,
 * migrations and seeding under an advisory lock, submissions graded through the queue.
 */
import type { AddressInfo } from 'node:net';
import { readConfig } from './config';
import { systemClock } from './clock';
import { acquireDataDirLock } from './dataDirLock';
import { openDatabase } from './db/client';
import { seedOnFirstStart } from './db/seed';
import { openMailer } from './mail/openMailer';
import { outboxMailer } from './mail/outbox';
import { createLogger } from './http/logging';
import { loadSessionKey } from './auth/sessionKey';
import { createApp } from './app';
import { allowedHostNames, LOOPBACK_NAMES } from './http/allowedHosts';
import { createGradingPool } from './grading/pool';
import { openJobQueue, type JobQueue } from './jobs/jobQueue';
import type { Database } from './db/client';

function fail(message: string): never {
  console.error(message);
  process.exit(1);
}

const configResult = readConfig(process.env);
if (!configResult.ok) fail(configResult.error);
const config = configResult.config;
const logger = createLogger(config.LOG_LEVEL);
let lock: { release(): void } | null = null;
let database: Database;
if (config.DATABASE_URL) {
  database = await openDatabase({ kind: 'postgres', url: config.DATABASE_URL, poolSize: config.DATABASE_POOL_SIZE, onPoolError: (err) => logger.warn({ err }, 'database connection lost') }).catch(
    (err: unknown) => fail(`Cannot open the database at DATABASE_URL: ${err instanceof Error ? err.message : String(err)}`),
  );
} else {
  const lockResult = acquireDataDirLock(config.DATA_DIR, systemClock.now());
  if (!lockResult.ok) fail(lockResult.error);
  const held = lockResult.lock;
  lock = held;
  process.on('exit', () => held.release());
  database = await openDatabase({ kind: 'directory', dataDir: config.DATA_DIR }).catch((err: unknown) =>
    fail(`Cannot open the database in ${config.DATA_DIR}: ${err instanceof Error ? err.message : String(err)}`),
  );
}
// Several processes may start together on one PostgreSQL database: one seeds, the others see users.
const firstStart = await database.exclusively(() => seedOnFirstStart(database.orm, systemClock, config.DEMO));
if (firstStart === 'seeded') logger.info('seeded the demo data on a first start (DEMO=off starts without it)');
if (firstStart === 'no-accounts') {
  console.log('Rungwright has no accounts yet (DEMO=off): create the first admin with `npm run cli -- create-admin --email you@example.org`.');
}
const sessionKey = loadSessionKey(config);
const jobQueue: JobQueue | undefined = config.DATABASE_URL
  ? await openJobQueue({
      url: config.DATABASE_URL,
      expireInSeconds: config.GRADING_JOB_EXPIRE_SECONDS,
      maintenanceIntervalSeconds: config.GRADING_QUEUE_CHECK_SECONDS,
      // The workers look after expired jobs; an app process only sends.
      supervise: false,
      onError: (err) => logger.warn({ err }, 'grading queue error'),
    })
  : undefined;
// On a shared database mail goes through the outbox, sent by the workers; here it is sent directly.
const mailer = jobQueue ? outboxMailer(jobQueue, config.SMTP_URL ? 'smtp' : 'local-fake') : await openMailer(config, database.orm, systemClock);

// Made here, not inside createApp, so shutdown can stop its worker threads.
const grader = createGradingPool();
// Listening everywhere while answering only to loopback names serves nobody else: say so.
if ((config.HOST === '0.0.0.0' || config.HOST === '::') && allowedHostNames(config).size === LOOPBACK_NAMES.length) {
  console.warn(
    `HOST=${config.HOST} listens on every network, but requests are answered only for ${LOOPBACK_NAMES.join(', ')}: ` +
      'set ALLOWED_HOSTS (or PUBLIC_URL) to the names or addresses people type.',
  );
}
const app = createApp({ db: database, mailer, clock: systemClock, config, logger, sessionKey, clientDir: 'dist', grader, jobQueue });
const server = app.listen(config.PORT, config.HOST, () => {
  const { port } = server.address() as AddressInfo;
  console.log(`Rungwright listening on http://${config.HOST}:${port}`);
});
server.on('error', (err) => fail(`Cannot listen on ${config.HOST}:${config.PORT}: ${err.message}`));

let stopping = false;
async function shutdown(signal: string): Promise<void> {
  if (stopping) return;
  stopping = true;
  logger.info({ signal }, 'shutting down');
  // Give in-flight requests a moment, then cut idle keep-alive connections.
  const force = setTimeout(() => process.exit(1), 5000);
  force.unref();
  await new Promise<void>((resolve) => {
    server.close(() => resolve());
    server.closeIdleConnections();
  });
  // Requests still waiting for a grading answer with a "shutting down" note; the workers end.
  await grader.close();
  await mailer.close();
  await jobQueue?.stop();
  await database.close();
  lock?.release();
  process.exit(0);
}
process.on('SIGTERM', () => void shutdown('SIGTERM'));
process.on('SIGINT', () => void shutdown('SIGINT'));
