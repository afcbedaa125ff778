/**
 * Sign-up with a join code, without account discovery. Every well-formed request with a valid join
 * code gets the same 202 "check your e-mail", and the work that depends on the address runs after
 * that answer has gone (`deliverSignUp`): a new address gets a link to finish creating the account,
 * where the password is chosen (so no password waits in a token, and the answer costs the same
 * for every address: no hash); an address with an account gets a mail saying so, with the way to
 * sign in and join the class.
 */
import type { FinishSignUpRequest, SignUpRequest, SignUpView } from '@shared/api';
import type { AppContext } from '../context';
import { publicUrl } from '../config';
import { hashToken, newToken, SIGN_UP_TOKEN_MS } from '../auth/oneTimeTokens';
import { findUserByEmail, type User } from '../db/users';
import { findClass, findClassByJoinCode, type ClassRecord } from '../db/classes';
import { findUsableToken, issueScopedToken, type OneTimeToken } from '../db/oneTimeTokens';
import { accountExistsMail, finishSignUpMail } from '../mail/joinMails';
import { failure, success, type Outcome } from '../http/failure';
import { createAccountFromLink } from './invitations';
import { iso } from './views';

/** The one answer to every accepted sign-up, whether or not the address has an account. */
export const SIGN_UP_ACCEPTED = 'Check your e-mail: a message to this address tells you how to go on. It can take a few minutes to arrive; look in the spam folder too.';

const BAD_SIGN_UP_LINK = failure('validation', 'This sign-up link cannot be used', {
  fields: { token: 'this link is not valid, was used already or has expired; sign up again with the join code' },
});

/** The class a join code opens; the refusal names the field (it says nothing about any address). */
export async function classForJoinCode(ctx: AppContext, joinCode: string): Promise<Outcome<ClassRecord>> {
  const cls = await findClassByJoinCode(ctx.orm, joinCode);
  return cls ? success(cls) : failure('validation', 'No class has this join code', { fields: { joinCode: 'no class has this join code; check it with your instructor' } });
}

/**
 * The part of a sign-up that depends on the address, run after answering: a link to finish the
 * account (ending the older sign-up links of the address for this class), or a mail that the
 * account exists.
 */
export async function deliverSignUp(ctx: AppContext, req: SignUpRequest, cls: ClassRecord): Promise<void> {
  const baseUrl = publicUrl(ctx.config);
  if (await findUserByEmail(ctx.orm, req.email)) {
    await ctx.mailer.send(accountExistsMail({ to: req.email, baseUrl, className: cls.name }));
    return;
  }
  const now = ctx.clock.now();
  const expiresAt = new Date(now.getTime() + SIGN_UP_TOKEN_MS);
  const { token, hash } = newToken();
  await issueScopedToken(ctx.orm, { kind: 'signup', tokenHash: hash, email: req.email, role: 'student', classId: cls.id, invitedName: req.name, expiresAt, now });
  await ctx.mailer.send(finishSignUpMail({ to: req.email, baseUrl, token, className: cls.name, expiresAt }));
}

async function usableSignUp(ctx: AppContext, token: string): Promise<{ row: OneTimeToken; cls: ClassRecord } | null> {
  const row = await findUsableToken(ctx.orm, 'signup', hashToken(token), ctx.clock.now());
  const cls = row?.classId ? await findClass(ctx.orm, row.classId) : null;
  return row && cls ? { row, cls } : null;
}

/** What a sign-up link finishes, for the page where the password is chosen. */
export async function lookupSignUp(ctx: AppContext, token: string): Promise<Outcome<SignUpView>> {
  const found = await usableSignUp(ctx, token);
  if (!found) return BAD_SIGN_UP_LINK;
  const { row, cls } = found;
  return success({ email: row.email, name: row.invitedName ?? '', classId: cls.id, className: cls.name, expiresAt: iso(row.expiresAt) });
}

/** Creates the student account with the chosen password, enrols it in the class and signs it in. */
export async function finishSignUp(ctx: AppContext, req: FinishSignUpRequest): Promise<Outcome<User>> {
  const found = await usableSignUp(ctx, req.token);
  if (!found) return BAD_SIGN_UP_LINK;
  const made = await createAccountFromLink(ctx, found.row, req.name, req.password);
  // A link used meanwhile is a sign-up link, not an invitation: say so in the sign-up's words.
  return !made.ok && made.failure.code === 'validation' ? BAD_SIGN_UP_LINK : made;
}
