/**
 * The grade report a check run produces (its student view is in `redact.ts`). Plain serialisable
 * data; the same inputs give the same report byte for byte (virtual time only, no clock).
 */
import type { Diagnostic } from '../engine';
import type { FieldEvent } from '../field/events';
import type { Expectation } from './script';
import type { TraceData } from './trace';

export const REPORT_FORMAT = 'rungwright.grade-report';

/** What a check found: a state word, a bit, a number, or null when the name reads nothing. */
export type Actual = string | boolean | number | null;

export interface CheckResult {
  /** The step's number in the script, counting from 1 (as error messages count); in a student's report, in the student's script. */
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
  /**
   * The kind of check when it is not a plain `expect`: `never`/`always` over a `during` interval
   * (then `expected` is that condition), or `until` (then `expected` is the awaited condition).
   */
  kind?: 'never' | 'always' | 'until';
  /** A `prove` check: the verdict, the states explored, why unknown, the counterexample as a script. */
  proof?: { verdict: string; states: number; reason?: string; counterexample?: unknown };
  /** A `during` or `until` check: the virtual time it spans, in ms as written (its scans run whole). */
  spanMs?: number;
  /** A `never`/`always` check that failed: the first scan (count since the start) and its time, in ms; `actual` is read there. */
  failedAt?: { scan: number; atMs: number };
  /** An `until` check: the window it must first hold in, in ms from the step's start. */
  within?: [number, number];
  /** An `until` check: ms from the step's start to the first scan where it held, or null if it never did. */
  tookMs?: number | null;
}

/** An event with the script step during which it happened (0 = the settling time before step 1). */
export interface ReportEvent extends FieldEvent {
  step: number;
}

export interface GradeReport {
  format: typeof REPORT_FORMAT;
  version: 1;
  panel: string;
  /** The scan period of the run, in ms. Absent from reports graded before it was recorded. */
  scanMs?: number;
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
  /** Remarks on how the script ran (a wait rounded up to whole scans, a force the program has no bit for). */
  notes?: string[];
  virtualMs: number;
  scans: number;
}
