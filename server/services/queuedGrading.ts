/**
 * What a `npm run worker` process does with one job of the grading queue: read the submission and
 * its lab, grade the stored document in the worker pool (the same `gradeOnLab` as the in-process
 * path, the same 5 s bound), and write the grade only if the submission still waits for one.
 */
import type { Clock } from '../clock';
import type { Db } from '../db/client';
import { findLab } from '../db/labs';
import { findSubmission, recordQueuedGrade } from '../db/submissions';
import type { Grader } from '../grading/pool';
import { autoScoreOf, gradeOnLab } from './grading';

export interface QueuedGradingDeps {
  orm: Db;
  grader: Grader;
  clock: Clock;
  /** True once `grader` is closed: a grading it cut short is not written, the job goes back to the queue. */
  graderClosed: () => boolean;
}

/** What became of one job; the worker logs it. */
export type QueuedGradingResult = 'graded' | 'already-graded' | 'gone' | 'lab-cannot-grade';

export async function gradeQueuedSubmission(deps: QueuedGradingDeps, submissionId: string): Promise<QueuedGradingResult> {
  const submission = await findSubmission(deps.orm, submissionId);
  if (!submission) return 'gone';
  if (submission.status !== 'submitted' || submission.gradedAt) return 'already-graded';
  const lab = await findLab(deps.orm, submission.labId);
  if (!lab) return 'gone';
  const graded = await gradeOnLab(deps, lab, submission.document);
  // Like the in-process path: a lab whose script cannot run keeps the submission `submitted`, for a regrade.
  if (!graded.ok) return 'lab-cannot-grade';
  if (deps.graderClosed()) throw new Error('the worker is stopping; the job goes back to the queue');
  const { report, note } = graded.value;
  const written = await recordQueuedGrade(deps.orm, submissionId, {
    report,
    gradingNote: note,
    autoScore: autoScoreOf(report, lab.totalPoints, submission.penaltyPercent),
    gradedAt: deps.clock.now(),
  });
  return written ? 'graded' : 'already-graded';
}
