/**
 * The grade report a check run produces, and its student view. Plain serialisable data; the same
 * inputs give the same report byte for byte (virtual time only, no clock).
 */
import type { Diagnostic } from '../engine';
import type { FieldEvent } from '../field/events';
import type { Expectation } from './script';
import type { TraceData } from './trace';

export const REPORT_FORMAT = 'rungwright.grade-report';

/** What a check found: a state word, a bit, a number, or null when the name reads nothing. */
export type Actual = string | boolean | number | null;

export interface CheckResult {
  /** The step's number in the script, counting from 1 (as error messages count). */
  index: number;
  label: string;
  passed: boolean;
  /** Points the check is worth (earned only when it passes). */
  points: number;
  hidden: boolean;
  /** Virtual time of the check, in ms. */
  atMs: number;
  expected: Record<string, Expectation>;
  actual: Record<string, Actual>;
  /** What the script did since the previous check: "press S2", "wait 100 ms". */
  steps: string[];
  /** Why a check could not be evaluated (program did not compile, a limit stopped the run). */
  note?: string;
}

/** An event with the script step during which it happened (0 = the settling time before step 1). */
export interface ReportEvent extends FieldEvent {
  step: number;
}

export interface GradeReport {
  format: typeof REPORT_FORMAT;
  version: 1;
  panel: string;
  passed: boolean;
  score: number;
  maxScore: number;
  checks: CheckResult[];
  events: ReportEvent[];
  /** Events not kept because the log reached its size limit. */
  eventsDropped: number;
  /**
   * The same, by the step that logged them (steps with none left out), so a student's report can
   * count only the steps it shows. Absent from reports graded before it was recorded.
   */
  eventsDroppedBySteps?: { step: number; count: number }[];
  trace: TraceData;
  /** The program's compile diagnostics (errors make every check fail). */
  diagnostics: Diagnostic[];
  /** Why the run stopped before the end of the script (a limit), or null. */
  stoppedBy: string | null;
  virtualMs: number;
  scans: number;
}

/** A hidden check as a student sees it: pass or fail and its points, nothing more. */
export interface HiddenCheckView {
  index: number;
  passed: boolean;
  points: number;
  hidden: true;
}

export interface StudentReport extends Omit<GradeReport, 'checks'> {
  checks: (CheckResult | HiddenCheckView)[];
  redacted: true;
}

/**
 * The report for a student: hidden checks reduced to pass/fail with no label, expected, actual or
 * steps, and the events and trace rows of the steps that led to a hidden check removed, so the
 * log does not give away what a hidden check does. When the script has hidden checks, the run is
 * also cut at the last visible check: events and trace rows after it are removed (and events the
 * log dropped are counted only for the steps shown), and `virtualMs`
 * and `scans` are the figures at that check, so the totals do not tell how long the hidden steps
 * run. A limit that stopped the run after that check is reported without its time.
 */
export function redactReport(report: GradeReport): StudentReport {
  if (!report.checks.some((c) => c.hidden)) return { ...report, redacted: true };
  const hiddenSteps = new Set<number>();
  const hiddenWindows: [number, number][] = [];
  let previousIndex = 0;
  let previousAt = -1;
  for (const check of report.checks) {
    if (check.hidden) {
      for (let s = previousIndex + 1; s <= check.index; s += 1) hiddenSteps.add(s);
      hiddenWindows.push([previousAt, check.atMs]);
    }
    previousIndex = check.index;
    previousAt = check.atMs;
  }
  const lastVisible = report.checks.findLast((c) => !c.hidden);
  // Without a visible check the student sees only the settling time before step 1 (step 0).
  const lastStep = lastVisible?.index ?? 0;
  const cutMs = lastVisible?.atMs ?? 0;
  // Trace rows are recorded after scans: the rows of a segment have times in (previous check, check].
  const shown = (t: number): boolean => t <= cutMs && !hiddenWindows.some(([from, to]) => t > from && t <= to);
  // A limit hit after the cut would give its time away ("stopped at 12000 ms: …").
  const stoppedAfterCut = report.stoppedBy !== null && report.virtualMs > cutMs;
  const stepShown = (step: number): boolean => step <= lastStep && !hiddenSteps.has(step);
  const droppedShown = report.eventsDroppedBySteps?.filter((d) => stepShown(d.step));
  return {
    ...report,
    checks: report.checks.map((c) => (c.hidden ? { index: c.index, passed: c.passed, points: c.points, hidden: true as const } : c)),
    events: report.events.filter((e) => stepShown(e.step)),
    // A report from before the per-step count has only the total, which is all it can give.
    ...(droppedShown && { eventsDropped: droppedShown.reduce((sum, d) => sum + d.count, 0), eventsDroppedBySteps: droppedShown }),
    trace: { ...report.trace, rows: report.trace.rows.filter((row) => shown(row[0]!)) },
    stoppedBy: stoppedAfterCut ? 'a limit stopped the run during the hidden checks' : report.stoppedBy,
    virtualMs: Math.min(cutMs, report.virtualMs),
    scans: scansAt(report, cutMs),
    redacted: true,
  };
}

/**
 * Scans run up to virtual time `ms`. The scan period is constant within a run and every check
 * falls on a scan boundary, so the count is `ms / scanMs`; the period is read from the first trace
 * row, which is recorded after scan 1 (`[scanMs, 1, …]`). No rows means no scan ran.
 */
function scansAt(report: GradeReport, ms: number): number {
  if (ms >= report.virtualMs) return report.scans;
  const first = report.trace.rows[0];
  if (!first || first[1]! <= 0) return 0;
  const scanMs = first[0]! / first[1]!;
  return Math.min(report.scans, Math.round(ms / scanMs));
}
