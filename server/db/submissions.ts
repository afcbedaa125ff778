/** Submissions and their grade history as plain objects. */
import { and, asc, desc, eq, inArray } from 'drizzle-orm';
import type { Db } from './client';
import { gradeHistory, submissions, users, type GradeHistoryRow, type SubmissionRowDb } from './schema';

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
