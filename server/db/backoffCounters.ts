/**
 * Back-off on top of the throttling counters (`rate_counters`, see `rateCounters.ts`): an attempt
 * is counted *before* the caller does the slow check (a password hash), and from the `free`-th
 * attempt in a window on, the back-off is set in the same step. So a burst of attempts sent at once
 * cannot all slip through before the first failure is written: the count, the check for a back-off
 * in force and the new back-off are one transaction under the counter's row lock, in every process
 * sharing the database. A caller whose attempt succeeds clears the counter (`clearCounter`), which
 * also lifts the back-off it set in advance.
 */
import { and, eq, inArray, isNull, like, lt, lte, or, sql } from 'drizzle-orm';
import type { Db } from './client';
import { rateCounters } from './schema';

/** How a back-off counter behaves. */
export interface BackoffPolicy {
  /** The count starts again this long after its first attempt (unless a back-off is in force). */
  windowMs: number;
  /** Attempts before the first back-off: the `free`-th attempt of a window, if it fails, makes the next one wait. */
  free: number;
  /** The first wait; each further attempt doubles it. */
  firstBackoffMs: number;
  /** The longest wait. */
  maxBackoffMs: number;
}

export type AttemptVerdict = { allowed: true; count: number } | { allowed: false; blockedUntil: Date };

/** The wait after the `count`-th attempt of a window fails, in ms; null while attempts are free. */
export function backoffAfter(count: number, policy: BackoffPolicy): number | null {
  if (count < policy.free) return null;
  return Math.min(policy.firstBackoffMs * 2 ** Math.min(count - policy.free, 30), policy.maxBackoffMs);
}

/**
 * Takes one attempt under `key`: refused (and not counted) while a back-off is in force; otherwise
 * counted, with the back-off its failure would earn already set.
 */
export async function takeAttempt(db: Db, key: string, now: Date, policy: BackoffPolicy): Promise<AttemptVerdict> {
  return db.transaction(async (tx) => {
    // The row, created (count 0, so that it is counted like any other below) or found, and locked,
    // in one statement. An insert that did nothing on a conflict and then a SELECT … FOR UPDATE
    // found no row on PostgreSQL when a successful sign-in cleared the counter in between (READ
    // COMMITTED: the fuzz test saw a 500); ON CONFLICT DO UPDATE always inserts or locks a row.
    const [row] = await tx
      .insert(rateCounters)
      .values({ key, windowStart: now, count: 0 })
      .onConflictDoUpdate({ target: rateCounters.key, set: { key: sql`excluded.key` } })
      .returning();
    if (!row) throw new Error(`rate counter ${key}: the upsert returned no row`);
    if (row.blockedUntil && row.blockedUntil > now) return { allowed: false, blockedUntil: row.blockedUntil };
    const fresh = row.windowStart.getTime() <= now.getTime() - policy.windowMs;
    const count = fresh ? 1 : row.count + 1;
    const wait = backoffAfter(count, policy);
    await tx
      .update(rateCounters)
      .set({ count, windowStart: fresh ? now : row.windowStart, blockedUntil: wait === null ? null : new Date(now.getTime() + wait) })
      .where(eq(rateCounters.key, key));
    return { allowed: true, count };
  });
}

/**
 * Deletes up to `limit` counters under `prefix` whose window started before `before` and that hold
 * no back-off still in force at `now`, so counters of addresses and e-mails tried once do not pile up.
 */
export async function deleteStaleCounters(db: Db, prefix: string, before: Date, now: Date, limit: number): Promise<number> {
  const stale = db
    .select({ key: rateCounters.key })
    .from(rateCounters)
    .where(
      and(
        like(rateCounters.key, `${prefix.replace(/[\\%_]/g, '\\$&')}%`),
        lt(rateCounters.windowStart, before),
        or(isNull(rateCounters.blockedUntil), lte(rateCounters.blockedUntil, now)),
      ),
    )
    .limit(limit);
  const rows = await db.delete(rateCounters).where(inArray(rateCounters.key, stale)).returning({ key: rateCounters.key });
  return rows.length;
}
