/**
 * One grading job as plain data, and the pure function that does it. The worker thread runs
 * `gradeJob`; the seed runs it in-process (same code, same report, the runner is deterministic).
 */
import { runChecks, type CheckLimits, type GradeReport } from '@shared/checks';
import type { PanelLayout } from '@shared/field/layout';
import type { Program } from '@shared/ladder/schema';
import { checkDocumentBounds } from '@shared/ladder/bounds';
import { formatIssuePath } from '@shared/ladder/restore';

/** What a grading needs: the program, the panel and the check script (already validated on save). */
export interface GradeJob {
  program: Program;
  panel: PanelLayout;
  script: unknown;
  limits?: Partial<CheckLimits>;
}

/** A report, or null with a note when no report could be made; `note` also explains a run a limit stopped. */
export interface GradeOutcome {
  report: GradeReport | null;
  note: string | null;
}

/** Grades `job` with the shared runner. Never throws: a problem becomes the note. */
export function gradeJob(job: GradeJob): GradeOutcome {
  // Documents are checked when saved, but one saved before the size limits existed may pass them.
  const outOfBounds = checkDocumentBounds(job.program);
  if (outOfBounds) return { report: null, note: `The program cannot be graded: ${formatIssuePath(outOfBounds.path)}: ${outOfBounds.message}` };
  try {
    const result = runChecks({ program: job.program, panel: job.panel, script: job.script, limits: job.limits });
    if (!result.ok) return { report: null, note: `The check script cannot run: ${result.errors.slice(0, 3).join('; ')}` };
    const report = result.report;
    const note = report.stoppedBy ? `The run stopped before the end of the script: ${report.stoppedBy}. The checks after that point count as failed.` : null;
    return { report, note };
  } catch (err) {
    return { report: null, note: `Grading failed: ${err instanceof Error ? err.message : String(err)}` };
  }
}
