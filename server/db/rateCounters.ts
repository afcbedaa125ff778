/**
 * Throttling counters in the database (`rate_counters`), so that every app process sharing it counts
 * the same attempts. One atomic upsert per hit: a window that has run out starts again at 1.
 *
 * Keys say what is counted, e.g. `signin-account:<user id>`, `signin-address:<ip>`,
 * `export:<user id>`. Times come from the caller's clock.
 */
import { eq, sql } from 'drizzle-orm';
import type { Db } from './client';
import { rateCounters } from './schema';

/** A counter as read back: attempts in the current window and any back-off in force. */
export interface RateCounter {
  count: number;
  windowStart: Date;
  blockedUntil: Date | null;
}

/**
 * Counts one attempt under `key` in a window of `windowMs` and returns the counter after it. A
 * window that started `windowMs` or more before `now` is replaced by a new one holding this attempt.
 */
export async function countAttempt(db: Db, key: string, now: Date, windowMs: number): Promise<RateCounter> {
  const expired = new Date(now.getTime() - windowMs);
  const rows = await db
    .insert(rateCounters)
    .values({ key, windowStart: now, count: 1 })
    .onConflictDoUpdate({
      target: rateCounters.key,
      set: {
        count: sql`case when ${rateCounters.windowStart} <= ${expired} then 1 else ${rateCounters.count} + 1 end`,
        windowStart: sql`case when ${rateCounters.windowStart} <= ${expired} then ${now} else ${rateCounters.windowStart} end`,
      },
    })
    .returning({ count: rateCounters.count, windowStart: rateCounters.windowStart, blockedUntil: rateCounters.blockedUntil });
  return rows[0]!;
}

/** The counter under `key`, or null when nothing was counted (an expired window still reads back). */
export async function readCounter(db: Db, key: string): Promise<RateCounter | null> {
  const rows = await db
    .select({ count: rateCounters.count, windowStart: rateCounters.windowStart, blockedUntil: rateCounters.blockedUntil })
    .from(rateCounters)
    .where(eq(rateCounters.key, key))
    .limit(1);
  return rows[0] ?? null;
}

/** Gives back one attempt counted under `key` (a reservation that turned out not to count). */
export async function uncountAttempt(db: Db, key: string): Promise<void> {
  await db
    .update(rateCounters)
    .set({ count: sql`greatest(${rateCounters.count} - 1, 0)` })
    .where(eq(rateCounters.key, key));
}

/** Refuses attempts under `key` until `until` (a back-off); the count is kept. */
export async function blockUntil(db: Db, key: string, until: Date): Promise<void> {
  await db.update(rateCounters).set({ blockedUntil: until }).where(eq(rateCounters.key, key));
}

/** Forgets `key` (e.g. a successful sign-in clears that account's failures). */
export async function clearCounter(db: Db, key: string): Promise<void> {
  await db.delete(rateCounters).where(eq(rateCounters.key, key));
}
