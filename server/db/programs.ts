/**
 * Programs and their versions. A save appends a version only if the program's head is still the
 * version the save was based on: one conditional UPDATE decides, so two saves on the same base can
 * never both win, on PGlite or on a PostgreSQL server.
 */
import { and, asc, desc, eq, sql } from 'drizzle-orm';
import type { Db } from './client';
import { programs, programVersions, type ProgramRow, type ProgramVersionRow } from './schema';

export type Program = ProgramRow;
export type ProgramVersion = ProgramVersionRow;
export type VersionSummary = Omit<ProgramVersionRow, 'document' | 'programId'>;

const summaryColumns = {
  number: programVersions.number,
  message: programVersions.message,
  authorId: programVersions.authorId,
  createdAt: programVersions.createdAt,
};

export interface NewProgram {
  ownerId: string;
  title: string;
  labId?: string | null;
  demo?: boolean;
  document: unknown;
  message: string;
  authorId: string;
  now: Date;
}

/** Creates a program with its version 1, in one transaction. */
export async function insertProgram(db: Db, p: NewProgram): Promise<{ program: Program; version: ProgramVersion }> {
  return db.transaction(async (tx) => {
    const [program] = await tx
      .insert(programs)
      .values({ ownerId: p.ownerId, title: p.title, labId: p.labId ?? null, headVersion: 1, demo: p.demo ?? false, createdAt: p.now, updatedAt: p.now })
      .returning();
    const [version] = await tx
      .insert(programVersions)
      .values({ programId: program.id, number: 1, document: p.document, message: p.message, authorId: p.authorId, createdAt: p.now })
      .returning();
    return { program, version };
  });
}

export async function findProgram(db: Db, id: string): Promise<Program | null> {
  const rows = await db.select().from(programs).where(eq(programs.id, id)).limit(1);
  return rows[0] ?? null;
}

export async function listProgramsByOwner(db: Db, ownerId: string): Promise<Program[]> {
  return db.select().from(programs).where(eq(programs.ownerId, ownerId)).orderBy(desc(programs.updatedAt), asc(programs.id));
}

export async function renameProgram(db: Db, id: string, title: string, now: Date): Promise<Program | null> {
  const rows = await db.update(programs).set({ title, updatedAt: now }).where(eq(programs.id, id)).returning();
  return rows[0] ?? null;
}

export async function deleteProgram(db: Db, id: string): Promise<void> {
  await db.delete(programs).where(eq(programs.id, id));
}

export async function listVersions(db: Db, programId: string): Promise<VersionSummary[]> {
  return db.select(summaryColumns).from(programVersions).where(eq(programVersions.programId, programId)).orderBy(desc(programVersions.number));
}

export async function findVersion(db: Db, programId: string, number: number): Promise<ProgramVersion | null> {
  const rows = await db
    .select()
    .from(programVersions)
    .where(and(eq(programVersions.programId, programId), eq(programVersions.number, number)))
    .limit(1);
  return rows[0] ?? null;
}

export interface NewVersion {
  programId: string;
  baseVersion: number;
  document: unknown;
  message: string;
  authorId: string;
  now: Date;
}

export type AppendResult = { ok: true; version: ProgramVersion } | { ok: false; head: VersionSummary | null };

/** Appends version `baseVersion + 1` if the head is still `baseVersion`; else reports the head. */
export async function appendVersion(db: Db, v: NewVersion): Promise<AppendResult> {
  return db.transaction(async (tx) => {
    const moved = await tx
      .update(programs)
      .set({ headVersion: sql`${programs.headVersion} + 1`, updatedAt: v.now })
      .where(and(eq(programs.id, v.programId), eq(programs.headVersion, v.baseVersion)))
      .returning({ head: programs.headVersion });
    if (moved.length === 0) {
      const [program] = await tx.select({ head: programs.headVersion }).from(programs).where(eq(programs.id, v.programId));
      if (!program) return { ok: false as const, head: null };
      const [head] = await tx
        .select(summaryColumns)
        .from(programVersions)
        .where(and(eq(programVersions.programId, v.programId), eq(programVersions.number, program.head)));
      return { ok: false as const, head: head ?? null };
    }
    const [version] = await tx
      .insert(programVersions)
      .values({ programId: v.programId, number: moved[0].head, document: v.document, message: v.message, authorId: v.authorId, createdAt: v.now })
      .returning();
    return { ok: true as const, version };
  });
}
