/** What the class overview and a lab's student list read: lab copies and submission standings, without reports. */
import { and, asc, eq, inArray } from 'drizzle-orm';
import type { Db } from './client';
import { labCopies, submissions } from './schema';

/** Who opened a copy of which lab. */
export async function listLabCopyOwners(db: Db, labIds: string[]): Promise<{ labId: string; studentId: string }[]> {
  if (labIds.length === 0) return [];
  return db.select({ labId: labCopies.labId, studentId: labCopies.studentId }).from(labCopies).where(inArray(labCopies.labId, labIds));
}

/** A submission without its report and document: enough to place a student on a lab. */
export interface SubmissionStanding {
  id: string;
  labId: string;
  studentId: string;
  status: 'submitted' | 'graded' | 'returned';
  late: boolean;
  penaltyPercent: number;
  score: number | null;
  feedback: string | null;
  submittedAt: Date;
}

/** The submissions to any of `labIds`, oldest first (so the last one seen per student is the newest). */
export async function listSubmissionStandings(db: Db, labIds: string[]): Promise<SubmissionStanding[]> {
  if (labIds.length === 0) return [];
  return db
    .select({
      id: submissions.id,
      labId: submissions.labId,
      studentId: submissions.studentId,
      status: submissions.status,
      late: submissions.late,
      penaltyPercent: submissions.penaltyPercent,
      score: submissions.score,
      feedback: submissions.feedback,
      submittedAt: submissions.submittedAt,
    })
    .from(submissions)
    .where(inArray(submissions.labId, labIds))
    .orderBy(asc(submissions.submittedAt), asc(submissions.id));
}

/** The newest submission of each student, by `labId:studentId`. */
export function newestByStudent<T extends { labId: string; studentId: string }>(rows: readonly T[]): Map<string, T> {
  const newest = new Map<string, T>();
  for (const r of rows) newest.set(`${r.labId}:${r.studentId}`, r);
  return newest;
}

/** Marks a graded submission returned (only while it is still `graded`); false when it was not. */
export async function markReturned(db: Db, id: string, at: Date, feedback: string | null): Promise<boolean> {
  const rows = await db
    .update(submissions)
    .set({ status: 'returned', returnedAt: at, feedback })
    .where(and(eq(submissions.id, id), eq(submissions.status, 'graded')))
    .returning({ id: submissions.id });
  return rows.length === 1;
}
