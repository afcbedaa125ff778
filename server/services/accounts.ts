/**
 * Accounts: sign-in and inviting an instructor (the invitation itself: `invitations.ts`). Sign-up
 * with a join code is `signUp.ts`; passwords after sign-up are in `passwords.ts`. Each function
 * returns an Outcome; no HTTP here.
 */
import type { InvitationSent, SignInRequest } from '@shared/api';
import type { AppContext } from '../context';
import { verifyPassword } from '../auth/passwords';
import { addressSucceeded, passwordAccepted, reserveAddressAttempt, sweepSignInCounters, takeAccountAttempt, throttledFailure } from '../auth/signInThrottle';
import { findCredentials, findUserByEmail, setLastSignIn, type User } from '../db/users';
import { failure, success, type Outcome } from '../http/failure';
import { sendInvitation } from './invitations';

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
  const byAddress = await reserveAddressAttempt(ctx.orm, address, ctx.config.AUTH_RATE_LIMIT, now);
  if (!byAddress.allowed) return throttledFailure(byAddress, now);
  const byAccount = await takeAccountAttempt(ctx.orm, req.email, now);
  if (!byAccount.allowed) {
    // Refused before any password was tried: not a failure of this address.
    await addressSucceeded(ctx.orm, address);
    return throttledFailure(byAccount, now);
  }
  const found = await findCredentials(ctx.orm, { email: req.email });
  const matches = await verifyPassword(req.password, found?.passwordHash ?? NO_ACCOUNT_HASH);
  // The address keeps its slot for a failure and gives it back for the right password.
  if (!found || !matches) return failure('bad_credentials', 'The e-mail or password is wrong');
  await addressSucceeded(ctx.orm, address);
  await passwordAccepted(ctx.orm, req.email);
  await sweepSignInCounters(ctx.orm, now);
  if (found.user.deactivatedAt) return failure('forbidden', DEACTIVATED_MESSAGE);
  await setLastSignIn(ctx.orm, found.user.id, now);
  return success({ ...found.user, lastSignInAt: now });
}

export async function inviteInstructor(ctx: AppContext, email: string, name: string | null): Promise<Outcome<InvitationSent>> {
  if (await findUserByEmail(ctx.orm, email)) {
    return failure('conflict', 'This e-mail already has an account', { fields: { email: 'already has an account' } });
  }
  return success(await sendInvitation(ctx, { email, name, role: 'instructor', classId: null, className: null }));
}
