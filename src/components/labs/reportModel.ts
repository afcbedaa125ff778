/**
 * How a grade report reads on screen: one row per check with each expectation beside what was
 * found, and for a student's report the hidden checks only as counts. Pure: the views render what
 * these functions return, and the tests read the same rows.
 */
import type { Actual, CheckResult, Expectation, GradeReport, HiddenCheckView, StudentReport } from '@shared/checks';

/** A report as the server or the self-check hands it: full (instructor, self-check) or redacted (student). */
export type AnyReport = GradeReport | StudentReport;

/** One expectation of a check, next to what the run found. */
export interface ExpectationLine {
  key: string;
  expected: string;
  actual: string;
  /** This one expectation held. */
  met: boolean;
}

/** A check shown in full. */
export interface CheckRow {
  kind: 'full';
  index: number;
  label: string;
  passed: boolean;
  points: number;
  earned: number;
  hidden: boolean;
  /** Virtual time of the check, ms: where "show me" replays to. */
  atMs: number;
  lines: ExpectationLine[];
  /** What the script did since the previous check. */
  steps: string[];
  note: string | null;
}

/** What a student sees of the hidden checks: how many passed and failed, and their points. */
export interface HiddenSummary {
  passed: number;
  failed: number;
  pointsEarned: number;
  pointsPossible: number;
}

export interface PresentedReport {
  score: number;
  maxScore: number;
  /** "7 / 10". */
  scoreText: string;
  /**
   * The visible checks' points, "7 / 7": what a self-check of the same document shows, so a
   * student can compare the two. Equal to the score when nothing is hidden.
   */
  visibleText: string;
  passed: boolean;
  /** Checks shown in full (every check for an instructor; visible ones for a student). */
  rows: CheckRow[];
  /** Present only for a redacted report that has hidden checks. */
  hidden: HiddenSummary | null;
  /** Why the run stopped early, or why nothing could run (the program did not compile). */
  problem: string | null;
  failedCount: number;
}

/**
 * A report as an API answer parsed it. The routes' schemas check the fields the screens use and let
 * events, trace and diagnostics pass as the shared runner made them, so the answer is the shared
 * report type; this is the one place that says so.
 */
export function fullReportFromApi(report: unknown): GradeReport {
  return report as GradeReport;
}

/** A student's (redacted) report as an API answer parsed it; see `fullReportFromApi`. */
export function studentReportFromApi(report: unknown): StudentReport {
  return report as StudentReport;
}

/** An expectation or a found value as a person reads it. */
export function formatValue(value: Expectation | Actual): string {
  if (value === null) return 'nothing (not on this panel or program)';
  if (typeof value === 'object') {
    if (value.min !== undefined && value.max !== undefined) return `${value.min} … ${value.max}`;
    if (value.min !== undefined) return `≥ ${value.min}`;
    if (value.max !== undefined) return `≤ ${value.max}`;
    return 'any number';
  }
  if (typeof value === 'boolean') return value ? 'TRUE' : 'FALSE';
  return String(value);
}

function expectationMet(expected: Expectation, actual: Actual): boolean {
  if (typeof expected === 'object') {
    return typeof actual === 'number' && (expected.min === undefined || actual >= expected.min) && (expected.max === undefined || actual <= expected.max);
  }
  return expected === actual;
}

const isHiddenView = (check: CheckResult | HiddenCheckView): check is HiddenCheckView => !('label' in check);

function rowOf(check: CheckResult): CheckRow {
  const lines = Object.entries(check.expected).map(([key, expected]) => {
    const actual = check.actual[key] ?? null;
    return { key, expected: formatValue(expected), actual: formatValue(actual), met: expectationMet(expected, actual) };
  });
  return {
    kind: 'full',
    index: check.index,
    label: check.label,
    passed: check.passed,
    points: check.points,
    earned: check.passed ? check.points : 0,
    hidden: check.hidden,
    atMs: check.atMs,
    lines,
    steps: check.steps,
    note: [timedWords(check), check.note].filter(Boolean).join('; ') || null,
  };
}

/** What a check over time found, in words: the lines alone would read a `never` backwards. */
function timedWords(check: CheckResult): string | null {
  if (check.kind === 'never' || check.kind === 'always') {
    const span = `${check.kind} over ${check.spanMs ?? 0} ms`;
    return check.failedAt ? `${span}: first broken at ${check.failedAt.atMs} ms (scan ${check.failedAt.scan}), values read there` : `${span}: held at every scan`;
  }
  if (check.kind === 'until') {
    const window = check.within ? ` (wanted between ${check.within[0]} and ${check.within[1]} ms)` : '';
    return check.tookMs === null || check.tookMs === undefined ? `never held${window}` : `first held after ${check.tookMs} ms${window}`;
  }
  return null;
}

/** The report as rows; a redacted report's hidden checks become counts, never rows. */
export function presentReport(report: AnyReport): PresentedReport {
  const rows: CheckRow[] = [];
  const hiddenViews: HiddenCheckView[] = [];
  for (const check of report.checks) {
    if (isHiddenView(check)) hiddenViews.push(check);
    else rows.push(rowOf(check));
  }
  const redacted = 'redacted' in report && report.redacted === true;
  const hidden: HiddenSummary | null =
    redacted && hiddenViews.length > 0
      ? {
          passed: hiddenViews.filter((c) => c.passed).length,
          failed: hiddenViews.filter((c) => !c.passed).length,
          pointsEarned: hiddenViews.reduce((s, c) => s + (c.passed ? c.points : 0), 0),
          pointsPossible: hiddenViews.reduce((s, c) => s + c.points, 0),
        }
      : null;
  const compileError = report.checks.length > 0 && report.scans === 0 ? rows.find((r) => r.note)?.note ?? null : null;
  const visibleRows = rows.filter((r) => !r.hidden);
  const visibleEarned = visibleRows.reduce((sum, r) => sum + r.earned, 0);
  const visiblePossible = visibleRows.reduce((sum, r) => sum + r.points, 0);
  return {
    score: report.score,
    maxScore: report.maxScore,
    scoreText: `${report.score} / ${report.maxScore}`,
    visibleText: `${visibleEarned} / ${visiblePossible}`,
    passed: report.passed,
    rows,
    hidden,
    problem: report.stoppedBy ?? compileError,
    failedCount: report.checks.filter((c) => !c.passed).length,
  };
}
