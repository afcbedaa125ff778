import { describe, expect, it } from 'vitest';
import { redactReport, runChecks, traceToCSV, type GradeReport, type RunChecksOptions } from '@shared/checks';
import { REVERSING_CONVEYOR } from '@shared/field';
import { THREE_WIRE } from '@shared/labs';
import { buildProgram, coil, no, rung } from '@shared/labs/build';
import { conveyorTags } from '@shared/labs/conveyorTags';

function report(options: Partial<RunChecksOptions> = {}): GradeReport {
  const result = runChecks({ program: THREE_WIRE.solution, panel: REVERSING_CONVEYOR, script: THREE_WIRE.script, ...options });
  if (!result.ok) throw new Error(result.errors.join('\n'));
  return result.report;
}

const tiny = {
  panel: 'reversing-conveyor',
  steps: [
    { expect: { P2: 'lit' }, label: 'red at rest' },
    { press: 'S2' }, { wait: 100 }, { release: 'S2' }, { wait: 600 },
    { expect: { K1: 'closed', 'K1_Aux': true, '%QX1': true }, points: 3 },
    { trip: 'F1' }, { wait: 50 },
    { expect: { K1: 'open' }, label: 'secret', hidden: true, points: 2 },
    { reset: 'F1' }, { wait: 50 },
    { expect: { '%QX1': false }, label: 'visible again' },
  ],
};

describe('runChecks', () => {
  it('grades each check with expected, actual, points, time and the steps that led to it', () => {
    const r = report({ script: tiny });
    expect(r.checks.map((c) => [c.index, c.passed, c.points, c.atMs])).toEqual([
      [1, true, 1, 100],
      [6, true, 3, 800],
      [9, true, 2, 850],
      [12, true, 1, 900],
    ]);
    expect(r.checks[1]).toMatchObject({
      label: 'K1 closed, K1_Aux true, %QX1 true',
      expected: { K1: 'closed', 'K1_Aux': true, '%QX1': true },
      actual: { K1: 'closed', 'K1_Aux': true, '%QX1': true },
      steps: ['press S2', 'wait 100 ms', 'release S2', 'wait 600 ms'],
    });
    expect(r).toMatchObject({ passed: true, score: 7, maxScore: 7, stoppedBy: null, panel: 'reversing-conveyor', format: 'rungwright.grade-report' });
  });
  it('scores only the checks that pass', () => {
    const r = report({ program: THREE_WIRE.starter, script: tiny });
    expect(r.passed).toBe(false);
    expect(r.checks.filter((c) => !c.passed).map((c) => c.index)).toEqual([1, 6]);
    expect(r.checks[1]!.actual).toEqual({ K1: 'open', 'K1_Aux': false, '%QX1': false });
    expect(r.score).toBe(3);
    expect(r.maxScore).toBe(7);
  });
  it('checks block values by number and by range, and fails a name the program does not have', () => {
    const program = buildProgram('t', '', conveyorTags(), [rung('', no('Stop_PB'), { kind: 'block', id: '', type: 'TON', instance: 'T1', inputs: { PT: 'T#5s' } })]);
    const r = report({
      program,
      script: { steps: [{ wait: 2000 }, { expect: { 'T1.ET': 2100, 'T1.Q': false } }, { expect: { 'T1.ET': { min: 2000, max: 2200 } } }, { expect: { 'T9.ET': 1 } }, { expect: { Nothing: true } }] },
    });
    expect(r.checks.map((c) => c.passed)).toEqual([true, true, false, false]);
    expect(r.checks[2]!.actual).toEqual({ 'T9.ET': null });
  });
  it('returns script and panel problems as errors, not as a report', () => {
    const bad = runChecks({ program: THREE_WIRE.solution, panel: REVERSING_CONVEYOR, script: { steps: [{ trip: 'K1' }, { expect: { K1: 'open' } }] } });
    expect(bad).toEqual({ ok: false, errors: ['step 1: "trip" needs the id of an overload relay, got "K1" (a contactor)'] });
    expect(runChecks({ program: THREE_WIRE.solution, panel: REVERSING_CONVEYOR, script: 'nope' })).toEqual({ ok: false, errors: ['a check script is a JSON object with "steps"'] });
  });
  it('fails every check of a program that does not compile and says why', () => {
    const broken = buildProgram('t', '', [], [rung('', no('%IX42'), coil('%QX1'))]);
    const r = report({ program: broken });
    expect(r.passed).toBe(false);
    expect(r.score).toBe(0);
    expect(r.diagnostics.length).toBeGreaterThan(0);
    expect(r.checks.every((c) => !c.passed && c.note?.startsWith('the program does not compile'))).toBe(true);
    // Each check still lists the steps that lead to it, as in a run.
    expect(r.checks[1]!.steps).toEqual(report().checks[1]!.steps);
    expect(r.scanMs).toBe(10);
  });
  it('stops at the virtual-time limit and reports it instead of hanging', () => {
    const r = report({ script: { steps: [{ expect: { K1: 'open' } }, { wait: 600_000 }, { wait: 600_000 }, { expect: { K1: 'open' } }] }, limits: { maxVirtualMs: 700_000 } });
    expect(r.stoppedBy).toBe('stopped at 600100 ms: the script would pass the limit of 700000 ms of virtual time');
    expect(r.checks.map((c) => c.passed)).toEqual([true, false]);
    expect(r.checks[1]!.note).toMatch(/^not reached: stopped at 600100 ms/);
  });
  it('still lists, for each check not reached, the steps that lead to it', () => {
    const r = report({
      script: { steps: [{ expect: { K1: 'open' } }, { wait: 600_000 }, { wait: 600_000 }, { expect: { K1: 'open' } }, { press: 'S2' }, { wait: 10 }, { expect: { K1: 'open' } }] },
      limits: { maxVirtualMs: 700_000 },
    });
    expect(r.checks.map((c) => c.steps)).toEqual([[], ['wait 600000 ms', 'wait 600000 ms'], ['press S2', 'wait 10 ms']]);
  });
  it('stops at the scan limit too', () => {
    const r = report({ script: { steps: [{ wait: 5000 }, { expect: { K1: 'open' } }] }, limits: { maxScans: 100 } });
    expect(r.stoppedBy).toMatch(/limit of 100 scans/);
    expect(r.passed).toBe(false);
  });
  it('is deterministic: the same inputs give the same report byte for byte', () => {
    expect(JSON.stringify(report())).toBe(JSON.stringify(report()));
  });
  it('keeps a change-only trace of every input and output and writes it as CSV', () => {
    const r = report({ script: tiny });
    expect(r.trace.signals).toEqual(['%IX1', '%IX2', '%IX3', '%IX4', '%IX5', '%IX6', '%IX7', '%IX8', '%QX1', '%QX2', '%QX3', '%QX4', '%QX5', '%QX6']);
    const csv = traceToCSV(r.trace).split('\n');
    expect(csv[0]).toBe('time_ms,scan,%IX1,%IX2,%IX3,%IX4,%IX5,%IX6,%IX7,%IX8,%QX1,%QX2,%QX3,%QX4,%QX5,%QX6');
    expect(csv[1]).toBe('10,1,1,0,0,0,0,0,0,0,0,0,0,0,1,0');
    expect(csv[2]).toBe('110,11,1,1,0,0,0,0,0,0,1,0,0,0,1,0');
    for (let i = 2; i < r.trace.rows.length; i += 1) expect(r.trace.rows[i]!.slice(2)).not.toEqual(r.trace.rows[i - 1]!.slice(2));
  });
  it('tags each event with the step it happened in', () => {
    const r = report({ script: tiny });
    expect(r.events.find((e) => e.message === 'S2 pressed')).toMatchObject({ step: 2 });
    expect(r.events.find((e) => e.message === 'K1 dropped out: F1 95-96 opened')).toMatchObject({ step: 8 });
  });
});

describe('redactReport', () => {
  it('reduces hidden checks to pass or fail and points, after the visible checks, which it numbers without a gap', () => {
    const full = report({ script: tiny });
    const student = redactReport(full);
    expect(student.redacted).toBe(true);
    expect(student.checks.map((c) => ('label' in c ? [c.index, c.label] : c))).toEqual([
      [1, 'red at rest'],
      [6, 'K1 closed, K1_Aux true, %QX1 true'],
      // Step 12 of the script is step 11 of the student's: the hidden check (step 9) is gone.
      [11, 'visible again'],
      { passed: true, points: 2, hidden: true },
    ]);
    // The actions before the hidden check are the student's too: the later check depends on them.
    expect(student.checks[2]).toMatchObject({ atMs: 900, steps: ['trip F1', 'wait 50 ms', 'reset F1', 'wait 50 ms'] });
    expect(JSON.stringify(student)).not.toContain('secret');
    expect(student.score).toBe(full.score);
  });
  it('leaves a report without hidden checks as it was, apart from the flag', () => {
    const full = report({ script: { steps: [{ expect: { K1: 'open' } }] } });
    const { redacted, ...rest } = redactReport(full);
    expect(redacted).toBe(true);
    expect(rest).toEqual(full);
  });
});

describe('the example script of docs/check-scripts.md', () => {
  it('passes on the three-wire reference solution, the hidden overload check included', () => {
    const example = {
      panel: 'reversing-conveyor',
      scanMs: 10,
      steps: [
        { expect: { P2: 'lit', '%QX5': true }, label: 'red lamp on at rest', points: 1 },
        { set: 'S4', to: 'RUN' },
        { press: 'S2' }, { wait: 100 }, { release: 'S2' }, { wait: 100 },
        { expect: { K1: 'closed', M1: 'forward' }, label: 'runs forward, sealed in', points: 2 },
        { trip: 'F1' }, { wait: 50 },
        { expect: { K1: 'open', '%IX7': false }, label: 'overload drops K1', hidden: true },
      ],
    };
    const r = report({ script: example });
    expect(r.checks.map((c) => [c.label, c.passed])).toEqual([
      ['red lamp on at rest', true],
      ['runs forward, sealed in', true],
      ['overload drops K1', true],
    ]);
    expect([r.score, r.maxScore]).toEqual([4, 4]);
  });
});
