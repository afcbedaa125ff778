/**
 * Proof sheets: one row per program, written over whole on every save (an upsert). Not read
 * through the row caches: a sheet is read once per opening of a program's Proof tab.
 */
import { eq } from 'drizzle-orm';
import type { Db } from './client';
import { proofSheets, type ProofSheetRow } from './schema';

export type ProofSheetRecord = ProofSheetRow;

export interface ProofSheetWrite {
  programId: string;
  userId: string;
  properties: unknown[];
  checks: unknown[];
  now: Date;
}

/** Writes the program's sheet, replacing the previous one. */
export async function upsertProofSheet(db: Db, s: ProofSheetWrite): Promise<ProofSheetRecord> {
  const [row] = await db
    .insert(proofSheets)
    .values({ programId: s.programId, userId: s.userId, properties: s.properties, checks: s.checks, updatedAt: s.now })
    .onConflictDoUpdate({ target: proofSheets.programId, set: { userId: s.userId, properties: s.properties, checks: s.checks, updatedAt: s.now } })
    .returning();
  return row!;
}

export async function findProofSheet(db: Db, programId: string): Promise<ProofSheetRecord | null> {
  return (await db.select().from(proofSheets).where(eq(proofSheets.programId, programId)).limit(1))[0] ?? null;
}
