import { rmSync } from 'node:fs';
import path from 'node:path';
import { afterAll, describe, expect, it } from 'vitest';
import { makeTempDataDir, runServerExpectingExit, startServerProcess, type ServerProcess } from './helpers/serverProcess';

const dataDir = makeTempDataDir();
const running: ServerProcess[] = [];

afterAll(async () => {
  for (const proc of running) {
    proc.child.kill('SIGKILL');
    await proc.exited;
  }
  rmSync(dataDir, { recursive: true, force: true });
});

describe('the DATA_DIR lock', () => {
  it('makes a second server on the same DATA_DIR exit at once, naming the directory and the running pid', async () => {
    const first = await startServerProcess(dataDir);
    running.push(first);
    const health = await fetch(`${first.url}/api/health`).then((r) => r.json());
    expect(health).toMatchObject({ ok: true, db: 'pglite' });

    const second = await runServerExpectingExit(dataDir);
    expect(second.code).toBe(1);
    expect(second.stderr).toContain(path.resolve(dataDir));
    expect(second.stderr).toContain(`pid ${first.pid}`);
    expect(second.stderr).not.toMatch(/\n\s+at /);
  }, 60_000);

  it('takes over a stale lock left by a server killed with SIGKILL', async () => {
    const first = running.pop();
    if (!first) throw new Error('the first test did not leave a server running');
    first.child.kill('SIGKILL');
    await first.exited;

    const next = await startServerProcess(dataDir);
    running.push(next);
    const res = await fetch(`${next.url}/api/health`);
    expect(res.status).toBe(200);
  }, 60_000);

  it('releases the lock on SIGTERM so the next start needs no stale-lock recovery', async () => {
    const current = running.pop();
    if (!current) throw new Error('no server left running by the previous test');
    current.child.kill('SIGTERM');
    expect(await current.exited).toBe(0);
    const { existsSync } = await import('node:fs');
    expect(existsSync(path.join(dataDir, 'rungwright.lock'))).toBe(false);
  }, 30_000);
});
