/**
 * `runChecks`: grade a program by running a check script on a field panel. The script is
 * checked first (its shape, then against the panel); a script or panel problem is returned as
 * errors, a program that does not compile gives a report where every check fails. The run is
 * bounded by a limit on virtual time and on scans; hitting one stops the run and says so in the
 * report (the remaining checks fail), it never hangs. Quiet scans are leapt over, not run
 * (`scanner.ts`), so hours of virtual time on an idle or steadily loaded panel cost milliseconds.
 */
import type { Program } from '../ladder/schema';
import { createSimulation, type Simulation } from '../field/simulation';
import type { PanelLayout } from '../field/layout';
import type { DeviceAction } from '../field/devices/model';
import { checkScriptAgainstPanel } from './againstPanel';
import { parseCheckScript } from './parseScript';
import { REPORT_FORMAT, type Actual, type CheckResult, type GradeReport, type ReportEvent } from './report';
import { isCheckStep, stepAction, stepSpanMs, type CheckScript, type CheckStep, type DuringStep, type Expectation, type Step, type UntilStep } from './script';
import { describeStep } from './stepWords';
import { createChangeTrace, type ChangeTrace } from './trace';
import { proveCondition, proveLabel, runProveStep } from './proveStep';
import { createScanner, type ScanCounts } from './scanner';

export interface CheckLimits {
  /** Total virtual time a script may run, in ms (settling included). */
  maxVirtualMs: number;
  /** Total scans a script may count (run or leapt); unbounded by default: virtual time bounds a script, a wall clock bounds grading. */
  maxScans: number;
}

/**
 * 8 h of virtual time: room for IEC 60947-4-1's longest overload sequences (2 h at 1.05 ×, then up
 * to 2 h at 1.2 ×). Quiet scans cost nothing, and a busy program is stopped by the grading's
 * wall-clock limit (5 s, `server/grading/pool.ts`), so no count of scans is needed.
 */
export const DEFAULT_LIMITS: CheckLimits = Object.freeze({ maxVirtualMs: 8 * 3_600_000, maxScans: Number.POSITIVE_INFINITY });

export interface RunChecksOptions {
  program: Program;
  panel: PanelLayout;
  /** A script as JSON (checked here) or one already parsed. */
  script: CheckScript | unknown;
  limits?: Partial<CheckLimits>;
  /** Events the field log keeps between two steps; a step that logs more loses its oldest (default 10 000). */
  maxEvents?: number;
  /** Leap over quiet scans (default true); false runs every scan (the same report, slower: for tests). */
  leap?: boolean;
}

/** `scans`: how many scans ran and how many were leapt (not part of the report, which is the same either way). */
export type RunChecksResult = { ok: true; report: GradeReport; scans?: ScanCounts } | { ok: false; errors: string[] };

/** "K1 closed, M1 forward, %QX1 true": a label for a check that has none. */
function defaultLabel(expect: Record<string, Expectation>): string {
  return Object.entries(expect)
    .map(([k, v]) => `${k} ${typeof v === 'object' ? `in ${JSON.stringify(v)}` : String(v)}`)
    .join(', ');
}

function readActual(sim: Simulation, key: string): Actual {
  const word = sim.word(key);
  if (word !== undefined) return word;
  const value = sim.runtime.read(key);
  return value === undefined ? null : value;
}

function matches(expected: Expectation, actual: Actual): boolean {
  if (typeof expected === 'object') {
    if (typeof actual !== 'number') return false;
    return (expected.min === undefined || actual >= expected.min) && (expected.max === undefined || actual <= expected.max);
  }
  return actual === expected;
}

/** Grade `program` with `script` on `panel`. */
export function runChecks(options: RunChecksOptions): RunChecksResult {
  const parsed = parseCheckScript(options.script);
  if (!parsed.ok) return { ok: false, errors: parsed.errors };
  const script = parsed.value;
  const fit = checkScriptAgainstPanel(script, options.panel);
  if (fit.length > 0) return { ok: false, errors: fit };
  const limits: CheckLimits = { ...DEFAULT_LIMITS, ...options.limits };

  const created = createSimulation({ program: options.program, panel: options.panel, scanMs: script.scanMs, maxEvents: options.maxEvents });
  if (!created.ok) return { ok: true, report: unrunnable(script, options.panel, created.error, created.diagnostics) };
  return { ok: true, ...grade(created.simulation, script, limits, created.warnings, options.leap ?? true) };
}

/** The condition a check step tests. */
function conditionOf(step: CheckStep): Record<string, Expectation> {
  if ('expect' in step) return step.expect;
  if ('until' in step) return step.until;
  if ('prove' in step) return proveCondition(step);
  return step.never ?? step.always ?? {};
}

/** "never K1 closed, K2 closed during 5000 ms", "until F1 tripped within 4000..10000 ms". */
function labelOf(step: CheckStep): string {
  if (step.label !== undefined) return step.label;
  if ('prove' in step) return proveLabel(step);
  const words = defaultLabel(conditionOf(step));
  if ('during' in step) return `${step.never ? 'never' : 'always'} ${words} during ${step.during} ms`;
  if ('until' in step) return `${words} within ${step.within[0]}..${step.within[1]} ms`;
  return words;
}

/** The fields every result of `step` has, whatever its outcome. */
function resultBase(step: CheckStep, index: number, atMs: number, steps: string[]): Omit<CheckResult, 'passed' | 'actual'> {
  const base: Omit<CheckResult, 'passed' | 'actual'> = {
    index,
    label: labelOf(step),
    points: step.points ?? 1,
    hidden: step.hidden ?? false,
    atMs,
    expected: conditionOf(step),
    steps,
  };
  if ('during' in step) return { ...base, kind: step.never ? 'never' : 'always', spanMs: step.during };
  if ('until' in step) return { ...base, kind: 'until', spanMs: step.within[1], within: [step.within[0], step.within[1]] };
  return base;
}

function failedCheck(step: CheckStep, index: number, atMs: number, note: string, steps: string[]): CheckResult {
  const condition = conditionOf(step);
  return {
    ...resultBase(step, index, atMs, steps),
    passed: false,
    actual: Object.fromEntries(Object.keys(condition).map((k) => [k, null])),
    ...('until' in step && { tookMs: null }),
    note,
  };
}

/** `ran` false: the program did not compile, so the report fails whatever its checks (even none). */
function summarise(checks: CheckResult[], ran = true): Pick<GradeReport, 'passed' | 'score' | 'maxScore'> {
  const maxScore = checks.reduce((sum, c) => sum + c.points, 0);
  const score = checks.reduce((sum, c) => sum + (c.passed ? c.points : 0), 0);
  return { passed: ran && checks.every((c) => c.passed), score, maxScore };
}

function unrunnable(script: CheckScript, panel: PanelLayout, error: string, diagnostics: GradeReport['diagnostics']): GradeReport {
  // Each check still lists the steps that lead to it: a student's view is numbered from them.
  const checks: CheckResult[] = [];
  let pending: string[] = [];
  script.steps.forEach((step, i) => {
    if (!isCheckStep(step)) pending.push(describeStep(step));
    else {
      checks.push(failedCheck(step, i + 1, 0, error, pending));
      pending = [];
    }
  });
  return {
    format: REPORT_FORMAT,
    version: 1,
    panel: panel.id,
    scanMs: script.scanMs,
    ...summarise(checks, false),
    checks,
    events: [],
    eventsDropped: 0,
    eventsDroppedBySteps: [],
    trace: { signals: [], rows: [], truncated: false },
    diagnostics,
    stoppedBy: null,
    virtualMs: 0,
    scans: 0,
  };
}

function traceOf(sim: Simulation): ChangeTrace {
  const { inputs, outputs } = sim.panel;
  const signals = [
    ...Array.from({ length: inputs }, (_, i) => `%IX${i + 1}`),
    ...Array.from({ length: outputs }, (_, i) => `%QX${i + 1}`),
  ];
  const runtime = sim.runtime;
  return createChangeTrace(signals, (i) => (i < inputs ? (runtime.read(signals[i]!) === true ? 1 : 0) : runtime.getOutput(i - inputs + 1) ? 1 : 0));
}

function grade(sim: Simulation, script: CheckScript, limits: CheckLimits, warnings: GradeReport['diagnostics'], leaping: boolean): { report: GradeReport; scans: ScanCounts } {
  const trace = traceOf(sim);
  const events: ReportEvent[] = [];
  const droppedBySteps: GradeReport['eventsDroppedBySteps'] = [];
  let seenSeq = 0;
  const collect = (step: number): void => {
    const fresh = sim.eventsSince(seenSeq);
    const lost = sim.eventLog.total - seenSeq - fresh.length;
    if (lost > 0) droppedBySteps.push({ step, count: lost });
    for (const e of fresh) events.push({ ...e, step });
    seenSeq = sim.eventLog.total;
  };
  let stoppedBy: string | null = null;
  const notes: string[] = [];
  let roundedNoted = false;
  /** Would `scans` more scans pass a limit? Says so (and stops the run) if they would. */
  const fits = (scans: number): boolean => {
    if (sim.timeMs + scans * sim.scanMs > limits.maxVirtualMs) {
      stoppedBy = `stopped at ${sim.timeMs} ms: the script would pass the limit of ${limits.maxVirtualMs} ms of virtual time`;
      return false;
    }
    if (sim.scanCount + scans > limits.maxScans) {
      stoppedBy = `stopped at ${sim.timeMs} ms: the script would pass the limit of ${limits.maxScans} scans`;
      return false;
    }
    return true;
  };
  /** Whole scans covering `ms` (rounded up, noted once in the report). */
  const scansFor = (ms: number, step: number): number => {
    const scans = Math.ceil(ms / sim.scanMs);
    if (scans * sim.scanMs !== ms && !roundedNoted) {
      roundedNoted = true;
      notes.push(`step ${step}: ${ms} ms is not a whole number of ${sim.scanMs} ms scans; it runs ${scans * sim.scanMs} ms, and so does every such span`);
    }
    return scans;
  };
  const scanOnce = (): void => {
    sim.scan();
    trace.record(sim.timeMs, sim.scanCount);
  };
  const scanner = createScanner(sim, scanOnce, leaping);
  /** Run whole scans for `ms`, unless that would pass a limit. */
  const advance = (ms: number, step: number): boolean => {
    const scans = scansFor(ms, step);
    if (!fits(scans)) return false;
    scanner.run(scans);
    return true;
  };
  /** Does a condition read a number (an elapsed time a leap over running timers would skip)? */
  const readsNumber = (condition: Record<string, Expectation>): boolean => Object.keys(condition).some((k) => typeof readActual(sim, k) === 'number');
  const readAll = (condition: Record<string, Expectation>): Record<string, Actual> =>
    Object.fromEntries(Object.keys(condition).map((k) => [k, readActual(sim, k)]));
  const holds = (condition: Record<string, Expectation>): boolean => Object.entries(condition).every(([k, v]) => matches(v, readActual(sim, k)));

  /** A `during` check: scan through its span, noting the first scan that breaks it. */
  const runDuring = (step: DuringStep, number: number, steps: string[]): CheckResult | null => {
    const scans = scansFor(step.during, number);
    if (!fits(scans)) return null;
    const condition = conditionOf(step);
    const broken = step.never ? () => holds(condition) : () => !holds(condition);
    let failedAt: CheckResult['failedAt'];
    let actual: Record<string, Actual> | undefined;
    // A leapt scan shows what the scan before it showed, so the first scan that breaks it is run.
    const watch = (): void => {
      if (failedAt === undefined && broken()) {
        failedAt = { scan: sim.scanCount, atMs: sim.timeMs };
        actual = readAll(condition);
      }
    };
    scanner.run(scans, watch, !readsNumber(condition));
    return {
      ...resultBase(step, number, sim.timeMs, steps),
      passed: failedAt === undefined,
      actual: actual ?? readAll(condition),
      ...(failedAt && { failedAt }),
    };
  };

  /** An `until` check: look before the first scan and after each one; the step lasts its whole window. */
  const runUntil = (step: UntilStep, number: number, steps: string[]): CheckResult | null => {
    const scans = scansFor(step.within[1], number);
    if (!fits(scans)) return null;
    const start = sim.timeMs;
    const condition = conditionOf(step);
    let tookMs: number | null = holds(condition) ? 0 : null;
    let actual = tookMs === null ? null : readAll(condition);
    const watch = (): void => {
      if (tookMs === null && holds(condition)) {
        tookMs = sim.timeMs - start;
        actual = readAll(condition);
      }
    };
    scanner.run(scans, watch, !readsNumber(condition));
    const [earliest, latest] = step.within;
    return {
      ...resultBase(step, number, sim.timeMs, steps),
      passed: tookMs !== null && tookMs >= earliest && tookMs <= latest,
      actual: actual ?? readAll(condition),
      tookMs,
    };
  };

  const act = (step: Step, number: number): void => {
    const s = step as Record<string, unknown>;
    const action = stepAction(step);
    if (action === 'force') {
      const forced = sim.runtime.force(String(s.force), s.to as boolean);
      if (!forced.ok) notes.push(`step ${number}: force ${String(s.force)} did nothing: ${forced.error}`);
    } else if (action === 'unforce') {
      if (s.unforce === 'all') sim.runtime.clearForces();
      else sim.runtime.unforce(String(s.unforce));
    } else if (action === 'power') {
      if (s.power === 'off') sim.powerOff();
      else sim.powerOn();
    } else if (action === 'preheat') {
      // Checked against the panel already: the device is an overload relay.
      sim.preheat(String(s.preheat), s.factor as number);
    } else {
      // Validated against the panel already; a refusal (an overload still too hot to reset) is logged as an event.
      sim.act(String(s[action]), action as DeviceAction, { to: s.to as string | undefined, factor: s.factor as number | undefined });
    }
  };

  const checks: CheckResult[] = [];
  let pending: string[] = [];
  if (advance(script.settleMs, 0)) collect(0);
  script.steps.forEach((step, i) => {
    const number = i + 1;
    const action = stepAction(step);
    if (stoppedBy !== null) {
      // Nothing runs any more, but each check still lists the steps that lead to it.
      if (!isCheckStep(step)) pending.push(describeStep(step));
      else {
        checks.push(failedCheck(step, number, sim.timeMs, `not reached: ${stoppedBy}`, pending));
        pending = [];
      }
      return;
    }
    if ('prove' in step) {
      // Every behaviour from power-up: the script's timeline does not move.
      const program = sim.runtime.plan.program;
      const replay = (cx: CheckScript): string | null => {
        const run = runChecks({ program, panel: sim.panel, script: cx });
        if (!run.ok) return run.errors.join('; ');
        return run.report.passed ? null : run.report.checks.filter((c) => !c.passed).map((c) => `step ${c.index} (${c.label}) failed`).join('; ');
      };
      checks.push(runProveStep(step, resultBase(step, number, sim.timeMs, pending), program, sim.panel, sim.scanMs, replay));
      pending = [];
      return;
    }
    if (action === 'expect' && 'expect' in step) {
      checks.push({ ...resultBase(step, number, sim.timeMs, pending), passed: holds(step.expect), actual: readAll(step.expect) });
      pending = [];
      return;
    }
    if (isCheckStep(step)) {
      const result = 'during' in step ? runDuring(step, number, pending) : runUntil(step as UntilStep, number, pending);
      checks.push(result ?? failedCheck(step, number, sim.timeMs, `not reached: ${stoppedBy}`, pending));
      pending = [];
      collect(number);
      return;
    }
    pending.push(describeStep(step));
    if (action === 'wait') advance(stepSpanMs(step), number);
    else act(step, number);
    collect(number);
  });
  const report: GradeReport = {
    format: REPORT_FORMAT,
    version: 1,
    panel: sim.panel.id,
    scanMs: sim.scanMs,
    ...summarise(checks),
    checks,
    events,
    eventsDropped: Math.max(0, sim.eventLog.total - events.length),
    eventsDroppedBySteps: droppedBySteps,
    trace: trace.data(),
    diagnostics: warnings,
    stoppedBy,
    ...(notes.length > 0 && { notes }),
    virtualMs: sim.timeMs,
    scans: sim.scanCount,
  };
  return { report, scans: scanner.counts };
}
