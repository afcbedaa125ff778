/** Pure helpers of the accept-invitation and finish-sign-up pages, and the invitation kept across signing in. */
import type { UserView } from '@shared/api/auth';
import type { InvitationView } from '@shared/api/invitations';

/** The token of an e-mailed link (`/accept-invitation#token=…`): in the fragment, so it never reaches a server log. */
export function tokenFromHash(hash: string): string | null {
  const token = new URLSearchParams(hash.replace(/^#/, '')).get('token');
  return token && token.trim() !== '' ? token.trim() : null;
}

/** What the invitation is for, to finish "You are invited to …". */
export function invitationPurpose(invitation: InvitationView): string {
  if (invitation.className) return `join the class “${invitation.className}”`;
  return invitation.role === 'instructor' ? 'teach on Rungwright as an instructor' : `use Rungwright as ${invitation.role === 'admin' ? 'an administrator' : 'a student'}`;
}

/** Where a new account lands: a student invited to a class goes to that class's labs; everyone else to My programs. */
export function landingAfterAccept(user: UserView, invitation: InvitationView): string {
  return user.role === 'student' && invitation.classId ? `/classes/${invitation.classId}/labs` : '/programs';
}

/**
 * What the page offers for an invitation to an address that has an account:
 * `sign-in` (nobody is signed in), `join` (signed in as the invited student account),
 * `not-a-student` (signed in as the invited address, but it is not a student account),
 * `someone-else` (signed in as another address), `not-for-accounts` (an account invitation, which
 * makes a new account, to an address that has one).
 */
export type ExistingAccountStep = 'sign-in' | 'join' | 'not-a-student' | 'someone-else' | 'not-for-accounts';

export function existingAccountStep(invitation: InvitationView, user: UserView | null): ExistingAccountStep {
  if (!invitation.classId) return 'not-for-accounts';
  if (!user) return 'sign-in';
  if (user.email.toLowerCase() !== invitation.email.toLowerCase()) return 'someone-else';
  return user.role === 'student' ? 'join' : 'not-a-student';
}

/**
 * The invitation a person left to sign in, kept in this tab's session storage (never in a URL, so
 * the token stays out of server logs) until they are back on the page.
 */
const PENDING_KEY = 'rungwright.pendingInvitation';

export function rememberInvitation(token: string, storage: Storage | undefined = globalThis.sessionStorage): void {
  try {
    storage?.setItem(PENDING_KEY, token);
  } catch {
    // Storage refused (private mode, full): the person opens the e-mailed link again instead.
  }
}

export function rememberedInvitation(storage: Storage | undefined = globalThis.sessionStorage): string | null {
  try {
    return storage?.getItem(PENDING_KEY) ?? null;
  } catch {
    return null;
  }
}

export function forgetInvitation(storage: Storage | undefined = globalThis.sessionStorage): void {
  try {
    storage?.removeItem(PENDING_KEY);
  } catch {
    // Nothing kept, nothing to forget.
  }
}
