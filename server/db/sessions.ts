/**
 * Session rows (`sessions`): one per sign-in. A session token is good only while its row exists, is
 * not revoked, has not expired and its user is not deactivated.
 *
 * Where several processes share the database (no row caches, see `rowCache.ts`), the check reads
 * the row joined with its user on every request, so an ended session is refused at once by every
 * process. Where this process alone writes the database (PGlite under the DATA_DIR lock), the rows
 * are read through a row cache, because a query costs about 1 ms of the server's CPU here (measured:
 * `npm run bench -- sessionCheck`); every function below that revokes a session drops its cached
 * row once the change has committed, before it returns, so a revocation takes effect at once in
 * this process too. Expiry is checked on every request either way.
 */
import { and, eq, gt, inArray, isNotNull, isNull, lte, or } from 'drizzle-orm';
import type { Db } from './client';
import { sessions, users } from './schema';
import { findUserById, lockUser, publicColumns, setPasswordHash, type User } from './users';
import { useResetToken } from './oneTimeTokens';
import { RowCache, rowCachesOf } from './rowCache';

/** What the check needs of a session row. */
interface SessionState {
  expiresAt: Date;
  revokedAt: Date | null;
}

/** Sessions kept per database handle: about a large college's worth of open sessions. */
const SESSIONS_CACHED = 5_000;
const sessionCaches = new WeakMap<object, RowCache<SessionState>>();

/** The session cache of `db`, only where the row caches are on (this process alone writes). */
function sessionCacheOf(db: Db): RowCache<SessionState> | undefined {
  if (!rowCachesOf(db)) return undefined;
  let cache = sessionCaches.get(db);
  if (!cache) {
    cache = new RowCache<SessionState>(SESSIONS_CACHED);
    sessionCaches.set(db, cache);
  }
  return cache;
}

/** Keyed by user and session, so all of one user's sessions can be dropped together. */
const sessionKey = (userId: string, sessionId: string): string => `${userId}/${sessionId}`;

/** After a committed change that ended sessions of `userId` (one, or all when `sessionId` is omitted). */
function dropCachedSessions(db: Db, userId: string, sessionId?: string): void {
  const cache = sessionCacheOf(db);
  if (!cache) return;
  if (sessionId) cache.drop(sessionKey(userId, sessionId));
  else cache.dropWhere((key) => key.startsWith(`${userId}/`));
}

/** Opens a session for `userId` until `expiresAt`; its id goes into the token (`sid`). */
export async function insertSession(db: Db, s: { userId: string; now: Date; expiresAt: Date }): Promise<string> {
  const [row] = await db.insert(sessions).values({ userId: s.userId, createdAt: s.now, expiresAt: s.expiresAt }).returning({ id: sessions.id });
  return row!.id;
}

/**
 * The user of an open session: the row `sessionId` of `userId` exists, is not revoked, expires
 * after `now`, and the user is not deactivated. Null otherwise.
 */
export async function findSessionUser(db: Db, sessionId: string, userId: string, now: Date): Promise<User | null> {
  const cache = sessionCacheOf(db);
  if (!cache) return findSessionUserJoined(db, sessionId, userId, now);
  const load = async () =>
    (
      await db
        .select({ expiresAt: sessions.expiresAt, revokedAt: sessions.revokedAt })
        .from(sessions)
        .where(and(eq(sessions.id, sessionId), eq(sessions.userId, userId)))
        .limit(1)
    )[0] ?? null;
  const session = await cache.read(sessionKey(userId, sessionId), load);
  if (!session || session.revokedAt || session.expiresAt <= now) return null;
  const user = await findUserById(db, userId);
  return user && !user.deactivatedAt ? user : null;
}

/** The same check in one query, for a database other processes write too. */
async function findSessionUserJoined(db: Db, sessionId: string, userId: string, now: Date): Promise<User | null> {
  const rows = await db
    .select(publicColumns)
    .from(sessions)
    .innerJoin(users, eq(users.id, sessions.userId))
    .where(and(eq(sessions.id, sessionId), eq(sessions.userId, userId), isNull(sessions.revokedAt), gt(sessions.expiresAt, now), isNull(users.deactivatedAt)))
    .limit(1);
  return rows[0] ?? null;
}

/** Ends one session (sign-out). */
export async function revokeSession(db: Db, sessionId: string, now: Date): Promise<void> {
  const rows = await db
    .update(sessions)
    .set({ revokedAt: now })
    .where(and(eq(sessions.id, sessionId), isNull(sessions.revokedAt)))
    .returning({ userId: sessions.userId });
  for (const row of rows) dropCachedSessions(db, row.userId, sessionId);
}

/**
 * Ends every open session of a user; answers how many were open. Inside a transaction the caller
 * drops the cached rows after the commit (`replacePassword` does).
 */
export async function revokeUserSessions(db: Db, userId: string, now: Date): Promise<number> {
  const rows = await db
    .update(sessions)
    .set({ revokedAt: now })
    .where(and(eq(sessions.userId, userId), isNull(sessions.revokedAt)))
    .returning({ id: sessions.id });
  dropCachedSessions(db, userId);
  return rows.length;
}

/** How many sessions of a user are open at `now` (tests and the account page's wording). */
export async function countOpenSessions(db: Db, userId: string, now: Date): Promise<number> {
  const rows = await db
    .select({ id: sessions.id })
    .from(sessions)
    .where(and(eq(sessions.userId, userId), isNull(sessions.revokedAt), gt(sessions.expiresAt, now)));
  return rows.length;
}

/** A new password for an account, and how it was authorised. */
export interface PasswordReplacement {
  userId: string;
  passwordHash: string;
  now: Date;
  /** Open one new session until then (the one that changed the password keeps going, under a new id). */
  reissueUntil?: Date;
  /** The hash of the reset link being used: it and every other open link of the account end. */
  resetTokenHash?: string;
}

/**
 * Sets a new password hash and ends every session of the user, in one transaction under the
 * account's row lock; with `resetTokenHash`, only if that link is still open. Answers the reissued
 * session's id (or null), or undefined when nothing changed (the account is gone, the link was
 * used or replaced meanwhile). The cached `User` holds no hash, so no cached row goes stale here.
 */
export async function replacePassword(db: Db, change: PasswordReplacement): Promise<{ sessionId: string | null } | undefined> {
  const result = await db.transaction(async (tx) => {
    if (!(await lockUser(tx, change.userId))) return undefined;
    if (change.resetTokenHash !== undefined && !(await useResetToken(tx, change.userId, change.resetTokenHash, change.now))) return undefined;
    await setPasswordHash(tx, change.userId, change.passwordHash);
    await revokeUserSessions(tx, change.userId, change.now);
    const sessionId = change.reissueUntil ? await insertSession(tx, { userId: change.userId, now: change.now, expiresAt: change.reissueUntil }) : null;
    return { sessionId };
  });
  // The transaction's handle has no caches: the sessions it ended leave this process's cache now.
  if (result) dropCachedSessions(db, change.userId);
  return result;
}

/**
 * Deletes up to `limit` rows of sessions that can never be used again (expired or revoked), oldest
 * first; answers how many went. Called on sign-in, so the table stays about as large as the number
 * of open sessions without a scheduled job.
 */
export async function deleteEndedSessions(db: Db, now: Date, limit: number): Promise<number> {
  const ended = db
    .select({ id: sessions.id })
    .from(sessions)
    .where(or(lte(sessions.expiresAt, now), isNotNull(sessions.revokedAt)))
    .orderBy(sessions.expiresAt)
    .limit(limit);
  const rows = await db.delete(sessions).where(inArray(sessions.id, ended)).returning({ id: sessions.id });
  return rows.length;
}
