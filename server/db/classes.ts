/** Classes and enrolments as plain objects. */
import { and, asc, count, eq } from 'drizzle-orm';
import type { Db } from './client';
import { classes, enrolments, labs, users, type ClassRow } from './schema';

export type ClassRecord = ClassRow;

export interface NewClass {
  name: string;
  term: string;
  instructorId: string;
  joinCode: string;
  demo?: boolean;
  now: Date;
}

/** Inserts a class; null when the join code is taken (the caller draws another). */
export async function insertClass(db: Db, c: NewClass): Promise<ClassRecord | null> {
  const rows = await db
    .insert(classes)
    .values({ name: c.name, term: c.term, instructorId: c.instructorId, joinCode: c.joinCode, demo: c.demo ?? false, createdAt: c.now })
    .onConflictDoNothing()
    .returning();
  return rows[0] ?? null;
}

export async function findClass(db: Db, id: string): Promise<ClassRecord | null> {
  const rows = await db.select().from(classes).where(eq(classes.id, id)).limit(1);
  return rows[0] ?? null;
}

export async function findClassByJoinCode(db: Db, joinCode: string): Promise<ClassRecord | null> {
  const rows = await db.select().from(classes).where(eq(classes.joinCode, joinCode)).limit(1);
  return rows[0] ?? null;
}

/** Sets a new join code; false when another class has it. */
export async function setJoinCode(db: Db, id: string, joinCode: string): Promise<boolean> {
  const rows = await db.update(classes).set({ joinCode }).where(eq(classes.id, id)).returning({ id: classes.id }).catch(() => []);
  return rows.length === 1;
}

export async function listClassesTaughtBy(db: Db, instructorId: string): Promise<ClassRecord[]> {
  return db.select().from(classes).where(eq(classes.instructorId, instructorId)).orderBy(asc(classes.createdAt), asc(classes.id));
}

export async function listClassesOf(db: Db, studentId: string): Promise<ClassRecord[]> {
  const rows = await db
    .select({ c: classes })
    .from(enrolments)
    .innerJoin(classes, eq(classes.id, enrolments.classId))
    .where(eq(enrolments.userId, studentId))
    .orderBy(asc(classes.createdAt), asc(classes.id));
  return rows.map((r) => r.c);
}

export async function listAllClasses(db: Db): Promise<ClassRecord[]> {
  return db.select().from(classes).orderBy(asc(classes.createdAt), asc(classes.id));
}

/** Enrols a student; false when already enrolled. */
export async function enrol(db: Db, classId: string, userId: string, now: Date): Promise<boolean> {
  const rows = await db.insert(enrolments).values({ classId, userId, createdAt: now }).onConflictDoNothing().returning({ userId: enrolments.userId });
  return rows.length === 1;
}

/** Removes a student from a class; false when they were not in it. */
export async function unenrol(db: Db, classId: string, userId: string): Promise<boolean> {
  const rows = await db
    .delete(enrolments)
    .where(and(eq(enrolments.classId, classId), eq(enrolments.userId, userId)))
    .returning({ userId: enrolments.userId });
  return rows.length === 1;
}

export async function isEnrolled(db: Db, classId: string, userId: string): Promise<boolean> {
  const rows = await db
    .select({ userId: enrolments.userId })
    .from(enrolments)
    .where(and(eq(enrolments.classId, classId), eq(enrolments.userId, userId)))
    .limit(1);
  return rows.length === 1;
}

export async function countStudents(db: Db, classId: string): Promise<number> {
  const [row] = await db.select({ n: count() }).from(enrolments).where(eq(enrolments.classId, classId));
  return row?.n ?? 0;
}

export interface StudentEntry {
  id: string;
  email: string;
  name: string;
  enrolledAt: Date;
}

export async function listStudents(db: Db, classId: string): Promise<StudentEntry[]> {
  return db
    .select({ id: users.id, email: users.email, name: users.name, enrolledAt: enrolments.createdAt })
    .from(enrolments)
    .innerJoin(users, eq(users.id, enrolments.userId))
    .where(eq(enrolments.classId, classId))
    .orderBy(asc(users.name), asc(users.email));
}

/**
 * True when `labId` is a lab of a class `instructorId` teaches and `studentId` is enrolled in that
 * class: the one relationship through which someone reads another person's program.
 */
export async function teachesLabOf(db: Db, instructorId: string, labId: string, studentId: string): Promise<boolean> {
  const rows = await db
    .select({ id: labs.id })
    .from(labs)
    .innerJoin(classes, eq(classes.id, labs.classId))
    .innerJoin(enrolments, and(eq(enrolments.classId, classes.id), eq(enrolments.userId, studentId)))
    .where(and(eq(labs.id, labId), eq(classes.instructorId, instructorId)))
    .limit(1);
  return rows.length === 1;
}

/** The labs of every class `instructorId` teaches and `studentId` is enrolled in. */
export async function labsTaughtToStudent(db: Db, instructorId: string, studentId: string): Promise<string[]> {
  const rows = await db
    .select({ id: labs.id })
    .from(labs)
    .innerJoin(classes, eq(classes.id, labs.classId))
    .innerJoin(enrolments, and(eq(enrolments.classId, classes.id), eq(enrolments.userId, studentId)))
    .where(eq(classes.instructorId, instructorId));
  return rows.map((r) => r.id);
}
