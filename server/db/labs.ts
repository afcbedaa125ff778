/** Labs, their attachments and the students' lab copies as plain objects. */
import { and, asc, eq, isNotNull } from 'drizzle-orm';
import type { Db } from './client';
import { classes, enrolments, labAttachments, labCopies, labs, type LabAttachmentRow, type LabRow } from './schema';
import type { ClassRecord } from './classes';
import { rowCachesOf } from './rowCache';

export type LabRecord = LabRow;
export type AttachmentRecord = Omit<LabAttachmentRow, 'data'>;
export type NewLab = typeof labs.$inferInsert;
export type LabChanges = Partial<Omit<NewLab, 'id' | 'classId' | 'authorId' | 'createdAt'>>;

export async function insertLab(db: Db, lab: NewLab): Promise<LabRecord> {
  const [row] = await db.insert(labs).values(lab).returning();
  return row;
}

/** A lab, its class and whether `userId` is enrolled in it, in one query (every lab request asks all three). */
export async function findLabInContext(db: Db, labId: string, userId: string): Promise<{ lab: LabRecord; cls: ClassRecord; enrolled: boolean } | null> {
  const rows = await db
    .select({ lab: labs, cls: classes, enrolledId: enrolments.userId })
    .from(labs)
    .innerJoin(classes, eq(classes.id, labs.classId))
    .leftJoin(enrolments, and(eq(enrolments.classId, labs.classId), eq(enrolments.userId, userId)))
    .where(eq(labs.id, labId))
    .limit(1);
  const row = rows[0];
  return row ? { lab: row.lab, cls: row.cls, enrolled: row.enrolledId !== null } : null;
}

export async function findLab(db: Db, id: string): Promise<LabRecord | null> {
  const rows = await db.select().from(labs).where(eq(labs.id, id)).limit(1);
  return rows[0] ?? null;
}

export async function updateLab(db: Db, id: string, changes: LabChanges): Promise<LabRecord | null> {
  const rows = await db.update(labs).set(changes).where(eq(labs.id, id)).returning();
  return rows[0] ?? null;
}

export async function deleteLab(db: Db, id: string): Promise<void> {
  await db.delete(labs).where(eq(labs.id, id));
  // The foreign key sets `programs.lab_id` to null in every program of this lab.
  rowCachesOf(db)?.programs.clear();
}

/** The labs of a class in creation order; `publishedOnly` for students. */
export async function listLabsOfClass(db: Db, classId: string, publishedOnly: boolean): Promise<LabRecord[]> {
  const where = publishedOnly ? and(eq(labs.classId, classId), isNotNull(labs.publishedAt)) : eq(labs.classId, classId);
  return db.select().from(labs).where(where).orderBy(asc(labs.createdAt), asc(labs.title), asc(labs.id));
}

const attachmentColumns = {
  id: labAttachments.id,
  labId: labAttachments.labId,
  filename: labAttachments.filename,
  contentType: labAttachments.contentType,
  size: labAttachments.size,
  createdAt: labAttachments.createdAt,
};

export async function insertAttachment(db: Db, a: typeof labAttachments.$inferInsert): Promise<AttachmentRecord> {
  const [row] = await db.insert(labAttachments).values(a).returning(attachmentColumns);
  return row;
}

export async function listAttachments(db: Db, labId: string): Promise<AttachmentRecord[]> {
  return db.select(attachmentColumns).from(labAttachments).where(eq(labAttachments.labId, labId)).orderBy(asc(labAttachments.createdAt), asc(labAttachments.id));
}

export async function findAttachment(db: Db, labId: string, id: string): Promise<LabAttachmentRow | null> {
  const rows = await db.select().from(labAttachments).where(and(eq(labAttachments.labId, labId), eq(labAttachments.id, id))).limit(1);
  return rows[0] ?? null;
}

export async function deleteAttachment(db: Db, labId: string, id: string): Promise<boolean> {
  const rows = await db.delete(labAttachments).where(and(eq(labAttachments.labId, labId), eq(labAttachments.id, id))).returning({ id: labAttachments.id });
  return rows.length === 1;
}

/** The program id of a student's copy of a lab, or null before the first open. */
export async function findLabCopy(db: Db, labId: string, studentId: string): Promise<string | null> {
  const rows = await db.select({ programId: labCopies.programId }).from(labCopies).where(and(eq(labCopies.labId, labId), eq(labCopies.studentId, studentId))).limit(1);
  return rows[0]?.programId ?? null;
}

/** Records a copy; false when the student already has one (a concurrent first open won). */
export async function insertLabCopy(db: Db, c: { labId: string; studentId: string; programId: string; now: Date }): Promise<boolean> {
  const rows = await db
    .insert(labCopies)
    .values({ labId: c.labId, studentId: c.studentId, programId: c.programId, createdAt: c.now })
    .onConflictDoNothing()
    .returning({ programId: labCopies.programId });
  return rows.length === 1;
}

/** Every copy of the labs of a class: lab id → student id → program id. */
export async function listLabCopiesOfStudent(db: Db, studentId: string): Promise<Map<string, string>> {
  const rows = await db.select().from(labCopies).where(eq(labCopies.studentId, studentId));
  return new Map(rows.map((r) => [r.labId, r.programId]));
}
