/**
 * Sessions as the routes need them: open one (a row, and the signed token that names it), end one,
 * end all of a user's. Whether a token is still good is `http/authenticate.ts`'s check.
 */
import type { AppContext } from '../context';
import { SESSION_SECONDS, signSession } from '../auth/session';
import { deleteEndedSessions, insertSession, revokeSession, revokeUserSessions } from '../db/sessions';

/** Rows of ended sessions deleted per sign-in: enough to keep up, small enough to cost little. */
const ENDED_SESSIONS_SWEPT = 100;

/** When a session opened at `now` ends. */
export function sessionEnd(now: Date): Date {
  return new Date(now.getTime() + SESSION_SECONDS * 1000);
}

/** The token of an existing session row. */
export function sessionToken(ctx: AppContext, userId: string, sessionId: string): Promise<string> {
  return signSession({ userId, sessionId }, ctx.sessionKey, ctx.clock.now());
}

/** Opens a session for the user (sweeping some ended ones first) and answers its token. */
export async function openSession(ctx: AppContext, userId: string): Promise<string> {
  const now = ctx.clock.now();
  await deleteEndedSessions(ctx.orm, now, ENDED_SESSIONS_SWEPT);
  const sessionId = await insertSession(ctx.orm, { userId, now, expiresAt: sessionEnd(now) });
  return sessionToken(ctx, userId, sessionId);
}

/** Signs out: the session's row is revoked, so its token stops working everywhere at once. */
export async function endSession(ctx: AppContext, sessionId: string): Promise<void> {
  await revokeSession(ctx.orm, sessionId, ctx.clock.now());
}

/** "Sign out everywhere" (and deactivation): every session of the user ends, this one included. */
export async function endAllSessions(ctx: AppContext, userId: string): Promise<number> {
  return revokeUserSessions(ctx.orm, userId, ctx.clock.now());
}
