/**
 * Passwords after sign-up: reset links (asked for by the person or sent by an administrator),
 * using one, and a signed-in user changing their own. Every new password ends all the account's
 * sessions; only the newest reset link of an account works.
 */
import type { ChangePasswordRequest } from '@shared/api';
import type { AppContext } from '../context';
import { publicUrl } from '../config';
import { hashPassword, verifyPassword } from '../auth/passwords';
import { hashToken, newToken, RESET_TOKEN_MS } from '../auth/oneTimeTokens';
import { passwordAccepted, takeAccountAttempt, throttledFailure } from '../auth/signInThrottle';
import { findCredentials, findUserByEmail, findUserById, type User } from '../db/users';
import { findOpenResetToken, issueResetToken } from '../db/oneTimeTokens';
import { replacePassword } from '../db/sessions';
import { countAttempt } from '../db/rateCounters';
import { passwordResetMail } from '../mail/templates';
import { failure, success, type Outcome } from '../http/failure';
import { sessionEnd } from './sessions';
import { iso } from './views';

/** The same answer whether or not the address has an account (no account discovery). */
export const RESET_ACCEPTED = 'If this address has an account, a reset link is on its way. It works once, for one hour.';

/** Reset mails one account receives per hour at most when people ask for them (against mail floods). */
const RESET_MAILS_PER_HOUR = 5;
const HOUR_MS = 60 * 60 * 1000;

const BAD_LINK = { fields: { token: 'this link is not valid, was used already, was replaced by a newer one or has expired; ask for a new one' } };

/** Makes a new reset link for the account (ending its older ones) and mails it. */
async function issueResetLink(ctx: AppContext, user: User): Promise<{ email: string; expiresAt: string } | null> {
  const now = ctx.clock.now();
  const expiresAt = new Date(now.getTime() + RESET_TOKEN_MS);
  const { token, hash } = newToken();
  if (!(await issueResetToken(ctx.orm, { tokenHash: hash, email: user.email, userId: user.id, expiresAt, now }))) return null;
  await ctx.mailer.send(passwordResetMail({ to: user.email, baseUrl: publicUrl(ctx.config), token }));
  return { email: user.email, expiresAt: iso(expiresAt) };
}

/**
 * A reset link asked for on the sign-in page. Runs after the answer has gone (see the route), so
 * nothing here can show in how long the answer took. Nothing is sent to an unknown address, a
 * deactivated account, or an account that had its hourly share of reset mails.
 */
export async function sendResetLinkIfAccount(ctx: AppContext, email: string): Promise<void> {
  const user = await findUserByEmail(ctx.orm, email);
  if (!user || user.deactivatedAt) return;
  const mails = await countAttempt(ctx.orm, `reset-mail:${user.id}`, ctx.clock.now(), HOUR_MS);
  if (mails.count > RESET_MAILS_PER_HOUR) {
    ctx.logger.warn({ userId: user.id }, 'reset link not sent: hourly limit of reset mails reached');
    return;
  }
  await issueResetLink(ctx, user);
}

/** An administrator sends an account a reset link (the answer says where it went). */
export async function sendResetLinkTo(ctx: AppContext, userId: string): Promise<Outcome<{ email: string; expiresAt: string }>> {
  const user = await findUserById(ctx.orm, userId);
  if (!user) return failure('not_found', 'This account does not exist');
  if (user.deactivatedAt) return failure('conflict', 'This account is deactivated; reactivate it first, then send the link');
  const sent = await issueResetLink(ctx, user);
  return sent ? success(sent) : failure('not_found', 'This account does not exist');
}

/** Sets a new password with a reset link: the link and every other link of the account end, and so do its sessions. */
export async function confirmPasswordReset(ctx: AppContext, token: string, password: string): Promise<Outcome<null>> {
  const tokenHash = hashToken(token);
  const open = await findOpenResetToken(ctx.orm, tokenHash, ctx.clock.now());
  if (!open?.userId) return failure('validation', 'This reset link cannot be used', BAD_LINK);
  const passwordHash = await hashPassword(password, ctx.passwordParams);
  // Checked again under the account's lock: another request may have used or replaced the link meanwhile.
  const done = await replacePassword(ctx.orm, { userId: open.userId, passwordHash, now: ctx.clock.now(), resetTokenHash: tokenHash });
  if (!done) return failure('validation', 'This reset link cannot be used', BAD_LINK);
  // Whoever holds the mailbox may sign in at once, whatever a guesser did to the account's counter.
  await passwordAccepted(ctx.orm, open.email);
  return success(null);
}

/**
 * A signed-in user changes their own password. The current password is checked against the same
 * per-account counter as sign-in (a session left open on a lab computer must not become a way to
 * guess it). Every session of the account ends; the one making the change goes on under a new
 * session, whose id is the answer.
 */
export async function changePassword(ctx: AppContext, user: User, req: ChangePasswordRequest): Promise<Outcome<{ sessionId: string }>> {
  const now = ctx.clock.now();
  const attempt = await takeAccountAttempt(ctx.orm, user.email, now);
  if (!attempt.allowed) return throttledFailure(attempt, now);
  const found = await findCredentials(ctx.orm, { id: user.id });
  if (!found || !(await verifyPassword(req.currentPassword, found.passwordHash))) {
    return failure('validation', 'The current password is wrong', { fields: { currentPassword: 'is not your current password' } });
  }
  await passwordAccepted(ctx.orm, user.email);
  const passwordHash = await hashPassword(req.newPassword, ctx.passwordParams);
  const done = await replacePassword(ctx.orm, { userId: user.id, passwordHash, now, reissueUntil: sessionEnd(now) });
  if (!done?.sessionId) return failure('not_found', 'This account no longer exists');
  return success({ sessionId: done.sessionId });
}
