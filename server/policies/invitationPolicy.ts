/**
 * Who may resend or cancel an invitation: a class invitation is the class's business (its
 * instructor and admins, as for the roster: `classPolicy` `manage`); an invitation to make an
 * instructor or administrator account is the administrators'. Anyone else does not learn it exists.
 */
import type { Db } from '../db/client';
import type { User } from '../db/users';
import { findClass } from '../db/classes';
import type { InvitationRecord } from '../db/invitationAdmin';
import type { Access } from './access';
import { classAccess } from './classPolicy';

export async function invitationAccess(db: Db, actor: User, invitation: InvitationRecord): Promise<Access> {
  if (invitation.classId === null) return actor.role === 'admin' ? 'allowed' : 'hidden';
  const cls = await findClass(db, invitation.classId);
  if (!cls) return 'hidden';
  const access = await classAccess(db, actor, cls, 'manage');
  // An enrolled student knows the class, not its invitations.
  return access === 'forbidden' ? 'hidden' : access;
}
