/**
 * The grading queue on PostgreSQL: an app process stores a submission as `submitted` with its job,
 * a `npm run worker` process grades it, and the student's list (read from another app process)
 * follows the status. A worker killed with SIGKILL in the middle of a job leaves it to another
 * worker, which grades it once. Mail written by an app process goes through the outbox.
 */
import { afterAll, beforeAll, describe, expect, it } from 'vitest';
import { eq, sql } from 'drizzle-orm';
import { FORWARD_REVERSE } from '@shared/labs';
import { hashPassword } from '../../../server/auth/passwords';
import { executeRows, openDatabase, type Database } from '../../../server/db/client';
import { insertUser, type User } from '../../../server/db/users';
import { enrol, insertClass } from '../../../server/db/classes';
import { insertLab } from '../../../server/db/labs';
import { insertProgram } from '../../../server/db/programs';
import { gradeHistory, submissions } from '../../../server/db/schema';
import { openJobQueue, type JobQueue } from '../../../server/jobs/jobQueue';
import type { ServerProcess } from '../helpers/serverProcess';
import { PASSWORD, sessionCookieOf } from '../helpers/fixtures';
import { TEST_SCRYPT } from '../helpers/testApp';
import { freshDatabase } from '../helpers/pgTemplate';
import { request, sharedEnv, startApp, startWorker, stopProcess, type WorkerProcess } from '../helpers/postgresProcesses';

/** Short, so a dead worker's job comes back within seconds (production default: 60 s, checked every 15 s). */
const QUEUE_ENV = { GRADING_JOB_EXPIRE_SECONDS: '3', GRADING_QUEUE_CHECK_SECONDS: '1' };

let drop: () => Promise<void>;
let database: Database;
let queue: JobQueue;
let a: ServerProcess;
let b: ServerProcess;
const workers: WorkerProcess[] = [];
let env: Record<string, string>;
let labId: string;
let programId: string;
let cookie: string;

async function addUser(email: string, role: User['role']): Promise<User> {
  const user = await insertUser(database.orm, { email, name: email.split('@')[0], role, passwordHash: await hashPassword(PASSWORD, TEST_SCRYPT), createdAt: new Date() });
  if (!user) throw new Error(`${email} exists`);
  return user;
}

beforeAll(async () => {
  const fresh = await freshDatabase();
  drop = fresh.drop;
  database = await openDatabase({ kind: 'postgres', url: fresh.url, poolSize: 2 }, { migrate: false });
  const now = new Date();
  const teacher = await addUser('teacher@test.example', 'instructor');
  await addUser('admin@test.example', 'admin');
  const student = await addUser('student@test.example', 'student');
  const cls = await insertClass(database.orm, { name: 'Motor Control', term: 'Fall 2026', instructorId: teacher.id, joinCode: 'PGQU-CODE', now });
  if (!cls) throw new Error('class not created');
  await enrol(database.orm, cls.id, student.id, now);
  const lab = await insertLab(database.orm, {
    classId: cls.id,
    authorId: teacher.id,
    title: 'Forward / reverse',
    panel: { kind: 'builtIn', id: FORWARD_REVERSE.panel },
    starterKind: 'template',
    starterDocument: FORWARD_REVERSE.starter,
    checkScript: FORWARD_REVERSE.script,
    totalPoints: 10,
    createdAt: now,
    updatedAt: now,
    publishedAt: now,
  });
  labId = lab.id;
  const program = await insertProgram(database.orm, { ownerId: student.id, authorId: student.id, title: 'Mine', labId: null, document: FORWARD_REVERSE.solution, message: 'Created', now });
  programId = program.program.id;
  env = sharedEnv(fresh.url, QUEUE_ENV);
  [a, b] = await Promise.all([startApp(env), startApp(env)]);
  const signedIn = await request(a.url, 'POST', '/api/auth/sign-in', { body: { email: 'student@test.example', password: PASSWORD } });
  cookie = sessionCookieOf(signedIn.setCookie ?? undefined);
  queue = await openJobQueue({ url: fresh.url, expireInSeconds: 3, maintenanceIntervalSeconds: 1, supervise: false });
}, 120_000);

afterAll(async () => {
  await Promise.all([a, b, ...workers].filter(Boolean).map((p) => stopProcess(p)));
  await queue?.stop();
  await database?.close();
  await drop?.();
});

async function submit(): Promise<{ id: string; status: string }> {
  const res = await request(a.url, 'POST', `/api/labs/${labId}/submissions`, { cookie, body: { programId, version: 1 } });
  expect(res.status).toBe(201);
  return res.body.submission;
}

/** What the student's page polls, asked of the other app process, until `until` holds. */
async function pollMine(id: string, until: (status: string) => boolean, timeoutMs = 40_000): Promise<{ status: string; autoScore: number | null }> {
  const deadline = Date.now() + timeoutMs;
  for (;;) {
    const res = await request(b.url, 'GET', `/api/labs/${labId}/submissions/mine`, { cookie });
    const mine = (res.body.submissions as { id: string; status: string; autoScore: number | null }[]).find((s) => s.id === id);
    if (mine && until(mine.status)) return mine;
    if (Date.now() > deadline) throw new Error(`submission ${id} still ${mine?.status} after ${timeoutMs} ms`);
    await new Promise((resolve) => setTimeout(resolve, 200));
  }
}

async function jobOf(submissionId: string): Promise<{ id: string; state: string; retry_count: number }> {
  const list = await executeRows<{ id: string; state: string; retry_count: number }>(
    database.orm,
    sql`select id, state, retry_count from pgboss.job where data->>'submissionId' = ${submissionId}
        union all select id, state, retry_count from pgboss.archive where data->>'submissionId' = ${submissionId}`,
  );
  expect(list).toHaveLength(1);
  return list[0]!;
}

describe('the grading queue', () => {
  it('answers a submission as `submitted`, and a worker grades it while the page polls another process', async () => {
    workers.push(await startWorker(env));
    const submitted = await submit();
    expect(submitted.status).toBe('submitted');
    const graded = await pollMine(submitted.id, (s) => s !== 'submitted');
    expect(graded.status).toBe('graded');
    // The reference solution passes every check of its own lab: full marks.
    expect(graded.autoScore).toBe(10);
    expect((await jobOf(submitted.id)).state).toBe('completed');
    await stopProcess(workers.pop()!);
  });

  it('hands the job of a worker killed mid-job to another worker, which grades it exactly once', async () => {
    const doomed = await startWorker({ ...env, GRADING_TEST_HOLD_MS: '600000' });
    workers.push(doomed);
    const submitted = await submit();
    await doomed.waitFor(new RegExp(`submission ${submitted.id} delivery 1`));
    doomed.child.kill('SIGKILL');
    expect(await doomed.exited).toBe('SIGKILL');
    expect((await jobOf(submitted.id)).state).toBe('active');

    const rescuer = await startWorker(env);
    workers.push(rescuer);
    const graded = await pollMine(submitted.id, (s) => s !== 'submitted');
    expect(graded).toMatchObject({ status: 'graded', autoScore: 10 });
    await rescuer.waitFor(new RegExp(`submission ${submitted.id}: graded`));
    expect(rescuer.stdout()).toContain(`submission ${submitted.id} delivery 2`);
    expect(doomed.stdout()).not.toContain(`submission ${submitted.id}:`);

    // Long enough for another expiry and maintenance round: no third delivery, no second grade.
    await new Promise((resolve) => setTimeout(resolve, 5000));
    const job = await jobOf(submitted.id);
    expect(job).toMatchObject({ state: 'completed', retry_count: 1 });
    expect(rescuer.stdout().match(new RegExp(`submission ${submitted.id} delivery`, 'g'))).toHaveLength(1);
    const [row] = await database.orm.select().from(submissions).where(eq(submissions.id, submitted.id));
    expect(row).toMatchObject({ status: 'graded', autoScore: 10 });
    expect(await database.orm.select().from(gradeHistory).where(eq(gradeHistory.submissionId, submitted.id))).toHaveLength(0);
    // The next test needs to know which worker takes its job: this one leaves.
    await stopProcess(rescuer);
    workers.splice(workers.indexOf(rescuer), 1);
    workers.splice(workers.indexOf(doomed), 1);
  });

  it('writes a job delivered again after its grade only once (the grade is conditional on `submitted`)', async () => {
    // The only worker running, so it is the one that takes the job again.
    expect(workers).toHaveLength(0);
    const worker = await startWorker(env);
    workers.push(worker);
    const submitted = await submit();
    await pollMine(submitted.id, (s) => s !== 'submitted');
    const [before] = await database.orm.select().from(submissions).where(eq(submissions.id, submitted.id));
    // The same job sent again, as a retry after a lost acknowledgement would.
    await database.orm.transaction((tx) => queue.enqueueGrading(tx, submitted.id));
    await worker.waitFor(new RegExp(`submission ${submitted.id}: already-graded`));
    const [after] = await database.orm.select().from(submissions).where(eq(submissions.id, submitted.id));
    expect(after!.gradedAt).toEqual(before!.gradedAt);
  });
});

describe('the mail outbox', () => {
  it('sends a message queued by one app process through a worker, into the mailbox the other process shows', async () => {
    const worker = await startWorker(env);
    workers.push(worker);
    const asked = await request(a.url, 'POST', '/api/auth/password-reset', { body: { email: 'student@test.example' } });
    expect(asked.status).toBe(202);
    const admin = await request(b.url, 'POST', '/api/auth/sign-in', { body: { email: 'admin@test.example', password: PASSWORD } });
    const adminCookie = sessionCookieOf(admin.setCookie ?? undefined);
    const deadline = Date.now() + 30_000;
    let found: { to: string; subject: string; text: string } | undefined;
    while (!found && Date.now() < deadline) {
      const mailbox = await request(b.url, 'GET', '/api/dev/mail', { cookie: adminCookie });
      expect(mailbox.status).toBe(200);
      found = (mailbox.body.mail as { to: string; subject: string; text: string }[]).find((m) => m.to.includes('student@test.example'));
      if (!found) await new Promise((resolve) => setTimeout(resolve, 200));
    }
    expect(found?.text).toMatch(/#token=/);
    // The worker marks the job completed after the mail server took the message: the mailbox can show it first.
    const outboxStates = async () =>
      (await executeRows<{ state: string }>(database.orm, sql`select state from pgboss.job where name = 'send-mail' union all select state from pgboss.archive where name = 'send-mail'`)).map((j) => j.state);
    await expect.poll(outboxStates, { timeout: 30_000, interval: 200 }).toEqual(['completed']);
  });
});
