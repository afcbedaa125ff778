/**
 * Invitations as the admin console lists and changes them. A cancelled invitation keeps its row
 * (who was invited, when) under the kind `invite-cancelled`: `kind` has no CHECK constraint, so
 * no migration is needed, and every lookup of a usable invitation asks for `invite`, so a
 * cancelled link can never be used.
 */
import { and, desc, eq, isNull, sql } from 'drizzle-orm';
import type { Db } from './client';
import { classes, oneTimeTokens } from './schema';

export const CANCELLED_INVITE_KIND = 'invite-cancelled';

export interface InvitationRecord {
  id: string;
  cancelled: boolean;
  email: string;
  invitedName: string | null;
  role: 'student' | 'instructor' | 'admin';
  classId: string | null;
  className: string | null;
  createdAt: Date;
  expiresAt: Date;
  usedAt: Date | null;
}

const columns = {
  id: oneTimeTokens.id,
  cancelled: sql<boolean>`${oneTimeTokens.kind} = ${CANCELLED_INVITE_KIND}`,
  email: oneTimeTokens.email,
  invitedName: oneTimeTokens.invitedName,
  role: sql<'student' | 'instructor' | 'admin'>`coalesce(${oneTimeTokens.role}, 'student')`,
  classId: oneTimeTokens.classId,
  className: classes.name,
  createdAt: oneTimeTokens.createdAt,
  expiresAt: oneTimeTokens.expiresAt,
  usedAt: oneTimeTokens.usedAt,
};

const isInvitation = sql`${oneTimeTokens.kind} in ('invite', ${CANCELLED_INVITE_KIND})`;

/** Every invitation (class and account), newest first. */
export async function listAllInvitations(db: Db, limit = 300): Promise<InvitationRecord[]> {
  return db
    .select(columns)
    .from(oneTimeTokens)
    .leftJoin(classes, eq(classes.id, oneTimeTokens.classId))
    .where(isInvitation)
    .orderBy(desc(oneTimeTokens.createdAt), desc(oneTimeTokens.id))
    .limit(limit);
}

export async function findInvitation(db: Db, id: string): Promise<InvitationRecord | null> {
  const rows = await db.select(columns).from(oneTimeTokens).leftJoin(classes, eq(classes.id, oneTimeTokens.classId)).where(and(eq(oneTimeTokens.id, id), isInvitation)).limit(1);
  return rows[0] ?? null;
}

/** Cancels an unused invitation; false when it was used (or cancelled) meanwhile. */
export async function cancelInvitation(db: Db, id: string, now: Date): Promise<boolean> {
  const rows = await db
    .update(oneTimeTokens)
    .set({ kind: sql`${CANCELLED_INVITE_KIND}`, expiresAt: now })
    .where(and(eq(oneTimeTokens.id, id), eq(oneTimeTokens.kind, 'invite'), isNull(oneTimeTokens.usedAt)))
    .returning({ id: oneTimeTokens.id });
  return rows.length === 1;
}
