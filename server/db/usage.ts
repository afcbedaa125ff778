/** Counts for the admin console's usage panel: no student work, only how much there is. */
import { and, count, eq, gte, sql } from 'drizzle-orm';
import type { Db } from './client';
import { classes, sessions, submissions, users } from './schema';

/** Students who signed in or submitted since `since`. */
export async function countActiveStudents(db: Db, since: Date): Promise<number> {
  const signedIn = db
    .selectDistinct({ id: sessions.userId })
    .from(sessions)
    .innerJoin(users, eq(users.id, sessions.userId))
    .where(and(eq(users.role, 'student'), gte(sessions.createdAt, since)));
  const submitted = db.selectDistinct({ id: submissions.studentId }).from(submissions).where(gte(submissions.submittedAt, since));
  const rows = await signedIn.union(submitted);
  return rows.length;
}

export async function countByRole(db: Db): Promise<Record<'student' | 'instructor' | 'admin', number>> {
  const rows = await db.select({ role: users.role, n: count() }).from(users).groupBy(users.role);
  const out = { student: 0, instructor: 0, admin: 0 };
  for (const r of rows) out[r.role] = r.n;
  return out;
}

export async function countClasses(db: Db): Promise<number> {
  const [row] = await db.select({ n: count() }).from(classes);
  return row?.n ?? 0;
}

/** Submissions per UTC day since `since`, as `YYYY-MM-DD` → count (days without any are absent). */
export async function submissionsPerDay(db: Db, since: Date): Promise<Map<string, number>> {
  const day = sql<string>`to_char(${submissions.submittedAt} at time zone 'UTC', 'YYYY-MM-DD')`;
  const rows = await db.select({ day, n: count() }).from(submissions).where(gte(submissions.submittedAt, since)).groupBy(day);
  return new Map(rows.map((r) => [r.day, r.n]));
}

/** Does this user teach any class? */
export async function teachesAnyClass(db: Db, userId: string): Promise<boolean> {
  const rows = await db.select({ id: classes.id }).from(classes).where(eq(classes.instructorId, userId)).limit(1);
  return rows.length === 1;
}
