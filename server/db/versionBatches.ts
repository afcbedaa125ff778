/**
 * Group commit for saves. A save is one conditional statement (the program's head moves on only if
 * it is still the save's base version, and the new version row is inserted from that UPDATE), and
 * the statement costs about the same for one save or for twenty: on PGlite 1.9 ms for one, 3.6 ms
 * for ten (measured with 12-rung documents). So saves are gathered for as long as more keep
 * arriving: the batch goes when a turn of the event loop brings no new save (a quiet server adds
 * well under a millisecond), when it is full, or after MAX_WAIT_MS. PGlite runs a statement on
 * this thread, so requests can only reach the queue between statements, never during one.
 *
 * Each save in a batch keeps its own outcome: a batch never holds two saves of the same program
 * (the second waits for the next batch, so it sees the first's new head and gets its 409), and if
 * a batch's statement fails, its saves are retried one by one so one bad save cannot fail others.
 * The same statement deletes each saved version's author's draft of the program (the version holds
 * what the draft kept): as a statement of its own per save it was one more PGlite round per save
 * beside one per batch. Plain PostgreSQL: the same statement runs on a PostgreSQL server.
 */
import { sql, type SQL } from 'drizzle-orm';
import { executeRows, type Db } from './client';

/**
 * One save: append version `baseVersion + 1` to `programId` if its head is still `baseVersion`,
 * and then delete `authorId`'s draft of the program.
 */
export interface VersionWrite {
  programId: string;
  baseVersion: number;
  /** The document as JSON text (serialised once, by the caller). */
  documentJson: string;
  message: string;
  authorId: string;
  now: Date;
}

/** The number of the appended version, or null when the head had moved on (or the program is gone). */
export type VersionWriteResult = number | null;

/** More would only make one statement, and so its saves' wait, longer. */
const MAX_BATCH = 32;
/** The longest a save waits for others to join its batch (wall clock). */
const MAX_WAIT_MS = 8;

interface Queued {
  write: VersionWrite;
  resolve: (result: VersionWriteResult) => void;
  reject: (error: unknown) => void;
}

class VersionBatcher {
  private readonly queue: Queued[] = [];
  private running = false;
  private gathering = false;
  private gatherStart = 0;
  private seen = 0;

  constructor(private readonly db: Db) {}

  append(write: VersionWrite): Promise<VersionWriteResult> {
    return new Promise((resolve, reject) => {
      this.queue.push({ write, resolve, reject });
      this.gather();
    });
  }

  private gather(): void {
    if (this.gathering || this.running) return;
    this.gathering = true;
    this.gatherStart = performance.now();
    this.seen = this.queue.length;
    setImmediate(this.checkGathered);
  }

  private readonly checkGathered = (): void => {
    const growing = this.queue.length > this.seen;
    if (growing && this.queue.length < MAX_BATCH && performance.now() - this.gatherStart < MAX_WAIT_MS) {
      this.seen = this.queue.length;
      setImmediate(this.checkGathered);
      return;
    }
    this.gathering = false;
    void this.drain();
  };

  private async drain(): Promise<void> {
    this.running = true;
    try {
      await this.runBatch(this.takeBatch());
    } finally {
      this.running = false;
      if (this.queue.length > 0) this.gather();
    }
  }

  /** Up to MAX_BATCH saves in arrival order, at most one per program. */
  private takeBatch(): Queued[] {
    const batch: Queued[] = [];
    const programs = new Set<string>();
    for (let i = 0; i < this.queue.length && batch.length < MAX_BATCH; ) {
      const item = this.queue[i];
      if (programs.has(item.write.programId)) i += 1;
      else {
        programs.add(item.write.programId);
        batch.push(item);
        this.queue.splice(i, 1);
      }
    }
    return batch;
  }

  private async runBatch(batch: Queued[]): Promise<void> {
    try {
      const appended = await appendVersions(this.db, batch.map((q) => q.write));
      for (const q of batch) q.resolve(appended.get(q.write.programId) ?? null);
    } catch (error) {
      if (batch.length === 1) return batch[0].reject(error);
      for (const q of batch) {
        try {
          q.resolve((await appendVersions(this.db, [q.write])).get(q.write.programId) ?? null);
        } catch (single) {
          q.reject(single);
        }
      }
    }
  }
}

/** One statement for the whole batch; answers the new version number per program that moved on. */
async function appendVersions(db: Db, writes: VersionWrite[]): Promise<Map<string, number>> {
  const rows: SQL[] = writes.map(
    (w) => sql`(${w.programId}::uuid, ${w.baseVersion}::int, ${w.documentJson}::jsonb, ${w.message}::text, ${w.authorId}::uuid, ${w.now.toISOString()}::timestamptz)`,
  );
  const appended = await executeRows<{ program_id: string; number: number }>(
    db,
    sql`with input (program_id, base, document, message, author_id, at) as (values ${sql.join(rows, sql`, `)}),
      moved as (
        update programs p set head_version = p.head_version + 1, updated_at = i.at
        from input i where p.id = i.program_id and p.head_version = i.base
        returning p.id, p.head_version),
      cleared as (
        delete from drafts d using moved m, input i
        where i.program_id = m.id and d.program_id = m.id and d.user_id = i.author_id)
      insert into program_versions (program_id, number, document, message, author_id, created_at)
      select m.id, m.head_version, i.document, i.message, i.author_id, i.at from moved m join input i on i.program_id = m.id
      returning program_id, number`,
  );
  return new Map(appended.map((r) => [r.program_id, Number(r.number)]));
}

const batchers = new WeakMap<Db, VersionBatcher>();

/** Appends through the batcher of this database handle (one queue per handle). */
export function appendVersionBatched(db: Db, write: VersionWrite): Promise<VersionWriteResult> {
  let batcher = batchers.get(db);
  if (!batcher) {
    batcher = new VersionBatcher(db);
    batchers.set(db, batcher);
  }
  return batcher.append(write);
}
