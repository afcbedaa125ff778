/**
 * Grading a lab's submission: late standing from the due date and policy, the grading job sent to
 * the worker pool (same shared runner as the browser's self-check), and the scores scaled to the
 * lab's points. Scores have two decimals at most.
 */
import type { LatePolicy, LabPanel } from '@shared/api';
import type { GradeReport } from '@shared/checks';
import type { Program } from '@shared/ladder/schema';
import type { AppContext } from '../context';
import type { LabRecord } from '../db/labs';
import type { GradeOutcome } from '../grading/gradeJob';
import { failure, success, type Outcome } from '../http/failure';
import { labRun } from './labChecks';

export const round2 = (n: number): number => Math.round(n * 100) / 100;

/** Where a submission made at `at` stands against the lab's due date. */
export interface LateStanding {
  late: boolean;
  /** The policy refuses it. */
  refused: boolean;
  /** Deducted from the auto score, in %. */
  penaltyPercent: number;
}

export function lateStanding(lab: LabRecord, at: Date): LateStanding {
  const late = lab.dueAt !== null && at.getTime() > lab.dueAt.getTime();
  const policy = lab.latePolicy as LatePolicy;
  if (!late) return { late, refused: false, penaltyPercent: 0 };
  return { late, refused: policy.kind === 'refuse', penaltyPercent: policy.kind === 'penalty' ? (policy.penaltyPercent ?? 0) : 0 };
}

/** The report's score as points of `totalPoints`, after the penalty; 0 without a report. */
export function autoScoreOf(report: GradeReport | null, totalPoints: number, penaltyPercent: number): number {
  if (!report) return 0;
  const fraction = report.maxScore > 0 ? report.score / report.maxScore : report.passed ? 1 : 0;
  return round2(fraction * totalPoints * (1 - penaltyPercent / 100));
}

/** Runs the lab's script on `document` in the worker pool (the app's, or a queue worker's). */
export async function gradeOnLab(ctx: Pick<AppContext, 'grader'>, lab: LabRecord, document: unknown): Promise<Outcome<GradeOutcome>> {
  const run = labRun(lab.panel as LabPanel, lab.checkScript);
  if (!run.ok && run.part === 'panel') return failure('conflict', `The lab's panel is not valid any more: ${run.failure.message}`);
  if (!run.ok) return failure('conflict', `The lab's check script does not run on its panel: ${run.failure.message}`);
  return success(await ctx.grader.grade({ program: document as Program, panel: run.value.layout, script: run.value.script }));
}
