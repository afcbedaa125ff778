/**
 * Scale-out benchmark (issue 20): gradings per second and the p99 of saves at 50 connections,
 * with the real processes on loopback, three ways:
 * - PGlite: one server process (grading in its worker threads), as `npm start`;
 * - PostgreSQL, 1 app process + 1 `npm run worker`;
 * - PostgreSQL, 2 app processes + 2 workers.
 * Gradings: SUBMISSIONS submissions of the forward/reverse lab's reference solution sent by CLIENTS
 * clients (round-robin over the app processes), timed until the last is graded (on PGlite the
 * answer is the grade; on PostgreSQL the database is polled every 50 ms). Saves: autocannon with
 * 50 connections in all, split evenly over the app processes (one autocannon each), every
 * connection saving on its own program; the p99 given is the worst process's.
 * Plus what decided "no row caches on PostgreSQL": the session check's cost per request on
 * PostgreSQL (one joined query) and how late a LISTEN/NOTIFY invalidation reaches another process.
 *
 * PostgreSQL: BENCH_DATABASE_URL (an admin URL of a cluster), else a throwaway durable cluster
 * started with `.ci/postgres-cluster` (needs Debian's postgresql); without either the PostgreSQL
 * cases say so and are skipped. The machine has two cores: compare the rows, not the numbers.
 */
import { execFileSync } from 'node:child_process';
import { randomBytes } from 'node:crypto';
import { rmSync } from 'node:fs';
import autocannon from 'autocannon';
import pg from 'pg';
import { FORWARD_REVERSE } from '@shared/labs';
import type { BenchCase } from './run';
import { percentile, round } from './stats';
import { DEMO_INSTRUCTOR, DEMO_STUDENTS } from '../../server/db/demoAccounts';
import { makeTempDataDir, startServerProcess, type ServerProcess } from '../api/helpers/serverProcess';
import { startWorker, stopProcess, SHARED_SECRET, type WorkerProcess } from '../api/helpers/postgresProcesses';
import { databaseUrl } from '../api/helpers/postgresDatabases';
import { documentWithRungs } from '../api/helpers/fixtures';

// eslint-disable-next-line @typescript-eslint/no-explicit-any -- a load driver reads a few fields of many shapes
type Json = any;

const SUBMISSIONS = 200;
const CLIENTS = 8;
const CONNECTIONS = 50;
const DURATION_S = 10;

async function send(url: string, method: string, path: string, body: unknown, cookie = ''): Promise<{ status: number; body: Json; cookie: string }> {
  const res = await fetch(`${url}${path}`, { method, headers: { 'content-type': 'application/json', origin: url, cookie }, body: body === undefined ? undefined : JSON.stringify(body) });
  const text = await res.text();
  return { status: res.status, body: text ? JSON.parse(text) : null, cookie: (res.headers.get('set-cookie') ?? '').split(';')[0] };
}

interface Setup {
  apps: ServerProcess[];
  workers: WorkerProcess[];
  /** Counts graded submissions (PostgreSQL); null when the submit answer is the grade (PGlite). */
  countGraded: (() => Promise<number>) | null;
  close(): Promise<void>;
}

/** A lab with the forward/reverse script, and a student's saved reference solution to submit. */
async function prepareLab(url: string): Promise<{ labId: string; ref: { programId: string; version: number }; student: string }> {
  const teacher = (await send(url, 'POST', '/api/auth/sign-in', { email: DEMO_INSTRUCTOR.email, password: DEMO_INSTRUCTOR.password })).cookie;
  const classId = (await send(url, 'GET', '/api/classes', undefined, teacher)).body.classes[0].id as string;
  const lab = await send(url, 'POST', `/api/classes/${classId}/labs/from-template`, { templateId: 'forward-reverse' }, teacher);
  if (lab.status !== 201) throw new Error(`setup: ${lab.status} ${JSON.stringify(lab.body)}`);
  const labId = lab.body.lab.id as string;
  await send(url, 'POST', `/api/labs/${labId}/publish`, {}, teacher);
  const student = (await send(url, 'POST', '/api/auth/sign-in', { email: DEMO_STUDENTS[0].email, password: DEMO_STUDENTS[0].password })).cookie;
  const opened = await send(url, 'POST', `/api/labs/${labId}/open`, {}, student);
  const saved = await send(url, 'POST', `/api/programs/${opened.body.program.id}/versions`, { baseVersion: opened.body.program.headVersion, document: FORWARD_REVERSE.solution }, student);
  return { labId, ref: { programId: opened.body.program.id, version: saved.body.version.number }, student };
}

async function gradingsPerSecond(setup: Setup): Promise<{ gradingsPerS: number; submitP99Ms: number; errors: number }> {
  const primary = setup.apps[0]!.url;
  const { labId, ref, student } = await prepareLab(primary);
  // Warm-up: workers' threads and the first queries.
  await send(primary, 'POST', `/api/labs/${labId}/submissions`, ref, student);
  const gradedBefore = setup.countGraded ? await waitForGraded(setup.countGraded, 1, 0) : 0;
  const latencies: number[] = [];
  let errors = 0;
  let next = 0;
  const started = performance.now();
  await Promise.all(
    Array.from({ length: CLIENTS }, async (_, client) => {
      while (next < SUBMISSIONS) {
        next += 1;
        const url = setup.apps[client % setup.apps.length]!.url;
        const t0 = performance.now();
        const res = await send(url, 'POST', `/api/labs/${labId}/submissions`, ref, student);
        latencies.push(performance.now() - t0);
        if (res.status !== 201) errors += 1;
        else if (!setup.countGraded && res.body.submission.autoScore !== res.body.submission.totalPoints) errors += 1;
      }
    }),
  );
  if (setup.countGraded) await waitForGraded(setup.countGraded, gradedBefore + SUBMISSIONS - errors, 50);
  const seconds = (performance.now() - started) / 1000;
  return { gradingsPerS: round(SUBMISSIONS / seconds, 1), submitP99Ms: round(percentile(latencies, 99), 1), errors };
}

async function waitForGraded(count: () => Promise<number>, atLeast: number, pollMs: number): Promise<number> {
  const deadline = Date.now() + 300_000;
  for (;;) {
    const n = await count();
    if (n >= atLeast) return n;
    if (Date.now() > deadline) throw new Error(`only ${n} of ${atLeast} submissions graded after 300 s`);
    await new Promise((resolve) => setTimeout(resolve, pollMs || 200));
  }
}

/** 50 connections in all, split over the app processes; each connection saves on its own program. */
async function saveLoad(setup: Setup): Promise<{ savesPerS: number; saveP99Ms: number; errors: number }> {
  const document = documentWithRungs(12, 'Bench conveyor');
  const perApp = Math.floor(CONNECTIONS / setup.apps.length);
  const student = DEMO_STUDENTS[1]!;
  const runs = await Promise.all(
    setup.apps.map(async (app) => {
      const { cookie } = await send(app.url, 'POST', '/api/auth/sign-in', { email: student.email, password: student.password });
      const heads = new Map<string, number>();
      for (let i = 0; i < perApp; i += 1) {
        const created = await send(app.url, 'POST', '/api/programs', { title: `Bench ${i}`, document }, cookie);
        if (created.status !== 201) throw new Error(`setup: ${created.status}`);
        heads.set(created.body.program.id as string, 1);
      }
      const idle = [...heads.keys()];
      return { app, cookie, heads, idle };
    }),
  );
  const results = await Promise.all(
    runs.map(({ app, cookie, heads, idle }) =>
      autocannon({
        url: app.url,
        connections: perApp,
        duration: DURATION_S,
        headers: { cookie, origin: app.url, 'content-type': 'application/json' },
        requests: [
          {
            method: 'POST',
            setupRequest: (req, ctx) => {
              const context = ctx as { programId?: string };
              const programId = idle.pop() ?? [...heads.keys()][0]!;
              context.programId = programId;
              return { ...req, path: `/api/programs/${programId}/versions`, body: JSON.stringify({ baseVersion: heads.get(programId), document, message: 'bench' }) };
            },
            onResponse: (status, body, ctx) => {
              const context = ctx as { programId: string };
              if (status === 201) heads.set(context.programId, (JSON.parse(body) as { version: { number: number } }).version.number);
              idle.push(context.programId);
            },
          },
        ],
      }),
    ),
  );
  return {
    savesPerS: round(results.reduce((sum, r) => sum + r.requests.average, 0), 1),
    saveP99Ms: Math.max(...results.map((r) => r.latency.p99)),
    errors: results.reduce((sum, r) => sum + r.errors + r.timeouts + r.non2xx, 0),
  };
}

async function pgliteSetup(): Promise<Setup> {
  const dataDir = makeTempDataDir();
  const app = await startServerProcess(dataDir, { LOG_LEVEL: 'warn' });
  return {
    apps: [app],
    workers: [],
    countGraded: null,
    async close() {
      await stopProcess(app);
      rmSync(dataDir, { recursive: true, force: true });
    },
  };
}

async function postgresSetup(adminUrl: string, appCount: number, workerCount: number): Promise<Setup> {
  const name = `rw_bench_${randomBytes(4).toString('hex')}`;
  const admin = new pg.Client({ connectionString: adminUrl });
  await admin.connect();
  await admin.query(`create database ${name}`);
  const url = databaseUrl(adminUrl, name);
  const env = { DATABASE_URL: url, JWT_SECRET: SHARED_SECRET, LOG_LEVEL: 'warn', DEMO: 'on' };
  // The first app migrates and seeds; the others start after it (they would wait on the lock anyway).
  const apps = [await startServerProcess(makeTempDataDir(), env)];
  for (let i = 1; i < appCount; i += 1) apps.push(await startServerProcess(makeTempDataDir(), env));
  const workers = await Promise.all(Array.from({ length: workerCount }, () => startWorker({ ...env, NODE_ENV: 'production', GRADING_THREADS: '1' })));
  const counter = new pg.Client({ connectionString: url });
  await counter.connect();
  return {
    apps,
    workers,
    countGraded: async () => Number((await counter.query<{ n: string }>(`select count(*) as n from submissions where status = 'graded'`)).rows[0]!.n),
    async close() {
      await counter.end();
      await Promise.all([...apps, ...workers].map((p) => stopProcess(p)));
      await admin.query(`drop database if exists ${name} with (force)`);
      await admin.end();
    },
  };
}

/** What a session check costs on PostgreSQL, and how late a LISTEN/NOTIFY invalidation arrives. */
async function cacheDecision(adminUrl: string): Promise<BenchCase> {
  const querying = new pg.Client({ connectionString: adminUrl });
  const listener = new pg.Client({ connectionString: adminUrl });
  await Promise.all([querying.connect(), listener.connect()]);
  try {
    await querying.query('create temp table s (id uuid primary key, user_id uuid, expires_at timestamptz, revoked_at timestamptz)');
    await querying.query('create temp table u (id uuid primary key, deactivated_at timestamptz)');
    await querying.query(`insert into u select gen_random_uuid(), null from generate_series(1, 2000)`);
    await querying.query(`insert into s select gen_random_uuid(), u.id, now() + interval '1 hour', null from u`);
    const { rows } = await querying.query<{ id: string; user_id: string }>('select id, user_id from s limit 1');
    const probe = rows[0]!;
    const checks: number[] = [];
    const cpu0 = process.cpuUsage();
    for (let i = 0; i < 2000; i += 1) {
      const t0 = performance.now();
      await querying.query('select u.id from s join u on u.id = s.user_id where s.id = $1 and s.user_id = $2 and s.revoked_at is null and s.expires_at > now() and u.deactivated_at is null limit 1', [probe.id, probe.user_id]);
      checks.push(performance.now() - t0);
    }
    const cpu = process.cpuUsage(cpu0);
    await listener.query('listen rw_bench_invalidate');
    const delays: number[] = [];
    for (let i = 0; i < 200; i += 1) {
      const arrived = new Promise<void>((resolve) => listener.once('notification', () => resolve()));
      const t0 = performance.now();
      await querying.query(`select pg_notify('rw_bench_invalidate', $1)`, [probe.id]);
      await arrived;
      delays.push(performance.now() - t0);
    }
    return {
      case: 'scale-out: session check on PostgreSQL vs a cache invalidated by LISTEN/NOTIFY',
      joinedCheckP50Ms: round(percentile(checks, 50), 3),
      joinedCheckP99Ms: round(percentile(checks, 99), 3),
      appCpuUsPerCheck: round((cpu.user + cpu.system) / checks.length, 1),
      notifyDelayP50Ms: round(percentile(delays, 50), 3),
      notifyDelayP99Ms: round(percentile(delays, 99), 3),
    };
  } finally {
    await Promise.all([querying.end(), listener.end()]);
  }
}

/** A throwaway durable cluster from `.ci/postgres-cluster`, or null when PostgreSQL is not installed. */
function startCluster(): { url: string; stop(): void } | null {
  try {
    const [dir, url] = execFileSync('bash', ['.ci/postgres-cluster', 'start'], { encoding: 'utf8' }).trim().split(' ');
    return { url: url!, stop: () => execFileSync('bash', ['.ci/postgres-cluster', 'stop', dir!]) };
  } catch {
    return null;
  }
}

export default async function (): Promise<BenchCase[]> {
  const cases: BenchCase[] = [];
  const configurations: { name: string; open: () => Promise<Setup> }[] = [{ name: 'PGlite, 1 process', open: pgliteSetup }];
  const cluster = process.env.BENCH_DATABASE_URL ? { url: process.env.BENCH_DATABASE_URL, stop: () => undefined } : startCluster();
  if (cluster) {
    configurations.push(
      { name: 'PostgreSQL, 1 app + 1 worker', open: () => postgresSetup(cluster.url, 1, 1) },
      { name: 'PostgreSQL, 2 apps + 2 workers', open: () => postgresSetup(cluster.url, 2, 2) },
    );
  } else {
    cases.push({ case: 'scale-out: PostgreSQL cases skipped', reason: 'no BENCH_DATABASE_URL and no Debian postgresql to start a cluster' });
  }
  try {
    for (const configuration of configurations) {
      const setup = await configuration.open();
      try {
        const grading = await gradingsPerSecond(setup);
        const saves = await saveLoad(setup);
        cases.push({ case: `scale-out: ${configuration.name}`, submissions: SUBMISSIONS, ...grading, connections: CONNECTIONS, durationS: DURATION_S, ...saves });
      } finally {
        await setup.close();
      }
    }
    if (cluster) cases.push(await cacheDecision(cluster.url));
  } finally {
    cluster?.stop();
  }
  const base = cases.find((c) => c.case === 'scale-out: PGlite, 1 process');
  for (const c of cases) {
    if (!base || c === base || typeof c.gradingsPerS !== 'number') continue;
    c.gradingsVsPGlite = round(c.gradingsPerS / (base.gradingsPerS as number), 2);
    c.saveP99VsPGlite = round((c.saveP99Ms as number) / (base.saveP99Ms as number), 2);
  }
  return cases;
}
