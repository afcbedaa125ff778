/** Submissions and their grade history as plain objects. */
import { and, asc, desc, eq, inArray, isNull, sql } from 'drizzle-orm';
import type { Db } from './client';
import { rowCachesOf } from './rowCache';
import { findProgram, findVersion } from './programs';
import { gradeHistory, programVersions, programs, submissions, users, type GradeHistoryRow, type SubmissionRowDb } from './schema';

export type SubmissionRecord = SubmissionRowDb;
export type GradeHistoryRecord = GradeHistoryRow;
export type SubmissionChanges = Partial<Omit<typeof submissions.$inferInsert, 'id' | 'labId' | 'studentId'>>;

/** A submission with its student's name and e-mail, for the instructor's table. */
export interface SubmissionWithStudent {
  submission: SubmissionRecord;
  student: { id: string; name: string; email: string };
}

export async function insertSubmission(db: Db, s: typeof submissions.$inferInsert): Promise<SubmissionRecord> {
  const [row] = await db.insert(submissions).values(s).returning();
  return row;
}

/** What a graded submission is stored with: everything but the columns the database fills. */
export type GradedSubmission = Omit<SubmissionRecord, 'id' | 'overrideScore' | 'overrideReason' | 'feedback' | 'returnedAt'>;

/**
 * Stores a submission already graded, in one statement. Only the id comes back: the report is
 * large, and parsing it back from the database would cost more than the insert.
 */
export async function insertGradedSubmission(db: Db, s: GradedSubmission): Promise<SubmissionRecord> {
  const [row] = await db.insert(submissions).values(s).returning({ id: submissions.id });
  return { ...s, id: row.id, overrideScore: null, overrideReason: null, feedback: null, returnedAt: null };
}

/**
 * A saved version of a program with the program's owner (what a submit checks): from the row
 * caches when the database has them (a student usually submits the version just saved), else in
 * one query.
 */
export async function findVersionWithOwner(db: Db, programId: string, number: number): Promise<{ ownerId: string; number: number; document: unknown } | null> {
  if (rowCachesOf(db)) {
    const program = await findProgram(db, programId);
    const version = program ? await findVersion(db, programId, number) : null;
    return program && version ? { ownerId: program.ownerId, number: version.number, document: version.document } : null;
  }
  const rows = await db
    .select({ ownerId: programs.ownerId, number: programVersions.number, document: programVersions.document })
    .from(programVersions)
    .innerJoin(programs, eq(programs.id, programVersions.programId))
    .where(and(eq(programVersions.programId, programId), eq(programVersions.number, number)))
    .limit(1);
  return rows[0] ?? null;
}

/** Is there a program with this id owned by `ownerId`? (To tell "not yours" from "no such version".) */
export async function ownsProgram(db: Db, programId: string, ownerId: string): Promise<boolean> {
  const rows = await db.select({ id: programs.id }).from(programs).where(and(eq(programs.id, programId), eq(programs.ownerId, ownerId))).limit(1);
  return rows.length === 1;
}

export async function findSubmission(db: Db, id: string): Promise<SubmissionRecord | null> {
  const rows = await db.select().from(submissions).where(eq(submissions.id, id)).limit(1);
  return rows[0] ?? null;
}

export async function updateSubmission(db: Db, id: string, changes: SubmissionChanges): Promise<SubmissionRecord | null> {
  const rows = await db.update(submissions).set(changes).where(eq(submissions.id, id)).returning();
  return rows[0] ?? null;
}

/** A student's submissions to a lab, oldest first. */
export async function listSubmissionsOf(db: Db, labId: string, studentId: string): Promise<SubmissionRecord[]> {
  return db
    .select()
    .from(submissions)
    .where(and(eq(submissions.labId, labId), eq(submissions.studentId, studentId)))
    .orderBy(asc(submissions.submittedAt), asc(submissions.id));
}

/** Every submission to a lab with its student, oldest first. */
export async function listSubmissionsOfLab(db: Db, labId: string): Promise<SubmissionWithStudent[]> {
  return db
    .select({ submission: submissions, student: { id: users.id, name: users.name, email: users.email } })
    .from(submissions)
    .innerJoin(users, eq(users.id, submissions.studentId))
    .where(eq(submissions.labId, labId))
    .orderBy(asc(submissions.submittedAt), asc(submissions.id));
}

/** The submissions to any of `labIds` without their reports (the gradebook), oldest first. */
export async function listSubmissionScores(db: Db, labIds: string[]) {
  if (labIds.length === 0) return [];
  return db
    .select({ id: submissions.id, labId: submissions.labId, studentId: submissions.studentId, status: submissions.status, late: submissions.late, score: submissions.score, submittedAt: submissions.submittedAt })
    .from(submissions)
    .where(inArray(submissions.labId, labIds))
    .orderBy(asc(submissions.submittedAt), asc(submissions.id));
}

export async function insertGradeHistory(db: Db, h: typeof gradeHistory.$inferInsert): Promise<void> {
  await db.insert(gradeHistory).values(h);
}

/** The reports a submission had before, newest first. */
export async function listGradeHistory(db: Db, submissionId: string): Promise<GradeHistoryRecord[]> {
  return db.select().from(gradeHistory).where(eq(gradeHistory.submissionId, submissionId)).orderBy(desc(gradeHistory.replacedAt), desc(gradeHistory.id));
}

/**
 * Writes a queued submission's grade only while it still waits for one (`submitted`, never graded):
 * a job delivered twice (its first worker presumed dead) changes the row once. Answers whether
 * this call wrote it.
 */
export async function recordQueuedGrade(db: Db, id: string, grade: { report: unknown; gradingNote: string | null; autoScore: number; gradedAt: Date }): Promise<boolean> {
  const rows = await db
    .update(submissions)
    // An instructor may have overridden the score while the job waited: the override stands.
    .set({ ...grade, score: sql`coalesce(${submissions.overrideScore}, ${grade.autoScore})`, status: 'graded' })
    .where(and(eq(submissions.id, id), eq(submissions.status, 'submitted'), isNull(submissions.gradedAt)))
    .returning({ id: submissions.id });
  return rows.length === 1;
}
