/**
 * Invitations. An instructor invitation (sent by an admin) creates an instructor account. A class
 * invitation (a roster row, or one student added by hand) either creates a student account that is
 * enrolled in the class, or, when the address has an account already, lets that account, signed
 * in, join the class. Nobody is enrolled without accepting, and whoever invited learns nothing
 * about the address from the answer. Sending an invitation ends the older open ones of the same
 * kind for that address (and class); using one ends the others.
 */
import type { AcceptInvitationRequest, ClassSummary, InvitationSent, InvitationView } from '@shared/api';
import type { AppContext } from '../context';
import { publicUrl } from '../config';
import { hashPassword } from '../auth/passwords';
import { hashToken, INVITE_TOKEN_MS, newToken } from '../auth/oneTimeTokens';
import { findUserByEmail, insertUser, setLastSignIn, type User } from '../db/users';
import { enrol, findClass } from '../db/classes';
import { findUsableToken, issueScopedToken, useScopedToken, type OneTimeToken } from '../db/oneTimeTokens';
import { invitationMail } from '../mail/templates';
import { classInvitationForAccountMail } from '../mail/joinMails';
import { failure, success, type Outcome } from '../http/failure';
import { getClass } from './classes';
import { iso } from './views';

/** The one answer for a link that is unknown, used, ended or expired (they are not told apart). */
export const BAD_INVITATION_LINK = failure('validation', 'This invitation link cannot be used', {
  fields: { token: 'this link is not valid, was used already or has expired; ask for a new one' },
});

/**
 * Sends an invitation e-mail, ending the older open invitations of the same address and class (or,
 * for an account invitation, of the same address). The mail's wording depends on whether the
 * address has an account; what the caller gets back does not.
 */
export async function sendInvitation(
  ctx: AppContext,
  a: { email: string; name: string | null; role: User['role']; classId: string | null; className: string | null },
): Promise<InvitationSent> {
  const now = ctx.clock.now();
  const expiresAt = new Date(now.getTime() + INVITE_TOKEN_MS);
  const { token, hash } = newToken();
  await issueScopedToken(ctx.orm, { kind: 'invite', tokenHash: hash, email: a.email, role: a.role, classId: a.classId, invitedName: a.name, expiresAt, now });
  const baseUrl = publicUrl(ctx.config);
  const account = a.className !== null ? await findUserByEmail(ctx.orm, a.email) : null;
  const mail =
    account && a.className !== null
      ? classInvitationForAccountMail({ to: a.email, baseUrl, token, className: a.className, expiresAt })
      : invitationMail({ to: a.email, baseUrl, token, role: a.role, className: a.className, expiresAt });
  await ctx.mailer.send(mail);
  return { email: a.email, role: a.role, expiresAt: iso(expiresAt) };
}

async function usableInvitation(ctx: AppContext, token: string): Promise<OneTimeToken | null> {
  return findUsableToken(ctx.orm, 'invite', hashToken(token), ctx.clock.now());
}

/** What the link offers; only the holder of the link (the invited address) learns whether it has an account. */
export async function lookupInvitation(ctx: AppContext, token: string): Promise<Outcome<InvitationView>> {
  const row = await usableInvitation(ctx, token);
  if (!row) return BAD_INVITATION_LINK;
  const cls = row.classId ? await findClass(ctx.orm, row.classId) : null;
  return success({
    email: row.email,
    role: row.role ?? 'student',
    name: row.invitedName,
    classId: cls?.id ?? null,
    className: cls?.name ?? null,
    expiresAt: iso(row.expiresAt),
    hasAccount: (await findUserByEmail(ctx.orm, row.email)) !== null,
  });
}

/**
 * Creates the account an invitation or a sign-up link was for (its address, role and class), uses
 * the link (ending the others of its scope) and enrols the account in the link's class.
 */
export async function createAccountFromLink(ctx: AppContext, row: OneTimeToken, name: string, password: string): Promise<Outcome<User>> {
  const now = ctx.clock.now();
  const wayOn =
    row.kind === 'signup' ? 'sign in with it, then join the class with its join code on the Classes page' : row.classId ? 'sign in with it, then open this link again to join the class' : 'sign in with it instead';
  const exists = failure('conflict', `An account with this e-mail exists already; ${wayOn}`, { fields: { token: 'the address already has an account' } });
  if (await findUserByEmail(ctx.orm, row.email)) return exists;
  // Hashed before the link is used, so a slow hash cannot leave a used link and no account.
  const passwordHash = await hashPassword(password, ctx.passwordParams);
  if (!(await useScopedToken(ctx.orm, row, now))) return BAD_INVITATION_LINK;
  const user = await insertUser(ctx.orm, { email: row.email, name, role: row.role ?? 'student', passwordHash, createdAt: now });
  if (!user) return exists;
  if (row.classId) await enrol(ctx.orm, row.classId, user.id, now);
  await setLastSignIn(ctx.orm, user.id, now);
  return success({ ...user, lastSignInAt: now });
}

/** Accepting an invitation to an address without an account: the account is created and signed in. */
export async function acceptInvitation(ctx: AppContext, req: AcceptInvitationRequest): Promise<Outcome<User>> {
  const row = await usableInvitation(ctx, req.token);
  if (!row) return BAD_INVITATION_LINK;
  return createAccountFromLink(ctx, row, req.name, req.password);
}

/**
 * The signed-in account accepts a class invitation to its own address and joins the class. Only a
 * student account joins a class as a student; the refusal is told to the person accepting, never
 * to whoever invited them.
 */
export async function joinByInvitation(ctx: AppContext, actor: User, token: string): Promise<Outcome<ClassSummary>> {
  const row = await usableInvitation(ctx, token);
  if (!row) return BAD_INVITATION_LINK;
  if (!row.classId) {
    return failure('conflict', 'This invitation makes a new account, and you are signed in to one already; ask the administrator about your account instead');
  }
  if (row.email.toLowerCase() !== actor.email.toLowerCase()) {
    return failure('forbidden', 'This invitation is for another e-mail address: sign out, then sign in with the address it was sent to');
  }
  if (actor.role !== 'student') {
    return failure('forbidden', `Only student accounts join a class as students, and this is an ${actor.role} account; ask the class's instructor to invite a student address`);
  }
  const now = ctx.clock.now();
  if (!(await useScopedToken(ctx.orm, row, now))) return BAD_INVITATION_LINK;
  await enrol(ctx.orm, row.classId, actor.id, now);
  return getClass(ctx, actor, row.classId);
}
