/**
 * The job queues on a PostgreSQL server (DATABASE_URL): pg-boss keeps the jobs in its own schema
 * (`pgboss`) of the same database. Two queues: gradings, and the mail outbox.
 *
 * Gradings. An app process stores a submission and its job in one
 * transaction, so a job exists exactly when a submission waits for it (none is lost if the process
 * dies between the two). `npm run worker` processes take jobs and grade them with the same code and
 * the same 5 s bound as the in-process pool. A worker that dies mid-job (SIGKILL, a lost machine)
 * leaves its job active; past `expireInSeconds` pg-boss's maintenance hands it to another worker, up
 * to `RETRY_LIMIT` times. Writing the grade is conditional on the submission still waiting
 * (`services/queuedGrading.ts`), so a job delivered twice is graded once.
 *
 * The mail outbox: an app process hands each message to the queue instead of talking SMTP itself;
 * the workers send it (or store it in the local mailbox when SMTP_URL is unset), retrying with
 * back-off while the relay refuses, so a message survives the app process that wrote it.
 *
 * With PGlite there is no queue: the server grades in its own worker threads and sends its mail
 * itself, as before.
 */
import PgBoss from 'pg-boss';
import { sql, type SQL } from 'drizzle-orm';
import { executeRows, type Db } from '../db/client';
import type { OutgoingMail } from '../mail/mailer';
import { GRADING_TIMEOUT_MS } from '../grading/pool';

/** The queue's name in pg-boss. */
export const GRADING_QUEUE = 'grade-submission';

/** A grading's wall-clock bound in seconds (`GRADING_TIMEOUT_MS` of the pool). */
const GRADING_BOUND_S = GRADING_TIMEOUT_MS / 1000;

/** Deliveries of one job after the first: a crashed worker's job is tried again this often, then fails. */
export const RETRY_LIMIT = 3;

/** The mail outbox's queue. */
export const MAIL_QUEUE = 'send-mail';

/** Messages a worker takes per poll: a few seconds of SMTP at most, well inside their expiry. */
const MAIL_BATCH = 20;

/** A mail relay may refuse for a while: 8 tries with back-off from 30 s cover about two hours. */
const MAIL_RETRY = { retryLimit: 8, retryDelay: 30, retryBackoff: true };

/** What a job carries: only the id; the worker reads the rest from the database. */
export interface GradingJobData {
  submissionId: string;
}

export interface JobQueueOptions {
  url: string;
  /** A job active longer than this counts as lost and is delivered again. */
  expireInSeconds: number;
  /** How often expired jobs are looked for (only processes that `supervise` do it). */
  maintenanceIntervalSeconds: number;
  /** Whether this process runs pg-boss's maintenance (workers do; app processes only send). */
  supervise: boolean;
  /** pg-boss's own errors (a lost connection while polling), for the log. */
  onError?: (err: Error) => void;
}

/** A job being handled by this worker. */
export interface ReceivedJob {
  id: string;
  submissionId: string;
  /** 0 on the first delivery; more after a worker died with it. */
  retryCount: number;
}

export interface JobQueue {
  /** Adds a grading job inside the caller's transaction (`tx`), so it commits or rolls back with the submission. */
  enqueueGrading(tx: Db, submissionId: string): Promise<void>;
  /** Takes grading jobs for `concurrency` threads until `stop()`; a handler that throws fails its job (retried). */
  workGradings(concurrency: number, handle: (job: ReceivedJob) => Promise<void>): Promise<void>;
  /** Puts a message in the outbox. */
  enqueueMail(mail: OutgoingMail): Promise<void>;
  /** Sends the outbox's messages with `send` until `stop()`; one that throws is tried again later. */
  workMail(send: (mail: OutgoingMail) => Promise<void>): Promise<void>;
  stop(): Promise<void>;
}

/**
 * pg-boss's SQL (text with `$1`…`$n`) run through Drizzle on the caller's handle, so a job can be
 * inserted inside a Drizzle transaction. Each `$n` becomes a bound parameter again.
 */
function drizzleExecutor(db: Db): PgBoss.Db {
  return {
    async executeSql(text: string, values: unknown[] = []) {
      const parts = text.split(/\$(\d+)/);
      const chunks: SQL[] = [];
      // pg-boss passes undefined for an option not given; as a bound value that is NULL.
      parts.forEach((part, i) => chunks.push(i % 2 === 0 ? sql.raw(part) : sql`${sql.param(values[Number(part) - 1] ?? null)}`));
      return { rows: await executeRows(db, sql.join(chunks, sql.raw(''))) };
    },
  };
}

export async function openJobQueue(options: JobQueueOptions): Promise<JobQueue> {
  const boss = new PgBoss({
    connectionString: options.url,
    // A few connections: sends go through the caller's transaction, polling needs one or two.
    max: 4,
    supervise: options.supervise,
    schedule: false,
    maintenanceIntervalSeconds: options.maintenanceIntervalSeconds,
  });
  boss.on('error', (err) => options.onError?.(err));
  // start() creates or migrates pg-boss's schema under its own advisory lock: safe from many processes.
  await boss.start();
  await ensureQueue(boss, GRADING_QUEUE, { retryLimit: RETRY_LIMIT, retryDelay: 0, expireInSeconds: options.expireInSeconds });
  await ensureQueue(boss, MAIL_QUEUE, { ...MAIL_RETRY, expireInSeconds: 120 });
  const sendOptions = { retryLimit: RETRY_LIMIT, retryDelay: 0, expireInSeconds: options.expireInSeconds };
  return {
    async enqueueGrading(tx, submissionId) {
      const data: GradingJobData = { submissionId };
      const id = await boss.send(GRADING_QUEUE, { ...data }, { ...sendOptions, db: drizzleExecutor(tx) });
      if (!id) throw new Error(`the grading job of submission ${submissionId} was not created`);
    },
    async workGradings(concurrency, handle) {
      // pg-boss polls at most every 0.5 s and waits out the rest of the interval after each batch,
      // so one job per fetch would cap a worker at two gradings a second. A batch is graded on all
      // threads at once; it is sized so that even a batch of runaway gradings (5 s each, one thread
      // after another) ends before its jobs expire and would be handed out again.
      const perThread = Math.max(1, Math.min(8, Math.floor(options.expireInSeconds / (GRADING_BOUND_S * 1.5))));
      await boss.work<GradingJobData>(GRADING_QUEUE, { batchSize: perThread * concurrency, includeMetadata: true, pollingIntervalSeconds: 0.5 }, async (jobs) => {
        const outcomes = await Promise.allSettled(jobs.map((job) => handle({ id: job.id, submissionId: job.data.submissionId, retryCount: job.retryCount })));
        // The batch completes as a whole when this returns; a job whose handling failed is failed
        // first, so it goes back to the queue (retried) instead of counting as done.
        const failed = jobs.filter((_, i) => outcomes[i]!.status === 'rejected').map((job) => job.id);
        if (failed.length > 0) await boss.fail(GRADING_QUEUE, failed);
      });
    },
    async enqueueMail(mail) {
      const id = await boss.send(MAIL_QUEUE, { ...mail }, { ...MAIL_RETRY, expireInSeconds: 120 });
      if (!id) throw new Error(`the message to ${mail.to} was not queued`);
    },
    async workMail(send) {
      // A batch per poll (a class's invitations arrive together), sent one after another; a message
      // the relay refused goes back to the queue alone.
      await boss.work<OutgoingMail>(MAIL_QUEUE, { batchSize: MAIL_BATCH, pollingIntervalSeconds: 0.5 }, async (jobs) => {
        const failed: string[] = [];
        for (const job of jobs) await send(job.data).catch(() => failed.push(job.id));
        if (failed.length > 0) await boss.fail(MAIL_QUEUE, failed);
      });
    },
    async stop() {
      await boss.stop({ graceful: true, wait: true, timeout: 10_000 });
    },
  };
}

/** Creates a queue once; another process creating it at the same moment is not an error. */
async function ensureQueue(boss: PgBoss, name: string, options: Omit<PgBoss.Queue, 'name'>): Promise<void> {
  if (await boss.getQueue(name)) return;
  try {
    await boss.createQueue(name, { name, policy: 'standard', ...options });
  } catch (err) {
    if (!(await boss.getQueue(name))) throw err;
  }
}
