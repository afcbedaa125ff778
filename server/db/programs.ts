/**
 * Programs and their versions. A save appends a version only if the program's head is still the
 * version the save was based on: one conditional UPDATE decides, so two saves on the same base can
 * never both win, on PGlite or on a PostgreSQL server.
 *
 * Programs and versions read through the row caches (`rowCache.ts`); every write here updates
 * or drops the cached rows it changed, after it committed.
 */
import { and, asc, desc, eq } from 'drizzle-orm';
import type { Db } from './client';
import { labs, programs, programVersions, type ProgramRow, type ProgramVersionRow } from './schema';
import { readThrough, rowCachesOf, versionKey, type CachedVersionRow } from './rowCache';
import { appendVersionBatched } from './versionBatches';

export type Program = ProgramRow;
export type ProgramVersion = ProgramVersionRow;
export type VersionSummary = Omit<ProgramVersionRow, 'document' | 'programId'>;
/** A version with its document as JSON text (what the row cache keeps, and what answers send). */
export type ProgramVersionJson = CachedVersionRow;

/** `version` with its document as the JSON text `res.json` would send for it. */
function withDocumentJson({ document, ...rest }: ProgramVersion): ProgramVersionJson {
  return { ...rest, documentJson: JSON.stringify(document) };
}

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
  const created = await db.transaction(async (tx) => {
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
  const caches = rowCachesOf(db);
  caches?.programs.put(created.program.id, created.program);
  caches?.versions.put(versionKey(created.program.id, 1), withDocumentJson(created.version));
  return created;
}

export async function findProgram(db: Db, id: string): Promise<Program | null> {
  const load = async () => (await db.select().from(programs).where(eq(programs.id, id)).limit(1))[0] ?? null;
  return readThrough(db, 'programs', id, load);
}

/** A user's programs, newest first, each with the title of the lab it was started for (null if none or deleted). */
export async function listProgramsByOwner(db: Db, ownerId: string): Promise<(Program & { labTitle: string | null })[]> {
  const rows = await db
    .select({ program: programs, labTitle: labs.title })
    .from(programs)
    .leftJoin(labs, eq(labs.id, programs.labId))
    .where(eq(programs.ownerId, ownerId))
    .orderBy(desc(programs.updatedAt), asc(programs.id));
  return rows.map((row) => ({ ...row.program, labTitle: row.labTitle }));
}

export async function renameProgram(db: Db, id: string, title: string, now: Date): Promise<Program | null> {
  const rows = await db.update(programs).set({ title, updatedAt: now }).where(eq(programs.id, id)).returning();
  const renamed = rows[0] ?? null;
  if (renamed) rowCachesOf(db)?.programs.put(id, renamed);
  return renamed;
}

export async function deleteProgram(db: Db, id: string): Promise<void> {
  await db.delete(programs).where(eq(programs.id, id));
  const caches = rowCachesOf(db);
  caches?.programs.drop(id);
  caches?.versions.dropWhere((key) => key.startsWith(`${id}#`));
}

export async function listVersions(db: Db, programId: string): Promise<VersionSummary[]> {
  return db.select(summaryColumns).from(programVersions).where(eq(programVersions.programId, programId)).orderBy(desc(programVersions.number));
}

async function selectVersion(db: Db, programId: string, number: number): Promise<ProgramVersion | null> {
  return (await db.select().from(programVersions).where(and(eq(programVersions.programId, programId), eq(programVersions.number, number))).limit(1))[0] ?? null;
}

/** A version with its document as a tree (a fresh one each call: the caller may change it). */
export async function findVersion(db: Db, programId: string, number: number): Promise<ProgramVersion | null> {
  if (!rowCachesOf(db)) return selectVersion(db, programId, number);
  const found = await findVersionJson(db, programId, number);
  if (!found) return null;
  const { documentJson, ...rest } = found;
  return { ...rest, document: JSON.parse(documentJson) as unknown };
}

/** A version with its document as JSON text, for an answer that sends the document as it is. */
export async function findVersionJson(db: Db, programId: string, number: number): Promise<ProgramVersionJson | null> {
  const load = async () => {
    const row = await selectVersion(db, programId, number);
    return row && withDocumentJson(row);
  };
  return readThrough(db, 'versions', versionKey(programId, number), load);
}

export interface NewVersion {
  programId: string;
  baseVersion: number;
  document: unknown;
  message: string;
  authorId: string;
  now: Date;
}

/** The version written, its document as the JSON text written to the database (an answer can reuse it). */
export type AppendResult = { ok: true; version: ProgramVersionJson } | { ok: false; head: VersionSummary | null };

/**
 * Appends version `baseVersion + 1` if the head is still `baseVersion`, deleting the author's draft
 * of the program with it; else reports the head. One conditional statement decides (see
 * `versionBatches.ts`, which also groups concurrent saves into one statement).
 */
export async function appendVersion(db: Db, v: NewVersion): Promise<AppendResult> {
  const documentJson = JSON.stringify(v.document);
  const number = await appendVersionBatched(db, {
    programId: v.programId,
    baseVersion: v.baseVersion,
    documentJson,
    message: v.message,
    authorId: v.authorId,
    now: v.now,
  });
  const caches = rowCachesOf(db);
  if (number === null) {
    caches?.programs.drop(v.programId);
    return { ok: false, head: await findHead(db, v.programId) };
  }
  // Only the head and the time changed; the document is not read back (parsing it costs more than the insert).
  const version: ProgramVersionJson = { programId: v.programId, number, documentJson, message: v.message, authorId: v.authorId, createdAt: v.now };
  const cachedProgram = caches?.programs.peek(v.programId);
  if (cachedProgram) caches?.programs.put(v.programId, { ...cachedProgram, headVersion: number, updatedAt: v.now });
  else caches?.programs.drop(v.programId);
  caches?.versions.put(versionKey(v.programId, number), version);
  return { ok: true, version };
}

/** The head version's summary (what a refused save reports), or null when there is no such program. */
async function findHead(db: Db, programId: string): Promise<VersionSummary | null> {
  const rows = await db
    .select(summaryColumns)
    .from(programVersions)
    .innerJoin(programs, and(eq(programs.id, programVersions.programId), eq(programs.headVersion, programVersions.number)))
    .where(eq(programVersions.programId, programId))
    .limit(1);
  return rows[0] ?? null;
}
