/**
 * Accounts: sign-in, inviting an instructor (the invitation itself: `invitations.ts`), password
 * reset. Sign-up with a join code is `signUp.ts`. Each function returns an Outcome; no HTTP here.
 */
import type { InvitationSent, SignInRequest } from '@shared/api';
import type { AppContext } from '../context';
import { publicUrl } from '../config';
import { hashPassword, verifyPassword } from '../auth/passwords';
import { hashToken, newToken, RESET_TOKEN_MS } from '../auth/oneTimeTokens';
import { findCredentials, findUserByEmail, setLastSignIn, setPasswordHash, type User } from '../db/users';
import { findUsableToken, insertToken, markTokenUsed } from '../db/oneTimeTokens';
import { passwordResetMail } from '../mail/templates';
import { failure, success, type Outcome } from '../http/failure';
import { sendInvitation } from './invitations';

/**
 * A well-formed hash no password matches, checked when the e-mail is unknown so that a wrong
 * address takes as long as a wrong password (no account discovery by timing).
 */
const NO_ACCOUNT_HASH = 'scrypt$32768$8$1$AAAAAAAAAAAAAAAAAAAAAA$AAAAAAAAAAAAAAAAAAAAAAAAAAAAAAAAAAAAAAAAAAA';

export async function signIn(ctx: AppContext, req: SignInRequest): Promise<Outcome<User>> {
  const found = await findCredentials(ctx.orm, req.email);
  const matches = await verifyPassword(req.password, found?.passwordHash ?? NO_ACCOUNT_HASH);
  if (!found || !matches) return failure('bad_credentials', 'The e-mail or password is wrong');
  const now = ctx.clock.now();
  await setLastSignIn(ctx.orm, found.user.id, now);
  return success({ ...found.user, lastSignInAt: now });
}

export async function inviteInstructor(ctx: AppContext, email: string, name: string | null): Promise<Outcome<InvitationSent>> {
  if (await findUserByEmail(ctx.orm, email)) {
    return failure('conflict', 'This e-mail already has an account', { fields: { email: 'already has an account' } });
  }
  return success(await sendInvitation(ctx, { email, name, role: 'instructor', classId: null, className: null }));
}

const BAD_LINK = { fields: { token: 'this link is not valid, was used already or has expired; ask for a new one' } };

/** The same answer whether or not the address has an account (no account discovery). */
export const RESET_ACCEPTED = 'If this address has an account, a reset link is on its way. It works once, for one hour.';

export async function requestPasswordReset(ctx: AppContext, email: string): Promise<void> {
  const user = await findUserByEmail(ctx.orm, email);
  if (!user) return;
  const now = ctx.clock.now();
  const { token, hash } = newToken();
  await insertToken(ctx.orm, { kind: 'reset', tokenHash: hash, email: user.email, userId: user.id, expiresAt: new Date(now.getTime() + RESET_TOKEN_MS), now });
  await ctx.mailer.send(passwordResetMail({ to: user.email, baseUrl: publicUrl(ctx.config), token }));
}

export async function confirmPasswordReset(ctx: AppContext, token: string, password: string): Promise<Outcome<null>> {
  const now = ctx.clock.now();
  const row = await findUsableToken(ctx.orm, 'reset', hashToken(token), now);
  if (!row?.userId || !(await markTokenUsed(ctx.orm, row.id, now))) {
    return failure('validation', 'This reset link cannot be used', BAD_LINK);
  }
  await setPasswordHash(ctx.orm, row.userId, await hashPassword(password, ctx.passwordParams));
  return success(null);
}
