/**
 * Real app and worker processes on one PostgreSQL database, for the tests that only make sense
 * there (several processes sharing sessions, limits, saves and the grading queue), and for the
 * scale-out benchmark (so nothing here imports vitest).
 */
import { spawn, type ChildProcess } from 'node:child_process';
import path from 'node:path';
import { makeTempDataDir, startServerProcess, type ServerProcess } from './serverProcess';

/** Every process signs sessions with this key (DATABASE_URL requires JWT_SECRET). */
export const SHARED_SECRET = 'api-pg-shared-secret-0123456789abcdef';

/** The environment every process of a test shares; `extra` adds to it. */
export function sharedEnv(url: string, extra: Record<string, string> = {}): Record<string, string> {
  return { DATABASE_URL: url, JWT_SECRET: SHARED_SECRET, DEMO: 'off', DATABASE_POOL_SIZE: '4', ...extra };
}

/** An app process (`server/index.ts`) on the shared database. */
export function startApp(env: Record<string, string>): Promise<ServerProcess> {
  return startServerProcess(makeTempDataDir(), env);
}

export interface WorkerProcess {
  child: ChildProcess;
  stdout(): string;
  /** Resolves once stdout holds a line matching `pattern`. */
  waitFor(pattern: RegExp, timeoutMs?: number): Promise<string>;
  exited: Promise<number | string>;
}

/** A grading worker (`server/gradingWorker.ts`); resolves once it says it is ready. */
export async function startWorker(env: Record<string, string>): Promise<WorkerProcess> {
  const child = spawn(process.execPath, ['--import', 'tsx', 'server/gradingWorker.ts'], {
    cwd: path.resolve('.'),
    env: { ...process.env, LOG_LEVEL: 'warn', NODE_ENV: 'test', GRADING_THREADS: '1', ...env },
    stdio: ['ignore', 'pipe', 'pipe'],
  });
  let out = '';
  let err = '';
  const listeners = new Set<() => void>();
  child.stdout!.on('data', (chunk: Buffer) => {
    out += chunk.toString();
    for (const l of listeners) l();
  });
  child.stderr!.on('data', (chunk: Buffer) => {
    err += chunk.toString();
  });
  const exited = new Promise<number | string>((done) => child.on('exit', (code, signal) => done(code ?? signal ?? -1)));
  const waitFor = (pattern: RegExp, timeoutMs = 30_000) =>
    new Promise<string>((resolve, reject) => {
      const check = () => {
        const match = pattern.exec(out);
        if (!match) return;
        listeners.delete(check);
        clearTimeout(timer);
        resolve(match[0]);
      };
      const timer = setTimeout(() => {
        listeners.delete(check);
        reject(new Error(`worker did not print ${pattern} within ${timeoutMs} ms; stdout: ${out}; stderr: ${err}`));
      }, timeoutMs);
      listeners.add(check);
      void exited.then((code) => {
        if (!pattern.exec(out)) {
          listeners.delete(check);
          clearTimeout(timer);
          reject(new Error(`worker exited (${code}) before printing ${pattern}; stderr: ${err}`));
        }
      });
      check();
    });
  const worker: WorkerProcess = { child, stdout: () => out, waitFor, exited };
  await waitFor(/grading worker ready/, 60_000);
  return worker;
}

/** Stops a process (SIGTERM) and waits for it. */
export async function stopProcess(p: { child: ChildProcess; exited: Promise<number | string> }): Promise<void> {
  if (p.child.exitCode === null && p.child.signalCode === null) p.child.kill('SIGTERM');
  await p.exited;
}

/** A JSON request to one process, with its own Origin (what a browser on that host sends). */
export async function request(base: string, method: string, url: string, options: { cookie?: string; body?: unknown } = {}): Promise<{ status: number; body: any; setCookie: string | null }> { // eslint-disable-line @typescript-eslint/no-explicit-any -- tests read a few fields
  const res = await fetch(`${base}${url}`, {
    method,
    headers: { Origin: base, ...(options.body !== undefined ? { 'Content-Type': 'application/json' } : {}), ...(options.cookie ? { Cookie: options.cookie } : {}) },
    body: options.body !== undefined ? JSON.stringify(options.body) : undefined,
  });
  const text = await res.text();
  return { status: res.status, body: text ? JSON.parse(text) : null, setCookie: res.headers.get('set-cookie') };
}
