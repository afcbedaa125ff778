import { describe, expect, it } from 'vitest';
import { redactReport, runChecks, studentScript, type CheckResult, type GradeReport } from '@shared/checks';
import { REVERSING_CONVEYOR } from '@shared/field';
import { THREE_WIRE, WARNING_HORN } from '@shared/labs';
import { formatValue, presentReport } from '@/components/labs/reportModel';
import { replayTo, replayableScript } from '@/components/labs/replay';
import { createSimulatorSession } from '@/simulation/session';

function grade(program = THREE_WIRE.starter): GradeReport {
  const result = runChecks({ program, panel: REVERSING_CONVEYOR, script: THREE_WIRE.script });
  if (!result.ok) throw new Error(result.errors.join('; '));
  return result.report;
}

describe('the grade report on screen', () => {
  it('shows every check in full for an instructor, hidden ones marked', () => {
    const shown = presentReport(grade());
    expect(shown.rows).toHaveLength(8);
    expect(shown.rows.filter((r) => r.hidden)).toHaveLength(3);
    expect(shown.hidden).toBeNull();
    expect(shown.scoreText).toBe(`${shown.score} / 11`);
  });

  it('puts each failed expectation beside what was found', () => {
    // The starter has no seal-in: after S2 is released K1 is open again.
    const sealIn = presentReport(grade()).rows.find((r) => r.label.startsWith('S2 starts the belt'))!;
    expect(sealIn.passed).toBe(false);
    expect(sealIn.earned).toBe(0);
    expect(sealIn.lines.find((l) => l.key === 'K1')).toEqual({ key: 'K1', expected: 'closed', actual: 'open', met: false });
    expect(sealIn.steps).toEqual(['press S2', 'wait 100 ms', 'release S2', 'wait 700 ms']);
  });

  it('gives a student the hidden checks only as counts, never their labels or expectations', () => {
    const shown = presentReport(redactReport(grade(THREE_WIRE.solution)));
    expect(shown.rows).toHaveLength(5);
    expect(shown.rows.every((r) => !r.hidden)).toBe(true);
    expect(shown.hidden).toEqual({ passed: 3, failed: 0, pointsEarned: 4, pointsPossible: 4 });
    expect(JSON.stringify(shown)).not.toContain('overload reset');
    expect(shown.passed).toBe(true);
    expect(shown.scoreText).toBe('11 / 11');
  });

  it('shows on the student\'s report the visible score a self-check of the same program shows', () => {
    for (const program of [THREE_WIRE.starter, THREE_WIRE.solution]) {
      const self = runChecks({ program, panel: REVERSING_CONVEYOR, script: studentScript(replayableScript(THREE_WIRE.script)!).script });
      if (!self.ok) throw new Error(self.errors.join('; '));
      const selfShown = presentReport(self.report);
      const reportShown = presentReport(redactReport(grade(program)));
      expect(reportShown.visibleText).toBe(selfShown.scoreText);
      expect(selfShown.visibleText).toBe(selfShown.scoreText);
    }
    expect(presentReport(redactReport(grade(THREE_WIRE.solution))).visibleText).toBe('7 / 7');
    // An instructor's full report counts only the checks not hidden.
    expect(presentReport(grade(THREE_WIRE.solution)).visibleText).toBe('7 / 7');
  });

  it('counts the hidden checks a student failed', () => {
    const shown = presentReport(redactReport(grade()));
    expect(shown.hidden!.failed + shown.hidden!.passed).toBe(3);
    expect(shown.failedCount).toBe(shown.rows.filter((r) => !r.passed).length + shown.hidden!.failed);
  });

  it('says why nothing ran when the program does not compile', () => {
    const coilOutOfRange = { kind: 'coil' as const, id: 'c', variant: 'coil' as const, operand: '%QX99' };
    const broken = { ...THREE_WIRE.starter, rungs: [{ ...THREE_WIRE.starter.rungs[0]!, network: { kind: 'series' as const, id: 'x', items: [coilOutOfRange] } }] };
    const shown = presentReport(grade(broken));
    expect(shown.problem).toMatch(/^the program does not compile: %QX99 is out of range/);
    expect(shown.passed).toBe(false);
    expect(shown.score).toBe(0);
  });

  it('writes values the way a person reads them', () => {
    expect(formatValue(true)).toBe('TRUE');
    expect(formatValue(false)).toBe('FALSE');
    expect(formatValue('closed')).toBe('closed');
    expect(formatValue({ min: 100, max: 200 })).toBe('100 … 200');
    expect(formatValue({ min: 5 })).toBe('≥ 5');
    expect(formatValue(null)).toMatch(/^nothing/);
  });
});

describe('"show me": replaying a check run in the simulator', () => {
  it('reaches the moment of a check with the state the grader saw', () => {
    const report = grade();
    const script = replayableScript(THREE_WIRE.script)!;
    for (const check of report.checks.slice(0, 5)) {
      const session = createSimulatorSession({ program: THREE_WIRE.starter, panel: REVERSING_CONVEYOR, scanMs: script.scanMs });
      const outcome = replayTo(session, script, check.index);
      expect(outcome.virtualMs, check.label).toBe(check.atMs);
      expect(session.simulation!.timeMs).toBe(check.atMs);
      for (const [key, actual] of Object.entries(check.actual)) {
        const word = session.simulation!.word(key);
        const found = word !== undefined ? word : (session.simulation!.runtime.read(key) ?? null);
        expect(found, `${check.label}: ${key}`).toEqual(actual);
      }
    }
  });

  it('replays the self-check script to each visible check of a student report, at the time the grader saw it', () => {
    // The warning-horn lab has a hidden check between two waits, which the student's script joins.
    const graded = runChecks({ program: WARNING_HORN.starter, panel: REVERSING_CONVEYOR, script: WARNING_HORN.script });
    if (!graded.ok) throw new Error(graded.errors.join('; '));
    const script = studentScript(replayableScript(WARNING_HORN.script)!).script;
    const visible = redactReport(graded.report).checks.filter((c): c is CheckResult => 'label' in c);
    expect(visible).toHaveLength(4);
    for (const check of visible) {
      const session = createSimulatorSession({ program: WARNING_HORN.starter, panel: REVERSING_CONVEYOR, scanMs: script.scanMs });
      expect(replayTo(session, script, check.index).virtualMs, check.label).toBe(check.atMs);
      expect(script.steps[check.index - 1], check.label).toMatchObject({ label: check.label });
    }
  });

  it('has nothing to replay for a script that does not parse', () => {
    expect(replayableScript({ steps: [] })).toBeNull();
  });
});

describe('a check over time in the report', () => {
  it('says in words where a never/always broke and when an until held', () => {
    const run = runChecks({
      program: THREE_WIRE.solution,
      panel: REVERSING_CONVEYOR,
      script: { steps: [{ press: 'S2' }, { during: 500, never: { K1: 'closed' } }, { until: { K1: 'open' }, within: [0, 100] }, { release: 'S2' }, { press: 'S1' }, { until: { K1: 'open' }, within: [0, 200] }] },
    });
    if (!run.ok) throw new Error(run.errors.join());
    const notes = presentReport(run.report).rows.map((r) => r.note);
    expect(notes[0]).toMatch(/^never over 500 ms: first broken at \d+ ms \(scan \d+\), values read there$/);
    expect(notes[1]).toBe('never held (wanted between 0 and 100 ms)');
    expect(notes[2]).toMatch(/^first held after \d+ ms \(wanted between 0 and 200 ms\)$/);
  });
});
