/**
 * The admin console beyond deactivation (`accountAdmin.ts`): role changes, usage counts, and
 * invitations (list, send again, cancel). Usage is counts only: administrators read no student work.
 */
import type { ChangeRoleRequest, InvitationEntry, Usage } from '@shared/api/administration';
import type { InvitationSent } from '@shared/api';
import type { AppContext } from '../context';
import { findUserByEmail, findUserById, setRole, type User } from '../db/users';
import { cancelInvitation, findInvitation, listAllInvitations, type InvitationRecord } from '../db/invitationAdmin';
import { countActiveStudents, countByRole, countClasses, submissionsPerDay, teachesAnyClass } from '../db/usage';
import { failure, success, type Outcome } from '../http/failure';
import { refusal } from '../policies/access';
import { invitationAccess } from '../policies/invitationPolicy';
import { sendInvitation } from './invitations';
import { inviteStudent } from './roster';
import { iso } from './views';

const DAY_MS = 24 * 60 * 60 * 1000;
/** Days in the submissions chart. */
export const USAGE_DAYS = 14;

export async function changeRole(ctx: AppContext, admin: User, userId: string, req: ChangeRoleRequest): Promise<Outcome<User>> {
  if (userId === admin.id) return failure('conflict', 'You cannot change your own role; another administrator can');
  const user = await findUserById(ctx.orm, userId);
  if (!user) return failure('not_found', 'This account does not exist');
  if (user.role === req.role) return success(user);
  if (req.role === 'student' && (await teachesAnyClass(ctx.orm, userId))) {
    return failure('conflict', `${user.name} teaches a class; a student account cannot. Keep the role, or remove their classes first`, { fields: { role: 'teaches a class' } });
  }
  const updated = await setRole(ctx.orm, userId, req.role);
  return updated ? success(updated) : failure('not_found', 'This account does not exist');
}

export async function usage(ctx: AppContext): Promise<Usage> {
  const now = ctx.clock.now();
  const today = Date.UTC(now.getUTCFullYear(), now.getUTCMonth(), now.getUTCDate());
  const first = new Date(today - (USAGE_DAYS - 1) * DAY_MS);
  const perDay = await submissionsPerDay(ctx.orm, first);
  const roles = await countByRole(ctx.orm);
  return {
    activeStudentsThisWeek: await countActiveStudents(ctx.orm, new Date(now.getTime() - 7 * DAY_MS)),
    students: roles.student,
    instructors: roles.instructor,
    classes: await countClasses(ctx.orm),
    submissionsPerDay: Array.from({ length: USAGE_DAYS }, (_, i) => {
      const day = new Date(first.getTime() + i * DAY_MS).toISOString().slice(0, 10);
      return { day, count: perDay.get(day) ?? 0 };
    }),
  };
}

export function invitationEntry(r: InvitationRecord, now: Date): InvitationEntry {
  const state = r.cancelled ? 'cancelled' : r.usedAt ? 'used' : r.expiresAt <= now ? 'expired' : 'open';
  return {
    id: r.id,
    email: r.email,
    name: r.invitedName,
    role: r.role,
    classId: r.classId,
    className: r.className,
    state,
    createdAt: iso(r.createdAt),
    expiresAt: iso(r.expiresAt),
  };
}

export async function listInvitationEntries(ctx: AppContext): Promise<InvitationEntry[]> {
  const now = ctx.clock.now();
  return (await listAllInvitations(ctx.orm)).map((r) => invitationEntry(r, now));
}

async function authorisedInvitation(ctx: AppContext, actor: User, id: string): Promise<Outcome<InvitationRecord>> {
  const found = await findInvitation(ctx.orm, id);
  if (!found) return failure('not_found', 'This invitation does not exist or is not open to you');
  return refusal(await invitationAccess(ctx.orm, actor, found), 'invitation') ?? success(found);
}

/**
 * Sends the invitation again as a new link (the old one stops working). An accepted invitation is
 * not sent again; a cancelled or expired one is.
 */
export async function resendInvitation(ctx: AppContext, actor: User, id: string): Promise<Outcome<InvitationSent>> {
  const found = await authorisedInvitation(ctx, actor, id);
  if (!found.ok) return found;
  const inv = found.value;
  if (inv.usedAt) return failure('conflict', `${inv.email} accepted this invitation already`);
  if (inv.classId !== null) {
    const sent = await inviteStudent(ctx, actor, inv.classId, { email: inv.email, name: inv.invitedName ?? inv.email });
    return sent.ok ? success({ email: sent.value.email, role: 'student', expiresAt: sent.value.expiresAt }) : sent;
  }
  if (await findUserByEmail(ctx.orm, inv.email)) return failure('conflict', `${inv.email} has an account already`);
  return success(await sendInvitation(ctx, { email: inv.email, name: inv.invitedName, role: inv.role, classId: null, className: null }));
}

export async function cancelOneInvitation(ctx: AppContext, actor: User, id: string): Promise<Outcome<InvitationEntry>> {
  const found = await authorisedInvitation(ctx, actor, id);
  if (!found.ok) return found;
  if (found.value.usedAt) return failure('conflict', `${found.value.email} accepted this invitation already; it cannot be cancelled`);
  if (found.value.cancelled) return success(invitationEntry(found.value, ctx.clock.now()));
  await cancelInvitation(ctx.orm, id, ctx.clock.now());
  const after = await findInvitation(ctx.orm, id);
  return after ? success(invitationEntry(after, ctx.clock.now())) : failure('not_found', 'This invitation does not exist or is not open to you');
}

