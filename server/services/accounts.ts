/**
 * Accounts: sign-in, student sign-up with a join code, invitations (instructors by an admin,
 * students from a roster). Passwords after sign-up are in `passwords.ts`. Each function returns
 * an Outcome; no HTTP here.
 */
import type { AcceptInvitationRequest, InvitationSent, InvitationView, SignInRequest, SignUpRequest } from '@shared/api';
import type { AppContext } from '../context';
import { publicUrl } from '../config';
import { hashPassword, verifyPassword } from '../auth/passwords';
import { hashToken, INVITE_TOKEN_MS, newToken } from '../auth/oneTimeTokens';
import { addressFailed, checkAddress, passwordAccepted, sweepSignInCounters, takeAccountAttempt, throttledFailure } from '../auth/signInThrottle';
import { findCredentials, findUserByEmail, insertUser, setLastSignIn, type User } from '../db/users';
import { enrol, findClass, findClassByJoinCode } from '../db/classes';
import { findUsableToken, insertToken, markTokenUsed } from '../db/oneTimeTokens';
import { invitationMail } from '../mail/templates';
import { failure, success, type Outcome } from '../http/failure';
import { iso } from './views';

/**
 * A well-formed hash no password matches, checked when the e-mail is unknown so that a wrong
 * address takes as long as a wrong password (no account discovery by timing).
 */
const NO_ACCOUNT_HASH = 'scrypt$32768$8$1$AAAAAAAAAAAAAAAAAAAAAA$AAAAAAAAAAAAAAAAAAAAAAAAAAAAAAAAAAAAAAAAAAA';

/** Said only after the right password, so it tells nothing to someone guessing. */
export const DEACTIVATED_MESSAGE = 'This account has been deactivated. Ask your instructor or an administrator to reactivate it.';

/**
 * Checks an e-mail and password from `address`, within the throttle of `auth/signInThrottle.ts`
 * (failures only count: per account with back-off, per address); opening the session is the
 * caller's next step.
 */
export async function signIn(ctx: AppContext, req: SignInRequest, address: string): Promise<Outcome<User>> {
  const now = ctx.clock.now();
  const byAddress = await checkAddress(ctx.orm, address, ctx.config.AUTH_RATE_LIMIT, now);
  if (!byAddress.allowed) return throttledFailure(byAddress, now);
  const byAccount = await takeAccountAttempt(ctx.orm, req.email, now);
  if (!byAccount.allowed) return throttledFailure(byAccount, now);
  const found = await findCredentials(ctx.orm, { email: req.email });
  const matches = await verifyPassword(req.password, found?.passwordHash ?? NO_ACCOUNT_HASH);
  if (!found || !matches) {
    await addressFailed(ctx.orm, address, now);
    return failure('bad_credentials', 'The e-mail or password is wrong');
  }
  await passwordAccepted(ctx.orm, req.email);
  await sweepSignInCounters(ctx.orm, now);
  if (found.user.deactivatedAt) return failure('forbidden', DEACTIVATED_MESSAGE);
  await setLastSignIn(ctx.orm, found.user.id, now);
  return success({ ...found.user, lastSignInAt: now });
}

export async function signUp(ctx: AppContext, req: SignUpRequest): Promise<Outcome<User>> {
  const cls = await findClassByJoinCode(ctx.orm, req.joinCode);
  if (!cls) return failure('validation', 'No class has this join code', { fields: { joinCode: 'no class has this join code; check it with your instructor' } });
  const now = ctx.clock.now();
  const user = await insertUser(ctx.orm, { email: req.email, name: req.name, role: 'student', passwordHash: await hashPassword(req.password, ctx.passwordParams), createdAt: now });
  if (!user) return failure('conflict', 'An account with this e-mail already exists', { fields: { email: 'already has an account; sign in instead' } });
  await enrol(ctx.orm, cls.id, user.id, now);
  await setLastSignIn(ctx.orm, user.id, now);
  return success({ ...user, lastSignInAt: now });
}

/** Sends an invitation e-mail; the account is created when the person accepts. */
export async function sendInvitation(
  ctx: AppContext,
  a: { email: string; name: string | null; role: User['role']; classId: string | null; className: string | null },
): Promise<InvitationSent> {
  const now = ctx.clock.now();
  const expiresAt = new Date(now.getTime() + INVITE_TOKEN_MS);
  const { token, hash } = newToken();
  await insertToken(ctx.orm, { kind: 'invite', tokenHash: hash, email: a.email, role: a.role, classId: a.classId, invitedName: a.name, expiresAt, now });
  await ctx.mailer.send(invitationMail({ to: a.email, baseUrl: publicUrl(ctx.config), token, role: a.role, className: a.className, expiresAt }));
  return { email: a.email, role: a.role, expiresAt: iso(expiresAt) };
}

export async function inviteInstructor(ctx: AppContext, email: string, name: string | null): Promise<Outcome<InvitationSent>> {
  if (await findUserByEmail(ctx.orm, email)) {
    return failure('conflict', 'This e-mail already has an account', { fields: { email: 'already has an account' } });
  }
  return success(await sendInvitation(ctx, { email, name, role: 'instructor', classId: null, className: null }));
}

const BAD_LINK = { fields: { token: 'this link is not valid, was used already or has expired; ask for a new one' } };

export async function lookupInvitation(ctx: AppContext, token: string): Promise<Outcome<InvitationView>> {
  const row = await findUsableToken(ctx.orm, 'invite', hashToken(token), ctx.clock.now());
  if (!row) return failure('validation', 'This invitation link cannot be used', BAD_LINK);
  const cls = row.classId ? await findClass(ctx.orm, row.classId) : null;
  return success({ email: row.email, role: row.role ?? 'student', name: row.invitedName, className: cls?.name ?? null, expiresAt: iso(row.expiresAt) });
}

export async function acceptInvitation(ctx: AppContext, req: AcceptInvitationRequest): Promise<Outcome<User>> {
  const now = ctx.clock.now();
  const row = await findUsableToken(ctx.orm, 'invite', hashToken(req.token), now);
  if (!row) return failure('validation', 'This invitation link cannot be used', BAD_LINK);
  if (await findUserByEmail(ctx.orm, row.email)) {
    return failure('conflict', 'An account with this e-mail exists already; sign in instead', { fields: { token: 'the invited address already has an account' } });
  }
  if (!(await markTokenUsed(ctx.orm, row.id, now))) return failure('validation', 'This invitation link cannot be used', BAD_LINK);
  const passwordHash = await hashPassword(req.password, ctx.passwordParams);
  const user = await insertUser(ctx.orm, { email: row.email, name: req.name, role: row.role ?? 'student', passwordHash, createdAt: now });
  if (!user) return failure('conflict', 'An account with this e-mail exists already; sign in instead');
  if (row.classId) await enrol(ctx.orm, row.classId, user.id, now);
  await setLastSignIn(ctx.orm, user.id, now);
  return success({ ...user, lastSignInAt: now });
}
