/**
 * `npm run worker`: a worker for a shared PostgreSQL database (DATABASE_URL). It takes submissions
 * from the grading queue (`jobs/jobQueue.ts`) and grades them in its own pool of worker threads, as
 * many at once as it has threads (GRADING_THREADS), and sends the mail outbox's messages (SMTP, or
 * the local mailbox in the database when SMTP_URL is unset). Run as many of these processes as
 * the machines have cores to spare; stopping one (SIGTERM) finishes or hands back its jobs.
 */
import { readConfig } from './config';
import { systemClock } from './clock';
import { openDatabase } from './db/client';
import { createLogger } from './http/logging';
import { createGradingPool, defaultPoolSize } from './grading/pool';
import { openJobQueue } from './jobs/jobQueue';
import { gradeQueuedSubmission } from './services/queuedGrading';
import { openMailer } from './mail/openMailer';

function fail(message: string): never {
  console.error(message);
  process.exit(1);
}

const configResult = readConfig(process.env);
if (!configResult.ok) fail(configResult.error);
const config = configResult.config;
if (!config.DATABASE_URL) {
  fail('npm run worker grades from the queue of a PostgreSQL database: set DATABASE_URL. With the embedded database, `npm start` grades in its own process.');
}
const logger = createLogger(config.LOG_LEVEL);
const database = await openDatabase({ kind: 'postgres', url: config.DATABASE_URL, poolSize: config.DATABASE_POOL_SIZE, onPoolError: (err) => logger.warn({ err }, 'database connection lost') }).catch(
  (err: unknown) => fail(`Cannot open the database at DATABASE_URL: ${err instanceof Error ? err.message : String(err)}`),
);
const threads = config.GRADING_THREADS ?? defaultPoolSize();
const grader = createGradingPool({ size: threads });
await grader.warm();
const queue = await openJobQueue({
  url: config.DATABASE_URL,
  expireInSeconds: config.GRADING_JOB_EXPIRE_SECONDS,
  maintenanceIntervalSeconds: config.GRADING_QUEUE_CHECK_SECONDS,
  supervise: true,
  onError: (err) => logger.warn({ err }, 'grading queue error'),
});

let stopping = false;
let graderClosed = false;
// Tests only (NODE_ENV=test): hold each job this long before grading, so a test can kill a worker mid-job.
const holdMs = config.NODE_ENV === 'test' ? Number(process.env.GRADING_TEST_HOLD_MS ?? 0) : 0;
await queue.workGradings(threads, async (job) => {
  console.log(`grading job ${job.id} submission ${job.submissionId} delivery ${job.retryCount + 1}`);
  if (holdMs > 0) await new Promise((resolve) => setTimeout(resolve, holdMs));
  const result = await gradeQueuedSubmission({ orm: database.orm, grader, clock: systemClock, graderClosed: () => graderClosed }, job.submissionId);
  console.log(`job ${job.id} submission ${job.submissionId}: ${result}`);
});
const mailer = await openMailer(config, database.orm, systemClock);
await queue.workMail((mail) => mailer.send(mail));
console.log(`Rungwright grading worker ready (${threads} thread${threads === 1 ? '' : 's'})`);

async function shutdown(signal: string): Promise<void> {
  if (stopping) return;
  stopping = true;
  logger.info({ signal }, 'grading worker stopping');
  const force = setTimeout(() => process.exit(1), 15_000);
  force.unref();
  // Jobs under way finish first (graceful); then the threads stop.
  await queue.stop();
  graderClosed = true;
  await grader.close();
  await mailer.close();
  await database.close();
  process.exit(0);
}
process.on('SIGTERM', () => void shutdown('SIGTERM'));
process.on('SIGINT', () => void shutdown('SIGINT'));
