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
 * log does not give away what a hidden check does.
 */
export function redactReport(report: GradeReport): StudentReport {
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
  // Trace rows are recorded after scans: the rows of a segment have times in (previous check, check].
  const inHiddenWindow = (t: number): boolean => hiddenWindows.some(([from, to]) => t > from && t <= to);
  return {
    ...report,
    checks: report.checks.map((c) => (c.hidden ? { index: c.index, passed: c.passed, points: c.points, hidden: true as const } : c)),
    events: report.events.filter((e) => !hiddenSteps.has(e.step)),
    trace: { ...report.trace, rows: report.trace.rows.filter((row) => !inHiddenWindow(row[0]!)) },
    redacted: true,
  };
}
