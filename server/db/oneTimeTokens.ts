/** One-time tokens (hashed) for invitations and password resets. */
import { and, desc, eq, gt, isNull, sql } from 'drizzle-orm';
import type { Db } from './client';
import { oneTimeTokens, type OneTimeTokenRow } from './schema';
import { lockUser } from './users';

export type OneTimeToken = OneTimeTokenRow;

export interface NewToken {
  kind: OneTimeToken['kind'];
  tokenHash: string;
  email: string;
  userId?: string | null;
  role?: OneTimeToken['role'];
  classId?: string | null;
  invitedName?: string | null;
  expiresAt: Date;
  now: Date;
}

export async function insertToken(db: Db, t: NewToken): Promise<OneTimeToken> {
  const [row] = await db
    .insert(oneTimeTokens)
    .values({
      kind: t.kind,
      tokenHash: t.tokenHash,
      email: t.email,
      userId: t.userId ?? null,
      role: t.role ?? null,
      classId: t.classId ?? null,
      invitedName: t.invitedName ?? null,
      expiresAt: t.expiresAt,
      createdAt: t.now,
    })
    .returning();
  return row;
}

/** An unused, unexpired token of this kind. */
export async function findUsableToken(db: Db, kind: OneTimeToken['kind'], tokenHash: string, now: Date): Promise<OneTimeToken | null> {
  const rows = await db
    .select()
    .from(oneTimeTokens)
    .where(and(eq(oneTimeTokens.kind, kind), eq(oneTimeTokens.tokenHash, tokenHash), isNull(oneTimeTokens.usedAt), gt(oneTimeTokens.expiresAt, now)))
    .limit(1);
  return rows[0] ?? null;
}

/** Marks a token used; false if it was used meanwhile (single use, even under a race). */
export async function markTokenUsed(db: Db, id: string, now: Date): Promise<boolean> {
  const rows = await db
    .update(oneTimeTokens)
    .set({ usedAt: now })
    .where(and(eq(oneTimeTokens.id, id), isNull(oneTimeTokens.usedAt)))
    .returning({ id: oneTimeTokens.id });
  return rows.length === 1;
}

/** Invitations to a class, newest first. */
export async function listClassInvitations(db: Db, classId: string): Promise<OneTimeToken[]> {
  return db
    .select()
    .from(oneTimeTokens)
    .where(and(eq(oneTimeTokens.kind, 'invite'), eq(oneTimeTokens.classId, classId)))
    .orderBy(desc(oneTimeTokens.createdAt));
}

/** True when an unused, unexpired invitation exists for this e-mail and class. */
export async function hasOpenClassInvitation(db: Db, classId: string, email: string, now: Date): Promise<boolean> {
  const rows = await db
    .select({ id: oneTimeTokens.id })
    .from(oneTimeTokens)
    .where(
      and(
        eq(oneTimeTokens.kind, 'invite'),
        eq(oneTimeTokens.classId, classId),
        sql`lower(${oneTimeTokens.email}) = lower(${email})`,
        isNull(oneTimeTokens.usedAt),
        gt(oneTimeTokens.expiresAt, now),
      ),
    )
    .limit(1);
  return rows.length === 1;
}

// Password-reset links. Only the newest link of an account works: issuing one ends the older ones,
// and using one ends every link of that account. Both run under the account's row lock, so two
// requests at once (or two processes) cannot leave two links open.

/** Ends the account's open reset links and stores the new one (issued to `email`). False when the account is gone. */
export async function issueResetToken(db: Db, t: { tokenHash: string; email: string; userId: string; expiresAt: Date; now: Date }): Promise<boolean> {
  return db.transaction(async (tx) => {
    if (!(await lockUser(tx, t.userId))) return false;
    await endResetTokens(tx, t.userId, t.now);
    await insertToken(tx, { kind: 'reset', tokenHash: t.tokenHash, email: t.email, userId: t.userId, expiresAt: t.expiresAt, now: t.now });
    return true;
  });
}

/** The open (unused, unexpired) reset link with this hash, if any: a check before the slow work, not a use. */
export async function findOpenResetToken(db: Db, tokenHash: string, now: Date): Promise<OneTimeToken | null> {
  return findUsableToken(db, 'reset', tokenHash, now);
}

/**
 * Uses the reset link `tokenHash` of `userId` and ends every other open link of the account. Call
 * inside a transaction holding the account's row lock (`lockUser`); false when the link is no longer
 * open (used, replaced or expired meanwhile).
 */
export async function useResetToken(tx: Db, userId: string, tokenHash: string, now: Date): Promise<boolean> {
  const open = await tx
    .select({ id: oneTimeTokens.id })
    .from(oneTimeTokens)
    .where(
      and(
        eq(oneTimeTokens.kind, 'reset'),
        eq(oneTimeTokens.tokenHash, tokenHash),
        eq(oneTimeTokens.userId, userId),
        isNull(oneTimeTokens.usedAt),
        gt(oneTimeTokens.expiresAt, now),
      ),
    )
    .limit(1);
  if (open.length === 0) return false;
  await endResetTokens(tx, userId, now);
  return true;
}

/** Marks every open reset link of the account used. */
async function endResetTokens(tx: Db, userId: string, now: Date): Promise<void> {
  await tx
    .update(oneTimeTokens)
    .set({ usedAt: now })
    .where(and(eq(oneTimeTokens.kind, 'reset'), eq(oneTimeTokens.userId, userId), isNull(oneTimeTokens.usedAt)));
}

/**
 * The tokens one invitation or sign-up link stands with: same kind, same address (any letter case)
 * and same class (an instructor invitation has none). Issuing a new link or using one ends every
 * other open link of its scope, so an older e-mail can never be used after a newer one.
 */
export interface InvitationScope {
  kind: 'invite' | 'signup';
  email: string;
  classId: string | null;
}

function openInScope(scope: InvitationScope, now: Date) {
  return and(
    eq(oneTimeTokens.kind, scope.kind),
    sql`lower(${oneTimeTokens.email}) = lower(${scope.email})`,
    scope.classId === null ? isNull(oneTimeTokens.classId) : eq(oneTimeTokens.classId, scope.classId),
    isNull(oneTimeTokens.usedAt),
    gt(oneTimeTokens.expiresAt, now),
  );
}

/** Inserts an invitation or sign-up link after ending the open ones of its scope, in one transaction. */
export async function issueScopedToken(db: Db, t: NewToken & { kind: InvitationScope['kind'] }): Promise<OneTimeToken> {
  return db.transaction(async (tx) => {
    // Ended links expire now rather than count as used: nobody used them.
    await tx.update(oneTimeTokens).set({ expiresAt: t.now }).where(openInScope({ kind: t.kind, email: t.email, classId: t.classId ?? null }, t.now));
    return insertToken(tx, t);
  });
}

/**
 * Marks an invitation or sign-up link used and ends the other open links of its scope, in one
 * transaction; false if it was used or ended meanwhile (single use, even under a race).
 */
export async function useScopedToken(db: Db, token: OneTimeToken, now: Date): Promise<boolean> {
  if (token.kind === 'reset') throw new Error('useScopedToken is for invitations and sign-ups');
  const scope: InvitationScope = { kind: token.kind, email: token.email, classId: token.classId };
  return db.transaction(async (tx) => {
    const used = await tx
      .update(oneTimeTokens)
      .set({ usedAt: now })
      .where(and(eq(oneTimeTokens.id, token.id), isNull(oneTimeTokens.usedAt), gt(oneTimeTokens.expiresAt, now)))
      .returning({ id: oneTimeTokens.id });
    if (used.length !== 1) return false;
    await tx.update(oneTimeTokens).set({ expiresAt: now }).where(openInScope(scope, now));
    return true;
  });
}
