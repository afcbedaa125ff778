/**
 * What a student's report may not tell: past the last visible check, nothing of the run reaches
 * them — no events, no trace rows, and virtual time and scan count stop at that check.
 */
import { describe, expect, it } from 'vitest';
import { redactReport, runChecks, type GradeReport } from '@shared/checks';
import { REVERSING_CONVEYOR } from '@shared/field';
import { THREE_WIRE, WARNING_HORN } from '@shared/labs';
import { buildProgram, coil, no, rung } from '@shared/labs/build';
import { conveyorTags } from '@shared/labs/conveyorTags';

function grade(script: unknown): GradeReport {
  const result = runChecks({ program: THREE_WIRE.solution, panel: REVERSING_CONVEYOR, script });
  if (!result.ok) throw new Error(result.errors.join('\n'));
  return result.report;
}

/** Visible checks at 100 ms and 800 ms, then 1 770 ms of hidden steps (a trip, a long wait, a reset). */
const TRAILING_HIDDEN = {
  panel: 'reversing-conveyor',
  scanMs: 10,
  steps: [
    { expect: { P2: 'lit' }, label: 'red at rest' },
    { press: 'S2' }, { wait: 100 }, { release: 'S2' }, { wait: 600 },
    { expect: { K1: 'closed' }, label: 'runs' },
    { trip: 'F1' }, { wait: 1230 },
    { expect: { K1: 'open' }, label: 'secret drop-out', hidden: true },
    { reset: 'F1' }, { wait: 540 },
    { expect: { K1: 'open' }, label: 'secret stays off', hidden: true },
  ],
};

describe('redactReport past the last visible check', () => {
  const full = grade(TRAILING_HIDDEN);
  const student = redactReport(full);

  it('gives virtual time and scans as they were at the last visible check', () => {
    expect(full.virtualMs).toBe(2570);
    expect(full.scans).toBe(257);
    expect(student.virtualMs).toBe(800);
    expect(student.scans).toBe(80);
    expect(JSON.stringify(student)).not.toContain('2570');
  });

  it('keeps no event of a step after the last visible check', () => {
    expect(full.events.some((e) => e.step > 6)).toBe(true);
    expect(student.events.length).toBeGreaterThan(0);
    expect(student.events.every((e) => e.step <= 6)).toBe(true);
    expect(JSON.stringify(student.events)).not.toMatch(/F1/);
  });

  it('keeps no trace row after the last visible check', () => {
    expect(full.trace.rows.some((row) => row[0]! > 800)).toBe(true);
    expect(student.trace.rows.length).toBeGreaterThan(0);
    expect(student.trace.rows.every((row) => row[0]! <= 800)).toBe(true);
  });

  it('counts events the log dropped only in the steps a student is shown', () => {
    // A log that keeps one event between two steps loses most of every busy step.
    const graded = runChecks({ program: THREE_WIRE.solution, panel: REVERSING_CONVEYOR, script: TRAILING_HIDDEN, maxEvents: 1 });
    if (!graded.ok) throw new Error(graded.errors.join('\n'));
    const bySteps = graded.report.eventsDroppedBySteps!;
    expect(bySteps.reduce((sum, d) => sum + d.count, 0)).toBe(graded.report.eventsDropped);
    const visible = bySteps.filter((d) => d.step <= 6).reduce((sum, d) => sum + d.count, 0);
    expect(visible).toBeGreaterThan(0);
    expect(bySteps.some((d) => d.step > 6)).toBe(true);
    const shown = redactReport(graded.report);
    expect(shown.eventsDropped).toBe(visible);
    expect(shown.eventsDroppedBySteps!.every((d) => d.step <= 6)).toBe(true);
    expect(full.eventsDroppedBySteps).toEqual([]);
  });

  it('still counts the hidden checks in the score, as pass or fail only', () => {
    expect(student.score).toBe(full.score);
    expect(student.checks.slice(2)).toEqual([
      { passed: full.checks[2]!.passed, points: 1, hidden: true },
      { passed: full.checks[3]!.passed, points: 1, hidden: true },
    ]);
  });

  it('gives a student nothing of the run when every check is hidden, beyond the settling time', () => {
    const allHidden = redactReport(grade({ ...TRAILING_HIDDEN, steps: TRAILING_HIDDEN.steps.map((s) => ('expect' in s ? { ...s, hidden: true } : s)) }));
    expect(allHidden.virtualMs).toBe(0);
    expect(allHidden.scans).toBe(0);
    expect(allHidden.trace.rows).toEqual([]);
    expect(allHidden.events.every((e) => e.step === 0)).toBe(true);
  });

  it('says a limit stopped the run without the time it stopped at, when that was after the cut', () => {
    const limited = runChecks({ program: THREE_WIRE.solution, panel: REVERSING_CONVEYOR, script: TRAILING_HIDDEN, limits: { maxVirtualMs: 2300 } });
    if (!limited.ok) throw new Error(limited.errors.join('\n'));
    expect(limited.report.stoppedBy).toMatch(/stopped at 2030 ms/);
    const shown = redactReport(limited.report);
    expect(shown.stoppedBy).toBe('a limit stopped the run during the hidden checks');
    expect(JSON.stringify(shown)).not.toContain('2030');
    expect(shown.virtualMs).toBe(800);
  });
});

describe('redactReport of a report graded before the scan period and every step were recorded', () => {
  it('reads the scan period from the trace and gives the same student view', () => {
    const full = runChecks({ program: WARNING_HORN.solution, panel: REVERSING_CONVEYOR, script: { ...WARNING_HORN.script, scanMs: 7 } });
    if (!full.ok) throw new Error(full.errors.join('\n'));
    const { scanMs, ...older } = full.report;
    expect(scanMs).toBe(7);
    expect(redactReport(older)).toEqual({ ...redactReport(full.report), scanMs: undefined });
  });

  it('numbers the steps it has no words for without joining any, and still gives no hidden check a place', () => {
    const broken = runChecks({ program: buildProgram('broken', '', conveyorTags(), [rung('', no('%IX42'), coil('%QX1'))]), panel: REVERSING_CONVEYOR, script: WARNING_HORN.script });
    if (!broken.ok) throw new Error(broken.errors.join('\n'));
    expect(broken.report.scans).toBe(0);
    // Before, a program that did not compile got no steps listed for its checks.
    const older: GradeReport = { ...broken.report, checks: broken.report.checks.map((c) => ({ ...c, steps: [] })) };
    const student = redactReport(older);
    const visible = student.checks.filter((c) => !c.hidden);
    const hiddenBefore = (index: number) => older.checks.filter((c) => c.hidden && c.index < index).length;
    expect(visible.map((c) => ('index' in c ? c.index : null))).toEqual(older.checks.filter((c) => !c.hidden).map((c) => c.index - hiddenBefore(c.index)));
    expect(student.checks.filter((c) => c.hidden).every((c) => !('index' in c))).toBe(true);
  });
});
