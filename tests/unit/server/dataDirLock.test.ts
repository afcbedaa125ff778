/**
 * The DATA_DIR lock's decisions, one process at a time: what counts as a live holder, what counts
 * as stale, and what it refuses to guess about. The races are in `tests/api/dataDirLockRace.test.ts`.
 */
import { spawnSync } from 'node:child_process';
import { existsSync, mkdtempSync, readdirSync, readFileSync, rmSync, writeFileSync } from 'node:fs';
import os from 'node:os';
import path from 'node:path';
import { afterEach, describe, expect, it } from 'vitest';
import { acquireDataDirLock, claimFileName, LOCK_FILE_NAME } from '../../../server/dataDirLock';

const started = new Date('2026-09-01T08:00:00.000Z');
const dirs: string[] = [];
function tempDir(): string {
  const dir = mkdtempSync(path.join(os.tmpdir(), 'rungwright-lock-'));
  dirs.push(dir);
  return dir;
}
afterEach(() => {
  for (const dir of dirs.splice(0)) rmSync(dir, { recursive: true, force: true });
});

/** The pid of a process that has already exited. */
const deadPid = (): number => spawnSync(process.execPath, ['-e', '']).pid;
const lockFile = (dir: string) => path.join(dir, LOCK_FILE_NAME);
const writeLock = (dir: string, content: string) => writeFileSync(lockFile(dir), content);

describe('acquireDataDirLock', () => {
  it('takes a free directory, records this pid, and removes the lock on release', () => {
    const dir = tempDir();
    const result = acquireDataDirLock(dir, started);
    if (!result.ok) throw new Error(result.error);
    expect(JSON.parse(readFileSync(lockFile(dir), 'utf8'))).toMatchObject({ pid: process.pid, startedAt: started.toISOString(), purpose: 'server' });
    // Only the lock file: the temporary record it was linked from is gone.
    expect(readdirSync(dir)).toEqual([LOCK_FILE_NAME]);
    result.lock.release();
    expect(existsSync(lockFile(dir))).toBe(false);
  });

  it('refuses a second taker in the same process instead of handing the lock out twice', () => {
    const dir = tempDir();
    const first = acquireDataDirLock(dir, started);
    expect(first.ok).toBe(true);
    const second = acquireDataDirLock(dir, started, 'command');
    expect(second).toEqual({ ok: false, error: expect.stringContaining(`pid ${process.pid}`) });
    if (first.ok) first.lock.release();
  });

  it('refuses while a live process holds the lock, naming the directory, its pid and what it is', () => {
    const dir = tempDir();
    writeLock(dir, JSON.stringify({ pid: process.ppid, startedAt: '2026-09-01T07:00:00.000Z', purpose: 'command' }));
    const result = acquireDataDirLock(dir, started);
    if (result.ok) throw new Error('took a lock held by a live process');
    expect(result.error).toContain(`DATA_DIR ${dir} is in use by a Rungwright command (pid ${process.ppid}, started 2026-09-01T07:00:00.000Z)`);
    expect(JSON.parse(readFileSync(lockFile(dir), 'utf8')).pid).toBe(process.ppid);
  });

  it('takes over a lock whose process is gone', () => {
    const dir = tempDir();
    writeLock(dir, JSON.stringify({ pid: deadPid(), startedAt: '2026-08-01T00:00:00.000Z' }));
    const result = acquireDataDirLock(dir, started);
    expect(result.ok).toBe(true);
    expect(JSON.parse(readFileSync(lockFile(dir), 'utf8')).pid).toBe(process.pid);
    expect(readdirSync(dir)).toEqual([LOCK_FILE_NAME]);
  });

  it('takes over a lock that carries this pid but was written by an earlier process (a restarted container reuses pids)', () => {
    const dir = tempDir();
    writeLock(dir, JSON.stringify({ pid: process.pid, startedAt: '2026-08-01T00:00:00.000Z', process: 'an-earlier-process' }));
    expect(acquireDataDirLock(dir, started).ok).toBe(true);
  });

  it.runIf(process.platform === 'linux')('takes over a lock whose pid now belongs to a process started at another time (pid reused)', () => {
    const dir = tempDir();
    writeLock(dir, JSON.stringify({ pid: process.ppid, startedAt: '2026-08-01T00:00:00.000Z', procStart: 'another-boot/12345' }));
    expect(acquireDataDirLock(dir, started).ok).toBe(true);
  });

  it.each([
    ['empty', ''],
    ['half-written', '{"pid": 12'],
    ['not a lock record', '{"hello": "world"}'],
  ])('refuses, rather than deletes, a lock file that is %s: it is no proof that its holder died', (_what, content) => {
    const dir = tempDir();
    writeLock(dir, content);
    const result = acquireDataDirLock(dir, started);
    if (result.ok) throw new Error('took over an unreadable lock');
    expect(result.error).toContain(lockFile(dir));
    expect(result.error).toMatch(/delete that file/);
    expect(readFileSync(lockFile(dir), 'utf8')).toBe(content);
  });

  it('recovers when a starter died in the middle of a takeover, leaving its claim behind', () => {
    const dir = tempDir();
    writeLock(dir, JSON.stringify({ pid: deadPid(), startedAt: '2026-08-01T00:00:00.000Z' }));
    // The claim a takeover of that record makes, left by a starter that died holding it.
    writeFileSync(path.join(dir, claimFileName(readFileSync(lockFile(dir), 'utf8'))), JSON.stringify({ pid: deadPid(), startedAt: '2026-08-01T00:00:01.000Z' }));

    const result = acquireDataDirLock(dir, started);
    expect(result.ok).toBe(true);
    expect(readdirSync(dir)).toEqual([LOCK_FILE_NAME]);
  });

  it('keeps a lock it did not take when asked to release', () => {
    const dir = tempDir();
    const mine = acquireDataDirLock(dir, started);
    if (!mine.ok) throw new Error(mine.error);
    const otherRecord = JSON.stringify({ pid: process.ppid, startedAt: '2026-09-01T07:00:00.000Z' });
    writeLock(dir, otherRecord);
    mine.lock.release();
    expect(readFileSync(lockFile(dir), 'utf8')).toBe(otherRecord);
  });
});
