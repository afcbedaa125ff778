/**
 * The gradebook of a class: students × labs (in due order) with the final score of each student's
 * newest submission, its late days and penalty, totals over the published labs, and the same
 * table as CSV for a learning management system's import (`shared/api/gradebookTable.ts`).
 */
import Papa from 'papaparse';
import type { Gradebook, LabPanel } from '@shared/api';
import { SAFE_CSV_OPTIONS } from '@shared/api/csv';
import { gradebookTable } from '@shared/api/gradebookTable';
import type { AppContext } from '../context';
import type { User } from '../db/users';
import { listStudents } from '../db/classes';
import { listLabsOfClass } from '../db/labs';
import { listSubmissionStandings, newestByStudent } from '../db/teaching';
import { success, type Outcome } from '../http/failure';
import { authorisedClass } from './classes';
import { inDueOrder, lateDays } from './classOverview';
import { round2 } from './grading';
import { countChecks, labRun } from './labChecks';
import { iso } from './views';

export async function gradebook(ctx: AppContext, actor: User, classId: string): Promise<Outcome<Gradebook>> {
  const cls = await authorisedClass(ctx, actor, classId, 'grades');
  if (!cls.ok) return cls;
  const labs = inDueOrder(await listLabsOfClass(ctx.orm, classId, false));
  const students = await listStudents(ctx.orm, classId);
  const newest = newestByStudent(await listSubmissionStandings(ctx.orm, labs.map((l) => l.id)));
  const possible = labs.filter((l) => l.publishedAt !== null).reduce((sum, l) => sum + l.totalPoints, 0);
  const checkPointsOf = (lab: (typeof labs)[number]): number => {
    const run = labRun(lab.panel as LabPanel, lab.checkScript);
    return run.ok ? countChecks(run.value.script).maxScore : 0;
  };
  return success({
    class: { id: cls.value.id, name: cls.value.name, term: cls.value.term },
    labs: labs.map((l) => ({ id: l.id, title: l.title, totalPoints: l.totalPoints, checkPoints: checkPointsOf(l), dueAt: l.dueAt ? iso(l.dueAt) : null, published: l.publishedAt !== null })),
    rows: students.map((student) => {
      const cells = labs.map((lab) => {
        const s = newest.get(`${lab.id}:${student.id}`);
        return {
          labId: lab.id,
          submissionId: s?.id ?? null,
          finalScore: s?.score ?? null,
          status: s?.status ?? null,
          late: s?.late ?? false,
          lateDays: s?.late ? Math.max(1, lateDays(lab.dueAt, s.submittedAt)) : 0,
          penaltyPercent: s?.penaltyPercent ?? 0,
        };
      });
      return { student: { id: student.id, name: student.name, email: student.email }, cells, total: round2(cells.reduce((sum, c) => sum + (c.finalScore ?? 0), 0)), possible };
    }),
  });
}

/**
 * The gradebook as CSV. Names and titles come from users, so a cell a spreadsheet would take for a
 * formula is written as text (`SAFE_CSV_OPTIONS`).
 */
export function gradebookCsv(book: Gradebook): string {
  const [header, ...rows] = gradebookTable(book);
  return Papa.unparse({ fields: header!.map(String), data: rows }, { ...SAFE_CSV_OPTIONS, quotes: false });
}

/** A file name for the download: the class name in safe characters. */
export function gradebookFilename(book: Gradebook): string {
  const slug = `${book.class.name} ${book.class.term}`.toLowerCase().replace(/[^a-z0-9]+/g, '-').replace(/^-|-$/g, '') || 'class';
  return `gradebook-${slug}.csv`;
}
