/**
 * Runs the real server process (`tsx server/index.ts`) on a temporary DATA_DIR, for the tests that
 * need a real process: the DATA_DIR lock and durability across SIGKILL.
 */
import { spawn, type ChildProcess } from 'node:child_process';
import { mkdtempSync } from 'node:fs';
import os from 'node:os';
import path from 'node:path';

export interface ServerProcess {
  child: ChildProcess;
  pid: number;
  /** `http://127.0.0.1:<port>` once the server printed its listening line. */
  url: string;
  stdout(): string;
  stderr(): string;
  /** Resolves with the exit code (or the signal name) when the process ends. */
  exited: Promise<number | string>;
}

// `node --import tsx`, not the tsx binary: the binary runs the server in a child process, so its pid
// (and a SIGKILL sent to it) would not reach the server.
const NODE_ARGS = ['--import', 'tsx', 'server/index.ts'];

export function makeTempDataDir(): string {
  return mkdtempSync(path.join(os.tmpdir(), 'rungwright-data-'));
}

/** Starts the server; resolves once it listens, rejects if it exits first (with its stderr). */
export function startServerProcess(dataDir: string, env: Record<string, string> = {}): Promise<ServerProcess> {
  return new Promise((resolve, reject) => {
    const child = spawn(process.execPath, NODE_ARGS, {
      cwd: path.resolve('.'),
      env: { ...process.env, DATA_DIR: dataDir, PORT: '0', HOST: '127.0.0.1', LOG_LEVEL: 'warn', NODE_ENV: 'test', ...env },
      stdio: ['ignore', 'pipe', 'pipe'],
    });
    let out = '';
    let err = '';
    const exited = new Promise<number | string>((done) => child.on('exit', (code, signal) => done(code ?? signal ?? -1)));
    child.stdout.on('data', (chunk: Buffer) => {
      out += chunk.toString();
      const match = /Rungwright listening on (http:\/\/\S+)/.exec(out);
      if (match) resolve({ child, pid: child.pid ?? -1, url: match[1], stdout: () => out, stderr: () => err, exited });
    });
    child.stderr.on('data', (chunk: Buffer) => {
      err += chunk.toString();
    });
    void exited.then((code) => reject(Object.assign(new Error(`server exited (${code}) before listening: ${err}`), { code, stderr: err })));
  });
}

/** Runs the server expecting it to refuse to start; resolves with its exit code and stderr. */
export function runServerExpectingExit(dataDir: string): Promise<{ code: number | string; stderr: string }> {
  return startServerProcess(dataDir).then(
    async (proc) => {
      proc.child.kill('SIGKILL');
      await proc.exited;
      throw new Error('the second server started although the first one holds DATA_DIR');
    },
    (err: { code: number | string; stderr: string }) => ({ code: err.code, stderr: err.stderr }),
  );
}
