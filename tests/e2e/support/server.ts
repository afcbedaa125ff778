/**
 * Starts the real server process (the same entry `npm start` ends in) on a free port with a
 * temporary DATA_DIR, for one e2e test file, and stops it afterwards.
 */
import { spawn, type ChildProcess } from 'node:child_process';
import { mkdtempSync, rmSync } from 'node:fs';
import { createServer } from 'node:net';
import { tmpdir } from 'node:os';
import path from 'node:path';

export interface RunningServer {
  url: string;
  dataDir: string;
  output: () => string;
  stop: () => Promise<void>;
}

export async function freePort(): Promise<number> {
  return new Promise((resolve, reject) => {
    const probe = createServer();
    probe.once('error', reject);
    probe.listen(0, '127.0.0.1', () => {
      const address = probe.address();
      const port = typeof address === 'object' && address ? address.port : 0;
      probe.close(() => resolve(port));
    });
  });
}

async function waitForHealth(url: string, child: ChildProcess, log: () => string, timeoutMs: number): Promise<void> {
  const deadline = Date.now() + timeoutMs;
  while (Date.now() < deadline) {
    if (child.exitCode !== null) throw new Error(`server exited with ${child.exitCode}:\n${log()}`);
    try {
      const res = await fetch(`${url}/api/health`);
      if (res.ok) return;
    } catch {
      // not listening yet
    }
    await new Promise((r) => setTimeout(r, 150));
  }
  throw new Error(`server did not answer /api/health within ${timeoutMs} ms:\n${log()}`);
}

export async function startServer(env: Record<string, string> = {}): Promise<RunningServer> {
  const port = await freePort();
  const dataDir = mkdtempSync(path.join(tmpdir(), 'rungwright-e2e-'));
  const url = `http://127.0.0.1:${port}`;
  let log = '';
  const child = spawn(process.execPath, ['--import', 'tsx', 'server/index.ts'], {
    cwd: process.cwd(),
    env: { ...process.env, PORT: String(port), HOST: '127.0.0.1', DATA_DIR: dataDir, NODE_ENV: 'test', ...env },
    stdio: ['ignore', 'pipe', 'pipe'],
  });
  child.stdout?.on('data', (chunk) => (log += chunk));
  child.stderr?.on('data', (chunk) => (log += chunk));
  // A test run stopped before its teardown (a timeout, Ctrl+C) must not leave a server behind
  // holding a port and a temporary DATA_DIR.
  const killOnExit = () => {
    if (child.exitCode === null) child.kill('SIGKILL');
    rmSync(dataDir, { recursive: true, force: true });
  };
  process.once('exit', killOnExit);
  try {
    // Generous: on a machine shared by several test runs a first start (initdb in WASM) has taken over a minute (the e2e hook timeout, 120 s, bounds it).
    await waitForHealth(url, child, () => log, 110_000);
  } catch (err) {
    killOnExit();
    throw err;
  }
  return {
    url,
    dataDir,
    output: () => log,
    stop: async () => {
      process.removeListener('exit', killOnExit);
      if (child.exitCode === null) {
        const exited = new Promise((r) => child.once('exit', r));
        child.kill('SIGTERM');
        await Promise.race([exited, new Promise((r) => setTimeout(r, 5000))]);
        if (child.exitCode === null) child.kill('SIGKILL');
      }
      rmSync(dataDir, { recursive: true, force: true });
    },
  };
}
