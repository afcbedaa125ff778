/**
 * Grading benchmark (issue 8): 100 submissions graded through the API against the real server
 * process on loopback, back to back from a few concurrent clients (the forward/reverse lab, the
 * heaviest standard script). Target: above 100 gradings/s, zero errors; p50/p99 per submission.
 * A second case measures why the pool keeps warm workers: the cold start of one worker.
 * With `GRADING_BENCH_URL` set, the load goes to a server already running there (started by hand,
 * e.g. under `node --cpu-prof`, on a fresh DATA_DIR so it has the demo data) instead of a new one.
 */
import { readFileSync, rmSync } from 'node:fs';
import type { BenchCase } from './run';
import { percentile, round } from './stats';
import { DEMO_INSTRUCTOR, DEMO_STUDENTS } from '../../server/db/demoAccounts';
import { makeTempDataDir, startServerProcess } from '../api/helpers/serverProcess';
import { FORWARD_REVERSE } from '@shared/labs';
import { createGradingPool } from '../../server/grading/pool';

/** The answers read here, loosely typed: this is a load driver, not a contract test. */
// eslint-disable-next-line @typescript-eslint/no-explicit-any -- a load driver reads a few fields of many shapes
type Json = any;

const SUBMISSIONS = 100;
const CLIENTS = 4;

async function send(url: string, method: string, path: string, body: unknown, cookie = ''): Promise<{ status: number; body: Json; cookie: string }> {
  const res = await fetch(`${url}${path}`, { method, headers: { 'content-type': 'application/json', origin: url, cookie }, body: body === undefined ? undefined : JSON.stringify(body) });
  const text = await res.text();
  return { status: res.status, body: text ? JSON.parse(text) : null, cookie: (res.headers.get('set-cookie') ?? '').split(';')[0] };
}

/**
 * CPU time (user + system, all threads) the process `pid` has used so far, in ms, from
 * /proc/<pid>/stat fields 14 and 15 (proc(5); clock ticks, 100 per second on Linux, common practice).
 * On a loaded shared machine wall time says little; CPU per submission compares runs fairly.
 */
function cpuMsOf(pid: number): number | null {
  try {
    const fields = readFileSync(`/proc/${pid}/stat`, 'utf8').replace(/^.*\) /, '').split(' ');
    // After the ")" the fields start at field 3 (state), so utime (14) and stime (15) are at 11 and 12.
    return ((Number(fields[11]) + Number(fields[12])) * 1000) / 100;
  } catch {
    return null;
  }
}

export default async function (): Promise<BenchCase[]> {
  const external = process.env.GRADING_BENCH_URL;
  const dataDir = external ? null : makeTempDataDir();
  const server = external ? { url: external } : await startServerProcess(dataDir!, { LOG_LEVEL: 'warn' });
  try {
    const teacher = (await send(server.url, 'POST', '/api/auth/sign-in', { email: DEMO_INSTRUCTOR.email, password: DEMO_INSTRUCTOR.password })).cookie;
    const classes = await send(server.url, 'GET', '/api/classes', undefined, teacher);
    const classId = classes.body.classes[0].id as string;
    const lab = await send(server.url, 'POST', `/api/classes/${classId}/labs/from-template`, { templateId: 'forward-reverse' }, teacher);
    if (lab.status !== 201) throw new Error(`setup: ${lab.status} ${JSON.stringify(lab.body)}`);
    const labId = lab.body.lab.id as string;
    await send(server.url, 'POST', `/api/labs/${labId}/publish`, {}, teacher);
    const student = (await send(server.url, 'POST', '/api/auth/sign-in', { email: DEMO_STUDENTS[0].email, password: DEMO_STUDENTS[0].password })).cookie;
    const opened = await send(server.url, 'POST', `/api/labs/${labId}/open`, {}, student);
    const saved = await send(server.url, 'POST', `/api/programs/${opened.body.program.id}/versions`, { baseVersion: opened.body.program.headVersion, document: FORWARD_REVERSE.solution }, student);
    const ref = { programId: opened.body.program.id, version: saved.body.version.number };
    // Warm-up: the first submission starts the pool's workers.
    await send(server.url, 'POST', `/api/labs/${labId}/submissions`, ref, student);

    const latencies: number[] = [];
    let errors = 0;
    let next = 0;
    const pid = 'child' in server ? server.pid : Number(process.env.GRADING_BENCH_PID ?? 0);
    const cpuBefore = cpuMsOf(pid);
    const started = performance.now();
    await Promise.all(
      Array.from({ length: CLIENTS }, async () => {
        while (next < SUBMISSIONS) {
          next += 1;
          const t0 = performance.now();
          const res = await send(server.url, 'POST', `/api/labs/${labId}/submissions`, ref, student);
          latencies.push(performance.now() - t0);
          if (res.status !== 201 || res.body.submission.autoScore !== res.body.submission.totalPoints) errors += 1;
        }
      }),
    );
    const seconds = (performance.now() - started) / 1000;
    const cpuAfter = cpuMsOf(pid);
    const serverCpuMsPerSubmission = cpuBefore !== null && cpuAfter !== null ? round((cpuAfter - cpuBefore) / latencies.length, 1) : null;
    const perS = latencies.length / seconds;

    const pool = createGradingPool({ size: 1 });
    const t0 = performance.now();
    await pool.warm();
    const coldMs = performance.now() - t0;
    const job = { program: FORWARD_REVERSE.solution, panel: (await import('@shared/field/panels')).builtInPanel('reversing-conveyor')!, script: FORWARD_REVERSE.script };
    const t1 = performance.now();
    for (let i = 0; i < 20; i += 1) await pool.grade(job);
    const warmMs = (performance.now() - t1) / 20;
    await pool.close();

    return [
      { case: 'grading: submissions through the API', submissions: latencies.length, clients: CLIENTS, gradingsPerS: round(perS, 1), p50Ms: round(percentile(latencies, 50), 1), p99Ms: round(percentile(latencies, 99), 1), serverCpuMsPerSubmission, errors, target: '>100/s, 0 errors', meetsTarget: errors === 0 && perS > 100 },
      { case: 'grading: worker cold start vs warm grading', coldStartMs: round(coldMs, 0), warmGradingMs: round(warmMs, 1) },
    ];
  } finally {
    if ('child' in server) {
      server.child.kill('SIGTERM');
      await server.exited;
    }
    if (dataDir) rmSync(dataDir, { recursive: true, force: true });
  }
}
