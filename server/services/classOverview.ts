/**
 * The instructor's view of a class at a glance (every lab, in due order, with how many students
 * have not started, are working, have submitted or were returned their work) and of one lab
 * student by student, including those who have not submitted. Student work: the class's own
 * instructor only (`grades` / `review`), never an admin who does not teach it.
 */
import type { ClassOverview, LabStanding, LabStudentRow, OverviewLab } from '@shared/api/teaching';
import type { AppContext } from '../context';
import type { User } from '../db/users';
import { listStudents } from '../db/classes';
import { listLabsOfClass, type LabRecord } from '../db/labs';
import { listLabCopyOwners, listSubmissionStandings, newestByStudent, type SubmissionStanding } from '../db/teaching';
import { success, type Outcome } from '../http/failure';
import { authorisedClass } from './classes';
import { authorisedLab } from './labs';
import { round2 } from './grading';
import { iso } from './views';

const DAY_MS = 24 * 60 * 60 * 1000;

/** Labs by due date, undated ones last, then as they were made. */
export function inDueOrder<L extends Pick<LabRecord, 'dueAt' | 'createdAt' | 'id'>>(labs: readonly L[]): L[] {
  return [...labs].sort((a, b) => {
    const da = a.dueAt?.getTime() ?? Number.POSITIVE_INFINITY;
    const db = b.dueAt?.getTime() ?? Number.POSITIVE_INFINITY;
    if (da !== db) return da < db ? -1 : 1;
    return a.createdAt.getTime() - b.createdAt.getTime() || (a.id < b.id ? -1 : 1);
  });
}

/** Whole days, each one started counting, between the due date and a late submission. */
export function lateDays(dueAt: Date | null, submittedAt: Date | null): number {
  if (!dueAt || !submittedAt || submittedAt <= dueAt) return 0;
  return Math.ceil((submittedAt.getTime() - dueAt.getTime()) / DAY_MS);
}

function standingOf(newest: SubmissionStanding | undefined, hasCopy: boolean): LabStanding {
  if (newest) return newest.status === 'returned' ? 'returned' : 'submitted';
  return hasCopy ? 'in_progress' : 'not_started';
}

export async function classOverview(ctx: AppContext, actor: User, classId: string): Promise<Outcome<ClassOverview>> {
  const cls = await authorisedClass(ctx, actor, classId, 'grades');
  if (!cls.ok) return cls;
  const labs = inDueOrder(await listLabsOfClass(ctx.orm, classId, false));
  const students = await listStudents(ctx.orm, classId);
  const labIds = labs.map((l) => l.id);
  const newest = newestByStudent(await listSubmissionStandings(ctx.orm, labIds));
  const copies = new Set((await listLabCopyOwners(ctx.orm, labIds)).map((c) => `${c.labId}:${c.studentId}`));
  const overviewOf = (lab: LabRecord): OverviewLab => {
    const counts = { not_started: 0, in_progress: 0, submitted: 0, returned: 0, late: 0 };
    const scores: number[] = [];
    let needsGrading = 0;
    for (const student of students) {
      const key = `${lab.id}:${student.id}`;
      const s = newest.get(key);
      counts[standingOf(s, copies.has(key))] += 1;
      if (!s) continue;
      if (s.late) counts.late += 1;
      if (s.score !== null) scores.push(s.score);
      if (s.status !== 'returned') needsGrading += 1;
    }
    return {
      id: lab.id,
      title: lab.title,
      dueAt: lab.dueAt ? iso(lab.dueAt) : null,
      published: lab.publishedAt !== null,
      totalPoints: lab.totalPoints,
      counts,
      average: scores.length === 0 ? null : round2(scores.reduce((a, b) => a + b, 0) / scores.length),
      needsGrading,
    };
  };
  return success({ class: { id: cls.value.id, name: cls.value.name, term: cls.value.term }, students: students.length, labs: labs.map(overviewOf) });
}

/** Every enrolled student on one lab, by name, whether or not they submitted. */
export async function labStudents(ctx: AppContext, actor: User, labId: string): Promise<Outcome<LabStudentRow[]>> {
  const found = await authorisedLab(ctx, actor, labId, 'review');
  if (!found.ok) return found;
  const { lab, cls } = found.value;
  const students = await listStudents(ctx.orm, cls.id);
  const all = await listSubmissionStandings(ctx.orm, [lab.id]);
  const newest = newestByStudent(all);
  const copies = new Set((await listLabCopyOwners(ctx.orm, [lab.id])).map((c) => c.studentId));
  return success(
    students.map((student) => {
      const s = newest.get(`${lab.id}:${student.id}`);
      return {
        student: { id: student.id, name: student.name, email: student.email },
        standing: standingOf(s, copies.has(student.id)),
        submissionId: s?.id ?? null,
        status: s?.status ?? null,
        submissions: all.filter((x) => x.studentId === student.id).length,
        submittedAt: s ? iso(s.submittedAt) : null,
        late: s?.late ?? false,
        lateDays: s?.late ? Math.max(1, lateDays(lab.dueAt, s.submittedAt)) : 0,
        penaltyPercent: s?.penaltyPercent ?? 0,
        finalScore: s?.score ?? null,
        totalPoints: lab.totalPoints,
      };
    }),
  );
}
