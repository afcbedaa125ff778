/**
 * Submissions: a student submits a saved version of their own program (enrolled, lab published,
 * due date and late policy applied), the server grades it in the worker pool and stores the report
 * with the exact version. Instructors list, open, override, give feedback, return (e-mail) and
 * regrade (old reports go to history). A student only ever gets the redacted report.
 */
import type { OverrideScoreRequest, ProgramVersionRef, StudentSubmission, SubmissionDetail, SubmissionListQuery, SubmissionRow } from '@shared/api';
import { publicUrl } from '../config';
import type { AppContext } from '../context';
import type { User } from '../db/users';
import { findClass, type ClassRecord } from '../db/classes';
import { findLab, type LabRecord } from '../db/labs';
import { findUserById } from '../db/users';
import * as db from '../db/submissions';
import { failure, success, type Outcome } from '../http/failure';
import { submissionReturnedMail } from '../mail/templates';
import { refusal } from '../policies/access';
import { submissionAccess, type SubmissionAction } from '../policies/submissionPolicy';
import { authorisedLab } from './labs';
import { autoScoreOf, gradeOnLab, lateStanding, round2 } from './grading';
import { studentSubmissionView, submissionRowView } from './labViews';
import { iso } from './views';

/** Grades a stored submission and writes the outcome (status `graded`, unless already returned). */
async function grade(ctx: AppContext, lab: LabRecord, s: db.SubmissionRecord): Promise<Outcome<db.SubmissionRecord>> {
  const graded = await gradeOnLab(ctx, lab, s.document);
  if (!graded.ok) return graded;
  const { report, note } = graded.value;
  const autoScore = autoScoreOf(report, lab.totalPoints, s.penaltyPercent);
  const updated = await db.updateSubmission(ctx.orm, s.id, {
    report,
    gradingNote: note,
    autoScore,
    score: s.overrideScore ?? autoScore,
    status: s.status === 'returned' ? 'returned' : 'graded',
    gradedAt: ctx.clock.now(),
  });
  return updated ? success(updated) : failure('not_found', 'The submission was removed while it was graded');
}

export async function submit(ctx: AppContext, actor: User, labId: string, ref: ProgramVersionRef): Promise<Outcome<StudentSubmission>> {
  const found = await authorisedLab(ctx, actor, labId, 'work');
  if (!found.ok) return found;
  const { lab } = found.value;
  const notYours = failure('validation', 'programId: submit one of your own programs', { fields: { programId: 'not one of your programs' } });
  const version = await db.findVersionWithOwner(ctx.orm, ref.programId, ref.version);
  if (version && version.ownerId !== actor.id) return notYours;
  if (!version) {
    if (!(await db.ownsProgram(ctx.orm, ref.programId, actor.id))) return notYours;
    return failure('validation', `version: the program has no saved version ${ref.version}`, { fields: { version: `no version ${ref.version}; save first` } });
  }
  const submittedAt = ctx.clock.now();
  const standing = lateStanding(lab, submittedAt);
  if (standing.refused) return failure('conflict', `The due date (${iso(lab.dueAt!)}) has passed and this lab takes no late submissions`);
  if (ctx.jobQueue) {
    // A shared database: stored as `submitted` with its job in one transaction; a `npm run worker`
    // grades it, and the student's page follows the status until it reads `graded`.
    const queue = ctx.jobQueue;
    const stored = await ctx.orm.transaction(async (tx) => {
      const row = await db.insertGradedSubmission(tx, {
        labId,
        studentId: actor.id,
        programId: ref.programId,
        versionNumber: version.number,
        document: version.document,
        status: 'submitted',
        late: standing.late,
        penaltyPercent: standing.penaltyPercent,
        report: null,
        gradingNote: null,
        autoScore: null,
        score: null,
        submittedAt,
        gradedAt: null,
      });
      await queue.enqueueGrading(tx, row.id);
      return row;
    });
    return success(studentSubmissionView(stored, lab.totalPoints));
  }
  // Graded first, then stored once with its report: one write per submission instead of two. A lab
  // whose script cannot run still takes the submission (status `submitted`), for a regrade later.
  const graded = await gradeOnLab(ctx, lab, version.document);
  const { report, note } = graded.ok ? graded.value : { report: null, note: null };
  const autoScore = graded.ok ? autoScoreOf(report, lab.totalPoints, standing.penaltyPercent) : null;
  const stored = await db.insertGradedSubmission(ctx.orm, {
    labId,
    studentId: actor.id,
    programId: ref.programId,
    versionNumber: version.number,
    document: version.document,
    status: graded.ok ? 'graded' : 'submitted',
    late: standing.late,
    penaltyPercent: standing.penaltyPercent,
    report,
    gradingNote: note,
    autoScore,
    score: autoScore,
    submittedAt,
    gradedAt: graded.ok ? ctx.clock.now() : null,
  });
  return success(studentSubmissionView(stored, lab.totalPoints));
}

export async function listMine(ctx: AppContext, actor: User, labId: string): Promise<Outcome<StudentSubmission[]>> {
  const found = await authorisedLab(ctx, actor, labId, 'work');
  if (!found.ok) return found;
  const rows = await db.listSubmissionsOf(ctx.orm, labId, actor.id);
  return success(rows.map((s) => studentSubmissionView(s, found.value.lab.totalPoints)));
}

type SortValue = string | number;
const SORT_KEYS = {
  submittedAt: (r) => r.submittedAt,
  student: (r) => r.student.name.toLowerCase(),
  autoScore: (r) => r.autoScore ?? -1,
  finalScore: (r) => r.finalScore ?? -1,
  status: (r) => r.status,
} satisfies Record<SubmissionListQuery['sort'], (r: SubmissionRow) => SortValue>;

export async function listForLab(ctx: AppContext, actor: User, labId: string, query: SubmissionListQuery): Promise<Outcome<SubmissionRow[]>> {
  const found = await authorisedLab(ctx, actor, labId, 'review');
  if (!found.ok) return found;
  const all = await db.listSubmissionsOfLab(ctx.orm, labId);
  const attempts = new Map<string, number>();
  const rows = all.map(({ submission, student }) => {
    const attempt = (attempts.get(student.id) ?? 0) + 1;
    attempts.set(student.id, attempt);
    return { row: submissionRowView(submission, student, found.value.lab.totalPoints, attempt, false), student: student.id };
  });
  const latest = rows.map((r) => ({ ...r.row, latest: r.row.attempt === attempts.get(r.student) }));
  const needle = query.student?.toLowerCase();
  const filtered = latest.filter(
    (r) =>
      (query.status === undefined || r.status === query.status) &&
      (query.late === undefined || r.late === query.late) &&
      (query.latest !== true || r.latest) &&
      (!needle || r.student.name.toLowerCase().includes(needle) || r.student.email.toLowerCase().includes(needle)),
  );
  const key = SORT_KEYS[query.sort];
  const sign = query.order === 'asc' ? 1 : -1;
  filtered.sort((a, b) => {
    const ka = key(a);
    const kb = key(b);
    return ka < kb ? -sign : ka > kb ? sign : a.id < b.id ? -1 : 1;
  });
  return success(filtered);
}

/** A submission with its lab and class, if the actor may review or grade it. */
async function authorisedSubmission(ctx: AppContext, actor: User, id: string, action: SubmissionAction): Promise<Outcome<{ s: db.SubmissionRecord; lab: LabRecord; cls: ClassRecord }>> {
  const s = await db.findSubmission(ctx.orm, id);
  const lab = s ? await findLab(ctx.orm, s.labId) : null;
  const cls = lab ? await findClass(ctx.orm, lab.classId) : null;
  if (!s || !lab || !cls) return failure('not_found', 'This submission does not exist or is not open to you');
  return refusal(submissionAccess(actor, s, cls, action), 'submission') ?? success({ s, lab, cls });
}

async function detail(ctx: AppContext, s: db.SubmissionRecord, lab: LabRecord): Promise<SubmissionDetail> {
  const mine = await db.listSubmissionsOf(ctx.orm, lab.id, s.studentId);
  const attempt = mine.findIndex((m) => m.id === s.id) + 1;
  const student = await findUserById(ctx.orm, s.studentId);
  const history = await db.listGradeHistory(ctx.orm, s.id);
  const row = submissionRowView(s, { id: s.studentId, name: student?.name ?? '', email: student?.email ?? '' }, lab.totalPoints, attempt, attempt === mine.length);
  return {
    ...row,
    labId: s.labId,
    programId: s.programId,
    report: s.report as SubmissionDetail['report'],
    program: { number: s.versionNumber, message: '', authorId: s.studentId, createdAt: iso(s.submittedAt), document: s.document },
    overrideScore: s.overrideScore,
    overrideReason: s.overrideReason,
    feedback: s.feedback,
    returnedAt: s.returnedAt ? iso(s.returnedAt) : null,
    gradedAt: s.gradedAt ? iso(s.gradedAt) : null,
    history: history.map((h) => ({ gradedAt: iso(h.gradedAt), autoScore: h.autoScore, gradingNote: h.gradingNote, report: h.report as SubmissionDetail['report'] })),
  };
}

export async function getSubmission(ctx: AppContext, actor: User, id: string): Promise<Outcome<SubmissionDetail>> {
  const found = await authorisedSubmission(ctx, actor, id, 'review');
  return found.ok ? success(await detail(ctx, found.value.s, found.value.lab)) : found;
}

export async function overrideScore(ctx: AppContext, actor: User, id: string, req: OverrideScoreRequest): Promise<Outcome<SubmissionDetail>> {
  const found = await authorisedSubmission(ctx, actor, id, 'grade');
  if (!found.ok) return found;
  const { s, lab } = found.value;
  if (req.score !== null && req.score > lab.totalPoints) {
    return failure('validation', `score: at most the lab's ${lab.totalPoints} points`, { fields: { score: `at most ${lab.totalPoints}` } });
  }
  const score = req.score === null ? null : round2(req.score);
  const updated = await db.updateSubmission(ctx.orm, id, { overrideScore: score, overrideReason: req.reason, score: score ?? s.autoScore });
  return updated ? success(await detail(ctx, updated, lab)) : failure('not_found', 'This submission does not exist or is not open to you');
}

export async function setFeedback(ctx: AppContext, actor: User, id: string, feedback: string): Promise<Outcome<SubmissionDetail>> {
  const found = await authorisedSubmission(ctx, actor, id, 'grade');
  if (!found.ok) return found;
  const updated = await db.updateSubmission(ctx.orm, id, { feedback });
  return updated ? success(await detail(ctx, updated, found.value.lab)) : failure('not_found', 'This submission does not exist or is not open to you');
}

/** Returns the submission to its student (status `returned`) and e-mails them. */
export async function returnSubmission(ctx: AppContext, actor: User, id: string, feedback: string | undefined): Promise<Outcome<SubmissionDetail>> {
  const found = await authorisedSubmission(ctx, actor, id, 'grade');
  if (!found.ok) return found;
  const { s, lab } = found.value;
  if (s.status === 'submitted') return failure('conflict', 'This submission is not graded yet; regrade the lab first');
  const updated = await db.updateSubmission(ctx.orm, id, { status: 'returned', returnedAt: ctx.clock.now(), ...(feedback !== undefined ? { feedback } : {}) });
  if (!updated) return failure('not_found', 'This submission does not exist or is not open to you');
  const student = await findUserById(ctx.orm, s.studentId);
  if (student) {
    const mail = submissionReturnedMail({ to: student.email, baseUrl: publicUrl(ctx.config), labTitle: lab.title, labId: lab.id, finalScore: updated.score, totalPoints: lab.totalPoints, feedback: updated.feedback });
    await ctx.mailer.send(mail).catch((err: unknown) => ctx.logger.warn({ err, submissionId: id }, 'the return e-mail could not be sent'));
  }
  return success(await detail(ctx, updated, lab));
}

/** Regradings in flight at once: enough to keep every worker of the pool busy, few enough to bound memory. */
export const REGRADE_CONCURRENCY = 4;

/** Grades every submission of the lab again with the current script, keeping each old report in history. */
export async function regradeLab(ctx: AppContext, actor: User, labId: string): Promise<Outcome<{ regraded: number; limited: number }>> {
  const found = await authorisedLab(ctx, actor, labId, 'review');
  if (!found.ok) return found;
  const lab = found.value.lab;
  const rows = await db.listSubmissionsOfLab(ctx.orm, labId);
  const now = ctx.clock.now();
  const regradeOne = async (submission: db.SubmissionRecord): Promise<Outcome<db.SubmissionRecord>> => {
    if (submission.gradedAt) {
      await db.insertGradeHistory(ctx.orm, { submissionId: submission.id, report: submission.report, gradingNote: submission.gradingNote, autoScore: submission.autoScore, gradedAt: submission.gradedAt, replacedAt: now });
    }
    return grade(ctx, lab, submission);
  };
  const outcomes = await mapBounded(rows.map((r) => r.submission), REGRADE_CONCURRENCY, regradeOne);
  const refused = outcomes.find((o) => !o.ok);
  if (refused) return refused;
  const limited = outcomes.filter((o) => o.ok && o.value.gradingNote).length;
  return success({ regraded: outcomes.length, limited });
}

/** `work` on every item, at most `limit` at a time; results in the items' order. */
async function mapBounded<T, R>(items: T[], limit: number, work: (item: T) => Promise<R>): Promise<R[]> {
  const results = new Array<R>(items.length);
  let next = 0;
  const lane = async (): Promise<void> => {
    while (next < items.length) {
      const i = next++;
      results[i] = await work(items[i]!);
    }
  };
  await Promise.all(Array.from({ length: Math.min(limit, items.length) }, lane));
  return results;
}
