/**
 * Drafts: one row per program and user, written over on every autosave (an upsert), deleted when
 * a version is saved or the user discards it. Drafts are not read through the row caches: they
 * change every few seconds and are read once per opening of a program.
 */
import { and, eq } from 'drizzle-orm';
import type { Db } from './client';
import { drafts, type DraftRow } from './schema';

export type Draft = DraftRow;

export interface DraftWrite {
  programId: string;
  userId: string;
  baseVersion: number;
  document: unknown;
  now: Date;
}

const ofUser = (programId: string, userId: string) => and(eq(drafts.programId, programId), eq(drafts.userId, userId));

/** Writes the user's draft of a program, replacing the previous one. */
export async function upsertDraft(db: Db, d: DraftWrite): Promise<Draft> {
  const [row] = await db
    .insert(drafts)
    .values({ programId: d.programId, userId: d.userId, baseVersion: d.baseVersion, document: d.document, updatedAt: d.now })
    .onConflictDoUpdate({ target: [drafts.programId, drafts.userId], set: { baseVersion: d.baseVersion, document: d.document, updatedAt: d.now } })
    .returning();
  return row!;
}

export async function findDraft(db: Db, programId: string, userId: string): Promise<Draft | null> {
  return (await db.select().from(drafts).where(ofUser(programId, userId)).limit(1))[0] ?? null;
}

/** Deletes the user's draft of a program; true when there was one. */
export async function deleteDraft(db: Db, programId: string, userId: string): Promise<boolean> {
  const rows = await db.delete(drafts).where(ofUser(programId, userId)).returning({ programId: drafts.programId });
  return rows.length > 0;
}
