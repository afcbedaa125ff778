/**
 * The grade report as a student sees it: the run of their student's script (`studentScript`),
 * with the hidden checks' results added as pass or fail and points. It is built from the report
 * alone, so a report graded before its lab's script was edited still reads right.
 *
 * - Visible checks are numbered by the student's script and list the steps that led to them in
 *   it: hidden checks leave no gap in the numbers, and two waits a hidden check kept apart read
 *   as one. A visible check is otherwise as graded (same time, expectations, findings, points).
 * - Hidden checks give pass or fail and points, after the visible ones: no label, expectation,
 *   finding, time or position.
 * - The run is cut at the last visible check: events and trace rows after it are removed (and
 *   events the log dropped are counted only for the steps shown), and `virtualMs` and `scans`
 *   are the figures at that check, so the totals do not tell how long the hidden steps run. A
 *   limit that stopped the run after that check is reported without its time.
 *
 * What is left is what a self-check of the same program shows, hidden results apart.
 */
import type { CheckResult, GradeReport, ReportEvent } from './report';
import { describeWait, waitOfWords } from './stepWords';
import { joinWaits } from './studentScript';

/** A hidden check as a student sees it: pass or fail and its points, nothing more. */
export interface HiddenCheckView {
  passed: boolean;
  points: number;
  hidden: true;
}

export interface StudentReport extends Omit<GradeReport, 'checks'> {
  /** The visible checks, numbered by the student's script, then the hidden ones in script order. */
  checks: (CheckResult | HiddenCheckView)[];
  redacted: true;
}

/** The visible checks renumbered, the hidden ones reduced, and where each step shown went. */
interface Renumbered {
  visible: CheckResult[];
  hidden: HiddenCheckView[];
  /** Step number in the full script → step number in the student's script (0: the settling). */
  stepOf: Map<number, number>;
}

const hiddenView = (check: CheckResult): HiddenCheckView => ({ passed: check.passed, points: check.points, hidden: true });

/**
 * Walks the checks with the steps each lists (the steps between it and the previous check, in
 * order), applying the rules of `studentScript` to those words.
 */
function renumber(report: GradeReport, scanMs: number | null): Renumbered {
  const lastVisible = report.checks.findLastIndex((c) => !c.hidden);
  const visible: CheckResult[] = [];
  const hidden: HiddenCheckView[] = [];
  const stepOf = new Map<number, number>([[0, 0]]);
  let studentStep = 0;
  let fullStep = 0;
  /** The student's steps since their last check, in words. */
  let words: string[] = [];
  /** The last student step's ms when it is a wait (its words are then the last of `words`). */
  let lastWait: number | null = null;
  let afterHidden = false;
  report.checks.forEach((check, at) => {
    if (at > lastVisible) {
      hidden.push(hiddenView(check));
      return;
    }
    const count = check.index - fullStep - 1;
    // A report from before every check listed its steps (a run that did not compile or was
    // stopped) lacks their words: those steps are counted, never joined.
    const said = check.steps.length === count ? check.steps : null;
    for (let k = 0; k < count; k += 1) {
      const step = said?.[k] ?? null;
      const waitMs = step === null ? null : waitOfWords(step);
      const joined = afterHidden && waitMs !== null && lastWait !== null ? joinWaits(lastWait, waitMs, scanMs) : null;
      if (joined !== null) {
        words[words.length - 1] = describeWait(joined);
        lastWait = joined;
      } else {
        studentStep += 1;
        if (step !== null) words.push(step);
        lastWait = waitMs;
      }
      stepOf.set(fullStep + 1 + k, studentStep);
      afterHidden = false;
    }
    fullStep = check.index;
    if (check.hidden) {
      hidden.push(hiddenView(check));
      if (check.spanMs !== undefined && check.spanMs > 0) {
        // A hidden check that spans time reads as a wait (as in `studentScript`).
        const joined = lastWait !== null ? joinWaits(lastWait, check.spanMs, scanMs) : null;
        if (joined !== null) {
          words[words.length - 1] = describeWait(joined);
          lastWait = joined;
        } else {
          studentStep += 1;
          words.push(describeWait(check.spanMs));
          lastWait = check.spanMs;
        }
        stepOf.set(check.index, studentStep);
      }
      afterHidden = true;
      return;
    }
    studentStep += 1;
    // A check that spans time (a `during`, an `until`) logs the events of its span under its own step.
    stepOf.set(check.index, studentStep);
    visible.push({ ...check, index: studentStep, steps: words });
    words = [];
    lastWait = null;
  });
  return { visible, hidden, stepOf };
}

/**
 * The scan period: recorded in the report, else read from the first trace row, which is
 * recorded after scan 1 (`[scanMs, 1, …]`); null when neither says.
 */
function scanPeriod(report: GradeReport): number | null {
  if (report.scanMs !== undefined) return report.scanMs;
  const first = report.trace.rows[0];
  return first && first[1]! > 0 ? first[0]! / first[1]! : null;
}

/** Per-step counts moved to the student's steps; counts of joined steps add up. */
function droppedShown(bySteps: { step: number; count: number }[], stepOf: Map<number, number>, lastStep: number): { step: number; count: number }[] {
  const shown: { step: number; count: number }[] = [];
  for (const d of bySteps) {
    const step = d.step <= lastStep ? stepOf.get(d.step) : undefined;
    if (step === undefined) continue;
    const previous = shown.at(-1);
    if (previous?.step === step) previous.count += d.count;
    else shown.push({ step, count: d.count });
  }
  return shown;
}

/** The report for a student; see the module comment. */
export function redactReport(full: GradeReport): StudentReport {
  // Notes name steps of the full script; a self-check of the student's script gives its own.
  const { notes: _notes, ...report } = full;
  const scanMs = scanPeriod(report);
  const { visible, hidden, stepOf } = renumber(report, scanMs);
  const lastVisible = report.checks.findLast((c) => !c.hidden);
  // Without a visible check the student sees only the settling time before step 1 (step 0).
  const lastStep = lastVisible?.index ?? 0;
  const cutMs = lastVisible?.atMs ?? 0;
  const events: ReportEvent[] = report.events.flatMap((e) => {
    const step = e.step <= lastStep ? stepOf.get(e.step) : undefined;
    return step === undefined ? [] : [{ ...e, step }];
  });
  const dropped = report.eventsDroppedBySteps && droppedShown(report.eventsDroppedBySteps, stepOf, lastStep);
  // Trace rows are recorded after scans, at the scan's end time.
  const rows = report.trace.rows.filter((row) => row[0]! <= cutMs);
  // A trace that stopped growing after the cut is whole as far as the student sees it.
  const truncated = report.trace.truncated && rows.length === report.trace.rows.length;
  // A limit hit after the cut would give its time away ("stopped at 12000 ms: …").
  const stoppedAfterCut = report.stoppedBy !== null && report.virtualMs > cutMs;
  return {
    ...report,
    checks: [...visible, ...hidden],
    events,
    // A report from before the per-step count has only the total, which is all it can give.
    ...(dropped && { eventsDropped: dropped.reduce((sum, d) => sum + d.count, 0), eventsDroppedBySteps: dropped }),
    trace: { ...report.trace, rows, truncated },
    stoppedBy: stoppedAfterCut ? 'a limit stopped the run during the hidden checks' : report.stoppedBy,
    virtualMs: Math.min(cutMs, report.virtualMs),
    scans: scansAt(report, cutMs, scanMs),
    redacted: true,
  };
}

/** Scans run up to virtual time `ms`: every check falls on a scan boundary. */
function scansAt(report: GradeReport, ms: number, scanMs: number | null): number {
  if (ms >= report.virtualMs) return report.scans;
  if (scanMs === null || scanMs <= 0) return 0;
  return Math.min(report.scans, Math.round(ms / scanMs));
}
