/**
 * The gradebook of a class: students × labs with the final score of each student's newest
 * submission, totals over the published labs, and the same table as CSV (papaparse).
 */
import Papa from 'papaparse';
import type { Gradebook } from '@shared/api';
import { SAFE_CSV_OPTIONS } from '@shared/api/csv';
import type { AppContext } from '../context';
import type { User } from '../db/users';
import { listStudents } from '../db/classes';
import { listLabsOfClass } from '../db/labs';
import { listSubmissionScores } from '../db/submissions';
import { success, type Outcome } from '../http/failure';
import { authorisedClass } from './classes';
import { round2 } from './grading';
import { iso } from './views';

export async function gradebook(ctx: AppContext, actor: User, classId: string): Promise<Outcome<Gradebook>> {
  const cls = await authorisedClass(ctx, actor, classId, 'grades');
  if (!cls.ok) return cls;
  const labs = await listLabsOfClass(ctx.orm, classId, false);
  const students = await listStudents(ctx.orm, classId);
  // Oldest first, so the last one seen per student and lab is the newest.
  const newest = new Map<string, Awaited<ReturnType<typeof listSubmissionScores>>[number]>();
  for (const s of await listSubmissionScores(ctx.orm, labs.map((l) => l.id))) newest.set(`${s.studentId}:${s.labId}`, s);
  const possible = labs.filter((l) => l.publishedAt !== null).reduce((sum, l) => sum + l.totalPoints, 0);
  return success({
    class: { id: cls.value.id, name: cls.value.name, term: cls.value.term },
    labs: labs.map((l) => ({ id: l.id, title: l.title, totalPoints: l.totalPoints, dueAt: l.dueAt ? iso(l.dueAt) : null, published: l.publishedAt !== null })),
    rows: students.map((student) => {
      const cells = labs.map((lab) => {
        const s = newest.get(`${student.id}:${lab.id}`);
        return { labId: lab.id, submissionId: s?.id ?? null, finalScore: s?.score ?? null, status: s?.status ?? null, late: s?.late ?? false };
      });
      return { student: { id: student.id, name: student.name, email: student.email }, cells, total: round2(cells.reduce((sum, c) => sum + (c.finalScore ?? 0), 0)), possible };
    }),
  });
}

/**
 * The gradebook as CSV: one row per student, a column per lab (title and points), total and
 * possible. Names and titles come from users, so a cell a spreadsheet would take for a formula is
 * written as text (`SAFE_CSV_OPTIONS`).
 */
export function gradebookCsv(book: Gradebook): string {
  const header = ['Student', 'E-mail', ...book.labs.map((l) => `${l.title} (${l.totalPoints})`), 'Total', 'Possible'];
  const rows = book.rows.map((r) => [r.student.name, r.student.email, ...r.cells.map((c) => (c.finalScore === null ? '' : String(c.finalScore))), String(r.total), String(r.possible)]);
  return Papa.unparse({ fields: header, data: rows }, { ...SAFE_CSV_OPTIONS, quotes: false });
}

/** A file name for the download: the class name in safe characters. */
export function gradebookFilename(book: Gradebook): string {
  const slug = `${book.class.name} ${book.class.term}`.toLowerCase().replace(/[^a-z0-9]+/g, '-').replace(/^-|-$/g, '') || 'class';
  return `gradebook-${slug}.csv`;
}
