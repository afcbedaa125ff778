/** Pure helpers of the accept-invitation page. */
import type { ClassSummary } from '@shared/api/classes';
import type { InvitationView, UserView } from '@shared/api/auth';

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

/**
 * Where a new account lands: a student invited to a class goes to that class's labs (a new account
 * is enrolled in exactly that one class); everyone else to My programs.
 */
export function landingAfterAccept(user: UserView, invitation: InvitationView, classes: readonly ClassSummary[]): string {
  if (user.role !== 'student' || !invitation.className) return '/programs';
  const mine = classes.filter((c) => c.name === invitation.className);
  return mine.length === 1 ? `/classes/${mine[0]!.id}/labs` : '/programs';
}
