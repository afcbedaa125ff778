/**
 * HTTP benchmark: autocannon against the real server process on loopback (PGlite on a temporary
 * DATA_DIR), 50 connections × 10 s per case. Cases: load a program (GET with its head document, the
 * requests going round 50 programs) and save a version (each connection saves on its own program,
 * so no save meets a 409), with the small 12-rung document (2.4 kB) and with a realistic 20-rung
 * one (8.9 kB: tags with comments, rung comments, contacts, coils, timers and a counter; see
 * documents.ts). Each case prints the document's size in bytes.
 * Targets (issues 5 and 18): zero errors, p99 < 50 ms for loads, < 100 ms for saves.
 */
import { readFileSync, rmSync } from 'node:fs';
import { loadavg } from 'node:os';
import autocannon from 'autocannon';
import type { BenchCase } from './run';
import { round } from './stats';
import { DEMO_STUDENTS } from '../../server/db/demoAccounts';
import { makeTempDataDir, startServerProcess } from '../api/helpers/serverProcess';
import { documentWithRungs } from '../api/helpers/fixtures';
import { realisticDocument } from './documents';

const CONNECTIONS = 50;
const DURATION_S = Number(process.env.BENCH_HTTP_SECONDS ?? 10);

async function post(url: string, path: string, body: unknown, cookie = ''): Promise<{ status: number; body: { program: { id: string } }; cookie: string }> {
  const res = await fetch(`${url}${path}`, { method: 'POST', headers: { 'content-type': 'application/json', origin: url, cookie }, body: JSON.stringify(body) });
  return { status: res.status, body: await res.json(), cookie: (res.headers.get('set-cookie') ?? '').split(';')[0] };
}

/**
 * CPU time (user + system) the server process has used, in ms, from `/proc` (Linux), or null. On a
 * machine shared with other work, latency measures the machine as much as the server; the
 * server's CPU per request does not depend on what else runs.
 */
function serverCpuMs(pid: number): number | null {
  try {
    const fields = readFileSync(`/proc/${pid}/stat`, 'utf8').replace(/^.*\) /, '').split(' ');
    // After the command name: utime and stime are fields 14 and 15 of proc(5), here 11 and 12 (0-based).
    return ((Number(fields[11]) + Number(fields[12])) * 1000) / CLOCK_TICKS_PER_S;
  } catch {
    return null;
  }
}
/** `getconf CLK_TCK`: 100 on Linux for every architecture Node runs on. */
const CLOCK_TICKS_PER_S = 100;

/** Runs `run` and adds the server's CPU per request to its figures. */
async function measured(pid: number, run: () => Promise<autocannon.Result>): Promise<{ result: autocannon.Result; cpuMsPerRequest: number | null }> {
  const before = serverCpuMs(pid);
  const result = await run();
  const after = serverCpuMs(pid);
  const cpuMsPerRequest = before === null || after === null || result.requests.total === 0 ? null : round((after - before) / result.requests.total, 2);
  return { result, cpuMsPerRequest };
}

function figures(name: string, { result: r, cpuMsPerRequest }: { result: autocannon.Result; cpuMsPerRequest: number | null }, target: number): BenchCase {
  const errors = r.errors + r.timeouts + r.non2xx;
  const statuses = Object.entries(r.statusCodeStats ?? {})
    .map(([code, s]) => `${code}:${(s as { count: number }).count}`)
    .join(',');
  return {
    statuses,
    timeouts: r.timeouts,
    case: name,
    connections: CONNECTIONS,
    durationS: DURATION_S,
    requests: r.requests.total,
    requestsPerS: round(r.requests.average, 1),
    p50Ms: r.latency.p50,
    p99Ms: r.latency.p99,
    maxMs: r.latency.max,
    serverCpuMsPerRequest: cpuMsPerRequest,
    loadAverage1m: round(loadavg()[0]!, 2),
    errors,
    targetP99Ms: target,
    meetsTarget: errors === 0 && r.latency.p99 < target,
  };
}

export default async function (): Promise<BenchCase[]> {
  const dataDir = makeTempDataDir();
  // LOG_LEVEL=warn: request lines at info would measure the terminal, not the server.
  const server = await startServerProcess(dataDir, { LOG_LEVEL: 'warn' });
  try {
    const student = DEMO_STUDENTS[0];
    const { cookie } = await post(server.url, '/api/auth/sign-in', { email: student.email, password: student.password });
    const document = documentWithRungs(12, 'Bench conveyor');
    // Twice as many programs as connections, so a save always finds a program with no save in
    // flight: autocannon may ask for a connection's next request before it hands back the answer
    // to its last one, and with one program per connection a request then had none idle and
    // saved on a program already being saved, which the server rightly answered with a 409.
    const programIds: string[] = [];
    for (let i = 0; i < 2 * CONNECTIONS; i += 1) {
      const created = await post(server.url, '/api/programs', { title: `Bench ${i}`, document }, cookie);
      if (created.status !== 201) throw new Error(`setup failed: ${created.status} ${JSON.stringify(created.body)}`);
      programIds.push(created.body.program.id);
    }
    const headers = { cookie, origin: server.url, 'content-type': 'application/json' };

    // Each request loads the next of the 50 programs, as a class of students opening their own work would.
    let next = 0;
    const load = await measured(server.pid, () =>
      autocannon({
        url: server.url,
        connections: CONNECTIONS,
        duration: DURATION_S,
        headers,
        requests: [{ method: 'GET', setupRequest: (req) => ({ ...req, path: `/api/programs/${programIds[next++ % programIds.length]}` }) }],
      }),
    );

    // autocannon resets a connection's context after each request cycle, so the heads live here:
    // a request takes an idle program, and its response puts it back with the new head.
    const heads = new Map(programIds.map((id) => [id, 1]));
    const idle: string[] = [];
    // A run ends with saves in flight whose answers autocannon never hands back: before each run the
    // heads are read again and every program is idle, else the next run saves on stale heads
    // (all 409s) or queues every save on one program.
    const refreshHeads = async (): Promise<void> => {
      idle.length = 0;
      for (const id of programIds) {
        const res = await fetch(`${server.url}/api/programs/${id}`, { headers: { cookie } });
        if (!res.ok) throw new Error(`reading the head of ${id} answered ${res.status}`);
        heads.set(id, ((await res.json()) as { head: { number: number } }).head.number);
        idle.push(id);
      }
    };
    const saveRun = async (body: unknown) => {
      await refreshHeads();
      return measured(server.pid, () => autocannon({
        url: server.url,
        connections: CONNECTIONS,
        duration: DURATION_S,
        headers,
        requests: [
          {
            method: 'POST',
            setupRequest: (req, ctx) => {
              const context = ctx as { programId?: string };
              const programId = idle.pop();
              if (programId === undefined) throw new Error('the bench ran out of idle programs: every program has a save in flight');
              context.programId = programId;
              return { ...req, path: `/api/programs/${programId}/versions`, body: JSON.stringify({ baseVersion: heads.get(programId), document: body, message: 'bench' }) };
            },
            onResponse: (status, responseBody, ctx) => {
              const context = ctx as { programId: string };
              if (status === 201) heads.set(context.programId, (JSON.parse(responseBody) as { version: { number: number } }).version.number);
              idle.push(context.programId);
            },
          },
        ],
      }));
    };
    const save = await saveRun(document);
    const realistic = realisticDocument();
    const realisticBytes = JSON.stringify(realistic).length;
    const saveRealistic = await saveRun(realistic);
    return [
      figures('http: load a program (GET /api/programs/:id)', load, 50),
      figures(`http: save a version (POST /api/programs/:id/versions), 12 rungs, ${JSON.stringify(document).length} bytes`, save, 100),
      figures(`http: save a version (POST /api/programs/:id/versions), 20 rungs, ${realisticBytes} bytes`, saveRealistic, 100),
    ];
  } finally {
    server.child.kill('SIGTERM');
    await server.exited;
    rmSync(dataDir, { recursive: true, force: true });
  }
}
