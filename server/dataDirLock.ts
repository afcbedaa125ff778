/**
 * An exclusive lock on DATA_DIR. PGlite does not lock its directory, and two processes on one
 * directory lose rows or corrupt it (STACK.md), so the server refuses to start beside another.
 *
 * The lock is a file created with O_EXCL holding the owner's pid. A lock whose pid is no longer
 * running (the server was killed) is stale and is taken over.
 */
import { closeSync, mkdirSync, openSync, readFileSync, unlinkSync, writeSync } from 'node:fs';
import path from 'node:path';

/** A held lock; `release()` removes the file if it is still ours. */
export interface DataDirLock {
  file: string;
  release(): void;
}

export type LockResult = { ok: true; lock: DataDirLock } | { ok: false; error: string };

interface LockContent {
  pid: number;
  startedAt: string;
}

export const LOCK_FILE_NAME = 'rungwright.lock';

/** Takes the lock on `dataDir` for this process, or says which process holds it. */
export function acquireDataDirLock(dataDir: string, startedAt: Date): LockResult {
  const dir = path.resolve(dataDir);
  mkdirSync(dir, { recursive: true });
  const file = path.join(dir, LOCK_FILE_NAME);
  const content: LockContent = { pid: process.pid, startedAt: startedAt.toISOString() };

  // Two attempts: the second follows the removal of a stale lock.
  for (let attempt = 0; attempt < 2; attempt += 1) {
    try {
      const fd = openSync(file, 'wx');
      writeSync(fd, JSON.stringify(content));
      closeSync(fd);
      return { ok: true, lock: { file, release: () => releaseIfOurs(file) } };
    } catch (err) {
      if ((err as NodeJS.ErrnoException).code !== 'EEXIST') {
        return { ok: false, error: `Cannot create the lock file ${file}: ${(err as Error).message}` };
      }
    }
    const holder = readLock(file);
    if (holder && holder.pid !== process.pid && isRunning(holder.pid)) {
      return {
        ok: false,
        error:
          `DATA_DIR ${dir} is in use by another Rungwright server (pid ${holder.pid}, started ${holder.startedAt}). ` +
          'Stop that process first, or set DATA_DIR to another directory.',
      };
    }
    // Stale (its process is gone), unreadable (killed mid-write), or our own pid left behind.
    try {
      unlinkSync(file);
    } catch {
      // Another process may have removed it first; the next attempt decides.
    }
  }
  return { ok: false, error: `Could not take the lock ${file}: another process keeps creating it.` };
}

function readLock(file: string): LockContent | null {
  try {
    const parsed = JSON.parse(readFileSync(file, 'utf8')) as Partial<LockContent>;
    return typeof parsed.pid === 'number' ? { pid: parsed.pid, startedAt: String(parsed.startedAt) } : null;
  } catch {
    return null;
  }
}

/** Signal 0 checks a process exists without touching it; EPERM means it exists under another user. */
function isRunning(pid: number): boolean {
  try {
    process.kill(pid, 0);
    return true;
  } catch (err) {
    return (err as NodeJS.ErrnoException).code === 'EPERM';
  }
}

function releaseIfOurs(file: string): void {
  const holder = readLock(file);
  if (holder?.pid !== process.pid) return;
  try {
    unlinkSync(file);
  } catch {
    // Already gone: nothing to release.
  }
}
