/**
 * A classroom with every relationship the access rules tell apart: two instructors teaching a class
 * each, a student in both classes, a student in class A only, a student in no class, and an admin
 * who teaches nothing. `studentWork` gives the student in both classes a program outside labs, a
 * copy of a published lab in each class and a graded submission in each.
 */
import { FORWARD_REVERSE } from '@shared/labs';
import { enrol, insertClass, unenrol } from '../../../server/db/classes';
import { insertLab, insertLabCopy, type LabRecord } from '../../../server/db/labs';
import { insertProgram } from '../../../server/db/programs';
import { insertSubmission } from '../../../server/db/submissions';
import type { TestApp } from './testApp';
import { documentWithRungs, person, type Person } from './fixtures';

export const CALLERS = ['anonymous', 'studentBoth', 'studentOne', 'studentNone', 'teacherA', 'teacherB', 'admin'] as const;
export type Caller = (typeof CALLERS)[number];
export type SignedInCaller = Exclude<Caller, 'anonymous'>;

export interface Classroom {
  people: Record<SignedInCaller, Person>;
  /** Taught by `teacherA`; `studentBoth` and `studentOne` are enrolled. */
  classA: { id: string; joinCode: string };
  /** Taught by `teacherB`; `studentBoth` is enrolled. */
  classB: { id: string; joinCode: string };
}

export async function createClassroom(t: TestApp): Promise<Classroom> {
  const people = {
    admin: await person(t, 'admin@test.example', 'admin'),
    teacherA: await person(t, 'teacher.a@test.example', 'instructor'),
    teacherB: await person(t, 'teacher.b@test.example', 'instructor'),
    studentBoth: await person(t, 'student.both@test.example', 'student'),
    studentOne: await person(t, 'student.one@test.example', 'student'),
    studentNone: await person(t, 'student.none@test.example', 'student'),
  };
  const now = t.clock.now();
  const a = await insertClass(t.database.orm, { name: 'Motor Control A', term: 'Fall 2026', instructorId: people.teacherA.user.id, joinCode: 'CLSA-CODE', now });
  const b = await insertClass(t.database.orm, { name: 'Motor Control B', term: 'Fall 2026', instructorId: people.teacherB.user.id, joinCode: 'CLSB-CODE', now });
  if (!a || !b) throw new Error('classes not created');
  const room: Classroom = { people, classA: { id: a.id, joinCode: a.joinCode }, classB: { id: b.id, joinCode: b.joinCode } };
  await resetEnrolments(t, room);
  return room;
}

/** Puts every enrolment back as `createClassroom` made it (a case may have removed or added one). */
export async function resetEnrolments(t: TestApp, room: Classroom): Promise<void> {
  const orm = t.database.orm;
  const now = t.clock.now();
  await enrol(orm, room.classA.id, room.people.studentBoth.user.id, now);
  await enrol(orm, room.classA.id, room.people.studentOne.user.id, now);
  await enrol(orm, room.classB.id, room.people.studentBoth.user.id, now);
  await unenrol(orm, room.classA.id, room.people.studentNone.user.id);
  await unenrol(orm, room.classB.id, room.people.studentNone.user.id);
  await unenrol(orm, room.classB.id, room.people.studentOne.user.id);
}

/** A lab of the class, with the standard forward/reverse script; published unless `draft`. */
export async function labOf(t: TestApp, classId: string, authorId: string, title: string, draft = false): Promise<LabRecord> {
  const now = t.clock.now();
  return insertLab(t.database.orm, {
    classId,
    authorId,
    title,
    panel: { kind: 'builtIn', id: FORWARD_REVERSE.panel },
    starterKind: 'template',
    starterDocument: FORWARD_REVERSE.starter,
    checkScript: FORWARD_REVERSE.script,
    totalPoints: 10,
    createdAt: now,
    updatedAt: now,
    publishedAt: draft ? null : now,
  });
}

/** A program of `owner`, outside labs or in `labId` (a lab copy is also recorded as one). */
export async function programOf(t: TestApp, owner: Person, title: string, labId: string | null = null): Promise<string> {
  const now = t.clock.now();
  const made = await insertProgram(t.database.orm, { ownerId: owner.user.id, authorId: owner.user.id, title, labId, document: documentWithRungs(1, title), message: 'Created', now });
  if (labId) await insertLabCopy(t.database.orm, { labId, studentId: owner.user.id, programId: made.program.id, now });
  return made.program.id;
}

/** A graded submission of version 1 of `programId` to the lab. */
export async function submissionOf(t: TestApp, student: Person, labId: string, programId: string): Promise<string> {
  const now = t.clock.now();
  const row = await insertSubmission(t.database.orm, {
    labId,
    studentId: student.user.id,
    programId,
    versionNumber: 1,
    document: documentWithRungs(1),
    status: 'graded',
    autoScore: 0,
    score: 0,
    submittedAt: now,
    gradedAt: now,
  });
  return row.id;
}

/** The work of `studentBoth`: a program outside labs, a lab copy and a submission in each class. */
export interface StudentWork {
  labA: string;
  labB: string;
  freeProgram: string;
  copyA: string;
  copyB: string;
  submissionA: string;
  submissionB: string;
}

export async function studentWork(t: TestApp, room: Classroom, n: number): Promise<StudentWork> {
  const { studentBoth, teacherA, teacherB } = room.people;
  const labA = await labOf(t, room.classA.id, teacherA.user.id, `Lab A ${n}`);
  const labB = await labOf(t, room.classB.id, teacherB.user.id, `Lab B ${n}`);
  const freeProgram = await programOf(t, studentBoth, `Own ${n}`);
  const copyA = await programOf(t, studentBoth, `Lab A ${n}`, labA.id);
  const copyB = await programOf(t, studentBoth, `Lab B ${n}`, labB.id);
  return {
    labA: labA.id,
    labB: labB.id,
    freeProgram,
    copyA,
    copyB,
    submissionA: await submissionOf(t, studentBoth, labA.id, copyA),
    submissionB: await submissionOf(t, studentBoth, labB.id, copyB),
  };
}
