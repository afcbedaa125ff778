/**
 * `runChecks`: grade a program by running a check script on a field panel. The script is
 * checked first (its shape, then against the panel); a script or panel problem is returned as
 * errors, a program that does not compile gives a report where every check fails. The run is
 * bounded by a limit on virtual time and on scans; hitting one stops the run and says so in the
 * report (the remaining checks fail), it never hangs.
 */
import type { Program } from '../ladder/schema';
import { createSimulation, type Simulation } from '../field/simulation';
import type { PanelLayout } from '../field/layout';
import type { DeviceAction } from '../field/devices/model';
import { checkScriptAgainstPanel } from './againstPanel';
import { parseCheckScript } from './parseScript';
import { REPORT_FORMAT, type Actual, type CheckResult, type GradeReport, type ReportEvent } from './report';
import { stepAction, type CheckScript, type ExpectStep, type Expectation } from './script';
import { describeStep } from './stepWords';
import { createChangeTrace, type ChangeTrace } from './trace';

export interface CheckLimits {
  /** Total virtual time a script may run, in ms (settling included). */
  maxVirtualMs: number;
  /** Total scans a script may run. */
  maxScans: number;
}

/** 30 min of virtual time and 500 000 scans: far beyond any lab, small enough to grade a class quickly. */
export const DEFAULT_LIMITS: CheckLimits = Object.freeze({ maxVirtualMs: 30 * 60_000, maxScans: 500_000 });

export interface RunChecksOptions {
  program: Program;
  panel: PanelLayout;
  /** A script as JSON (checked here) or one already parsed. */
  script: CheckScript | unknown;
  limits?: Partial<CheckLimits>;
  /** Events the field log keeps between two steps; a step that logs more loses its oldest (default 10 000). */
  maxEvents?: number;
}

export type RunChecksResult = { ok: true; report: GradeReport } | { ok: false; errors: string[] };

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
  return { ok: true, report: grade(created.simulation, script, limits, created.warnings) };
}

function failedCheck(step: ExpectStep, index: number, atMs: number, note: string, steps: string[]): CheckResult {
  return {
    index,
    label: step.label ?? defaultLabel(step.expect),
    passed: false,
    points: step.points ?? 1,
    hidden: step.hidden ?? false,
    atMs,
    expected: step.expect,
    actual: Object.fromEntries(Object.keys(step.expect).map((k) => [k, null])),
    steps,
    note,
  };
}

function summarise(checks: CheckResult[]): Pick<GradeReport, 'passed' | 'score' | 'maxScore'> {
  const maxScore = checks.reduce((sum, c) => sum + c.points, 0);
  const score = checks.reduce((sum, c) => sum + (c.passed ? c.points : 0), 0);
  return { passed: checks.every((c) => c.passed), score, maxScore };
}

function unrunnable(script: CheckScript, panel: PanelLayout, error: string, diagnostics: GradeReport['diagnostics']): GradeReport {
  // Each check still lists the steps that lead to it: a student's view is numbered from them.
  const checks: CheckResult[] = [];
  let pending: string[] = [];
  script.steps.forEach((step, i) => {
    if (stepAction(step) !== 'expect') pending.push(describeStep(step));
    else {
      checks.push(failedCheck(step as ExpectStep, i + 1, 0, error, pending));
      pending = [];
    }
  });
  return {
    format: REPORT_FORMAT,
    version: 1,
    panel: panel.id,
    scanMs: script.scanMs,
    ...summarise(checks),
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

function grade(sim: Simulation, script: CheckScript, limits: CheckLimits, warnings: GradeReport['diagnostics']): GradeReport {
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
  /** Run whole scans for `ms`, unless that would pass a limit. */
  const advance = (ms: number): boolean => {
    const scans = Math.ceil(ms / sim.scanMs);
    if (sim.timeMs + scans * sim.scanMs > limits.maxVirtualMs) {
      stoppedBy = `stopped at ${sim.timeMs} ms: the script would pass the limit of ${limits.maxVirtualMs} ms of virtual time`;
      return false;
    }
    if (sim.scanCount + scans > limits.maxScans) {
      stoppedBy = `stopped at ${sim.timeMs} ms: the script would pass the limit of ${limits.maxScans} scans`;
      return false;
    }
    for (let n = 0; n < scans; n += 1) {
      sim.scan();
      trace.record(sim.timeMs, sim.scanCount);
    }
    return true;
  };

  const checks: CheckResult[] = [];
  let pending: string[] = [];
  if (advance(script.settleMs)) collect(0);
  script.steps.forEach((step, i) => {
    const number = i + 1;
    const action = stepAction(step);
    if (stoppedBy !== null) {
      // Nothing runs any more, but each check still lists the steps that lead to it.
      if (action !== 'expect') pending.push(describeStep(step));
      else {
        checks.push(failedCheck(step as ExpectStep, number, sim.timeMs, `not reached: ${stoppedBy}`, pending));
        pending = [];
      }
      return;
    }
    if (action === 'expect') {
      const e = step as ExpectStep;
      const actual: Record<string, Actual> = {};
      let passed = true;
      for (const [key, expected] of Object.entries(e.expect)) {
        actual[key] = readActual(sim, key);
        if (!matches(expected, actual[key])) passed = false;
      }
      checks.push({
        index: number,
        label: e.label ?? defaultLabel(e.expect),
        passed,
        points: e.points ?? 1,
        hidden: e.hidden ?? false,
        atMs: sim.timeMs,
        expected: e.expect,
        actual,
        steps: pending,
      });
      pending = [];
      return;
    }
    pending.push(describeStep(step));
    if (action === 'wait') advance((step as { wait: number }).wait);
    else {
      const s = step as Record<string, unknown>;
      // Validated against the panel already; a refusal (an overload still too hot to reset) is logged as an event.
      sim.act(String(s[action]), action as DeviceAction, { to: s.to as string | undefined, factor: s.factor as number | undefined });
    }
    collect(number);
  });
  return {
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
    virtualMs: sim.timeMs,
    scans: sim.scanCount,
  };
}
