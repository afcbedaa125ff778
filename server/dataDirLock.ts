/**
 * An exclusive lock on DATA_DIR. PGlite does not lock its directory, and two processes on one
 * directory lose rows or corrupt it, so the server (and every command that opens the database)
 * refuses to start beside another.
 *
 * Why it holds, even when processes start at the same instant:
 * - **The lock file appears whole or not at all.** A starter writes its record (pid, start time, a
 *   random id) to a private temporary file, then hard-links it to `rungwright.lock`. `link(2)` is
 *   atomic and fails with EEXIST when the name exists, so of any number of simultaneous starters
 *   exactly one gets the name, and nobody can read a half-written lock. A lock file that is empty
 *   or damaged anyway (written by something else) is not taken as proof that its holder died: the
 *   starter refuses and says which file to check.
 * - **A lock is stale only when its holder is provably gone**: no process has the recorded pid; or
 *   the pid is this process's own but the record is not (a restarted container reuses pids); or,
 *   on Linux, the process with that pid started at another moment than the one recorded (the pid
 *   was reused). Time alone never makes a lock stale: a live server that is busy keeps its lock.
 * - **Taking over is atomic too.** Only a starter that has *claimed* a stale record may delete
 *   it. A claim is the starter's own record linked (same atomic `link`) under a name derived from
 *   the stale record's text, so two starters cannot both claim the same stale record; the claimant
 *   checks the record is still the one it claimed, removes it and races for the lock name like
 *   anyone else. A claim whose claimant died in the middle is itself a stale record, removed the
 *   same way.
 */
import { createHash, randomUUID } from 'node:crypto';
import { linkSync, mkdirSync, readdirSync, readFileSync, unlinkSync, writeFileSync } from 'node:fs';
import path from 'node:path';

/** A held lock; `release()` removes the lock file if it is still ours. */
export interface DataDirLock {
  file: string;
  release(): void;
}

export type LockResult = { ok: true; lock: DataDirLock } | { ok: false; error: string };

/** Who holds DATA_DIR, for the message a second starter prints. */
export type LockPurpose = 'server' | 'command';

/** What a lock (or a claim) file holds. */
interface LockRecord {
  pid: number;
  startedAt: string;
  purpose?: LockPurpose;
  /** Random per process: tells this process's records from a dead process that had the same pid. */
  process?: string;
  /** Linux: boot id and the process's start time in clock ticks, to detect a reused pid. */
  procStart?: string;
}

type ReadRecord = { kind: 'record'; record: LockRecord; text: string } | { kind: 'gone' } | { kind: 'unreadable'; reason: string };

export const LOCK_FILE_NAME = 'rungwright.lock';

const THIS_PROCESS = randomUUID();
/** Rounds of "try the name, look at the holder, remove a stale one"; each round changes something. */
const MAX_ROUNDS = 50;
/** How long to wait for another starter that is removing a stale lock, per round. */
const CLAIM_WAIT_MS = 10;

/** Takes the lock on `dataDir` for this process, or says which process holds it. */
export function acquireDataDirLock(dataDir: string, startedAt: Date, purpose: LockPurpose = 'server'): LockResult {
  const dir = path.resolve(dataDir);
  const file = path.join(dir, LOCK_FILE_NAME);
  let temp: string;
  try {
    mkdirSync(dir, { recursive: true });
    temp = writeOwnRecord(dir, { pid: process.pid, startedAt: startedAt.toISOString(), purpose, process: THIS_PROCESS, procStart: procStartOf(process.pid) });
  } catch (err) {
    return { ok: false, error: `Cannot create the lock for ${dir}: ${(err as Error).message}` };
  }
  try {
    for (let round = 0; round < MAX_ROUNDS; round += 1) {
      const linked = tryLink(temp, file);
      if (linked === true) {
        removeLeftoverTemps(dir);
        return { ok: true, lock: { file, release: () => releaseIfOurs(file) } };
      }
      if (linked !== false) return { ok: false, error: `Cannot create the lock file ${file}: ${linked}` };
      const holder = readRecord(file);
      if (holder.kind === 'gone') continue; // released between our link and our read
      if (holder.kind === 'unreadable') {
        return {
          ok: false,
          error:
            `The lock file ${file} is ${holder.reason}, so it cannot tell whether another Rungwright process uses DATA_DIR ${dir}. ` +
            'If no Rungwright server or command runs on this directory, delete that file and start again.',
        };
      }
      if (isAlive(holder.record)) return { ok: false, error: inUseMessage(dir, file, holder.record) };
      const removed = removeStaleRecord(dir, file, holder, temp, 0);
      if (removed !== true) return { ok: false, error: `Cannot take over the stale lock ${file}: ${removed}` };
    }
    return { ok: false, error: `Could not take the lock ${file}: other processes kept taking and releasing it; try again.` };
  } finally {
    unlinkQuietly(temp);
  }
}

function inUseMessage(dir: string, file: string, holder: LockRecord): string {
  const who = holder.purpose === 'command' ? 'a Rungwright command' : 'another Rungwright server';
  return (
    `DATA_DIR ${dir} is in use by ${who} (pid ${holder.pid}, started ${holder.startedAt}). ` +
    `Stop that process first, or set DATA_DIR to another directory. (If no such process runs, delete ${file}.)`
  );
}

/**
 * Removes the stale record `stale` from `name`, once this process has claimed it. Returns true
 * when the caller should look at `name` again (removed by us, or by another claimant meanwhile), or
 * a reason it cannot go on.
 */
function removeStaleRecord(dir: string, name: string, stale: { record: LockRecord; text: string }, temp: string, depth: number): true | string {
  if (depth > 8) return 'too many abandoned takeover claims; remove the rungwright.lock.claim-* files by hand';
  const claim = path.join(dir, claimFileName(stale.text));
  for (let round = 0; round < MAX_ROUNDS; round += 1) {
    const linked = tryLink(temp, claim);
    if (linked === true) {
      try {
        // Only a claimant of this exact record deletes it, and we are that claimant: nobody else
        // can swap the file between this read and the unlink.
        const now = readRecord(name);
        if (now.kind === 'record' && now.text === stale.text) unlinkQuietly(name);
      } finally {
        unlinkQuietly(claim);
      }
      return true;
    }
    if (linked !== false) return `cannot create ${claim}: ${linked}`;
    const claimant = readRecord(claim);
    if (claimant.kind === 'gone') continue;
    if (claimant.kind === 'unreadable') return `the claim file ${claim} is ${claimant.reason}; delete it if no Rungwright process is starting`;
    if (isAlive(claimant.record)) {
      // Another starter is removing it right now; let it finish, then the caller looks again.
      sleepMs(CLAIM_WAIT_MS);
      return true;
    }
    const removed = removeStaleRecord(dir, claim, claimant, temp, depth + 1);
    if (removed !== true) return removed;
  }
  return `the claim ${claim} kept changing`;
}

/** The name of the claim on a stale record: one name per record text, so one claimant per record. */
export function claimFileName(staleText: string): string {
  return `${LOCK_FILE_NAME}.claim-${createHash('sha256').update(staleText).digest('hex').slice(0, 32)}`;
}

/** Writes this process's record to a private temporary file, complete, before it is linked anywhere. */
function writeOwnRecord(dir: string, record: LockRecord): string {
  const temp = path.join(dir, `${LOCK_FILE_NAME}.${process.pid}-${randomUUID()}.tmp`);
  writeFileSync(temp, JSON.stringify(record), { flag: 'wx', mode: 0o644 });
  return temp;
}

/** true when linked, false when the name exists, or the reason it failed otherwise. */
function tryLink(from: string, to: string): boolean | string {
  try {
    linkSync(from, to);
    return true;
  } catch (err) {
    const code = (err as NodeJS.ErrnoException).code;
    if (code === 'EEXIST') return false;
    if (code === 'EPERM' || code === 'ENOTSUP' || code === 'EOPNOTSUPP') return `${(err as Error).message} (DATA_DIR must be on a file system with hard links)`;
    return (err as Error).message;
  }
}

function readRecord(file: string): ReadRecord {
  let text: string;
  try {
    text = readFileSync(file, 'utf8');
  } catch (err) {
    if ((err as NodeJS.ErrnoException).code === 'ENOENT') return { kind: 'gone' };
    return { kind: 'unreadable', reason: `unreadable (${(err as Error).message})` };
  }
  if (text.trim() === '') return { kind: 'unreadable', reason: 'empty' };
  try {
    const parsed = JSON.parse(text) as Partial<LockRecord>;
    if (typeof parsed.pid === 'number' && Number.isInteger(parsed.pid) && parsed.pid > 0) {
      return { kind: 'record', text, record: { ...parsed, pid: parsed.pid, startedAt: String(parsed.startedAt) } };
    }
  } catch {
    // falls through to "damaged"
  }
  return { kind: 'unreadable', reason: 'damaged (not a lock record)' };
}

/** Whether the process that wrote `record` may still be running (when in doubt: yes). */
function isAlive(record: LockRecord): boolean {
  if (record.pid === process.pid) return record.process === THIS_PROCESS;
  if (!processExists(record.pid)) return false;
  if (record.procStart === undefined) return true;
  const current = procStartOf(record.pid);
  return current === undefined || current === record.procStart;
}

/** Signal 0 checks a process exists without touching it; EPERM means it exists under another user. */
function processExists(pid: number): boolean {
  try {
    process.kill(pid, 0);
    return true;
  } catch (err) {
    return (err as NodeJS.ErrnoException).code === 'EPERM';
  }
}

/**
 * Linux only: "<boot id>/<start time in clock ticks>" of a process, which a reused pid does not
 * share (proc(5), /proc/pid/stat field 22). Undefined elsewhere or when unreadable.
 */
function procStartOf(pid: number): string | undefined {
  try {
    const stat = readFileSync(`/proc/${pid}/stat`, 'utf8');
    // The command name (field 2) is in parentheses and may hold spaces: count fields after its ')'.
    const fields = stat.slice(stat.lastIndexOf(')') + 2).split(' ');
    const startTicks = fields[19];
    const bootId = readFileSync('/proc/sys/kernel/random/boot_id', 'utf8').trim();
    return startTicks ? `${bootId}/${startTicks}` : undefined;
  } catch {
    return undefined;
  }
}

function releaseIfOurs(file: string): void {
  const holder = readRecord(file);
  if (holder.kind === 'record' && holder.record.pid === process.pid && holder.record.process === THIS_PROCESS) unlinkQuietly(file);
}

/** Temporary record files of processes that died while starting (their records were linked elsewhere or never). */
function removeLeftoverTemps(dir: string): void {
  for (const name of readdirSync(dir)) {
    const match = /^rungwright\.lock\.(\d+)-[0-9a-f-]+\.tmp$/.exec(name);
    if (match && Number(match[1]) !== process.pid && !processExists(Number(match[1]))) unlinkQuietly(path.join(dir, name));
  }
}

function unlinkQuietly(file: string): void {
  try {
    unlinkSync(file);
  } catch {
    // Already gone.
  }
}

/** Blocks this thread briefly (the lock is taken once, at start-up, before anything else runs). */
function sleepMs(ms: number): void {
  Atomics.wait(new Int32Array(new SharedArrayBuffer(4)), 0, 0, ms);
}
