/**
 * The script steps over time and on the runtime: `during` with `never`/`always`, `until … within`,
 * `force`/`unforce`, `preheat`; how they are refused when malformed, graded, reported, and shown
 * to a student when hidden.
 */
import { describe, expect, it } from 'vitest';
import { parseCheckScript, redactReport, runChecks, studentScript, type GradeReport } from '@shared/checks';
import { REVERSING_CONVEYOR } from '@shared/field';
import { THREE_WIRE } from '@shared/labs';

const START = [{ press: 'S2' }, { wait: 100 }, { release: 'S2' }];

function grade(steps: unknown[], scanMs = 10): GradeReport {
  const result = runChecks({ program: THREE_WIRE.solution, panel: REVERSING_CONVEYOR, script: { panel: 'reversing-conveyor', scanMs, steps } });
  if (!result.ok) throw new Error(result.errors.join('\n'));
  return result.report;
}
const errorsOf = (steps: unknown[]): string[] => {
  const parsed = parseCheckScript({ steps });
  if (parsed.ok) {
    const run = runChecks({ program: THREE_WIRE.solution, panel: REVERSING_CONVEYOR, script: { steps } });
    return run.ok ? [] : run.errors;
  }
  return parsed.errors;
};

describe('during', () => {
  it('never: passes when no scan matches all of it, fails at the first scan that does', () => {
    const ok = grade([...START, { during: 2000, never: { K1: 'closed', K2: 'closed' }, label: 'never both' }]);
    expect(ok.checks[0]).toMatchObject({ passed: true, kind: 'never', spanMs: 2000, atMs: 2200 });
    expect(ok.checks[0]!.failedAt).toBeUndefined();
    const bad = grade([{ during: 2000, never: { K1: 'closed' } }, ...START.map(() => ({ wait: 0 })), { expect: { K1: 'open' } }]);
    expect(bad.checks[0]!.passed).toBe(true);
    const caught = grade([{ press: 'S2' }, { during: 1000, never: { K1: 'closed' } }]);
    expect(caught.checks[0]!.passed).toBe(false);
    // K1 closes a few scans after S2 (the program's scan, then the contactor): the first such scan is reported.
    const at = caught.checks[0]!.failedAt!;
    expect(at.atMs).toBeGreaterThan(100);
    expect(at.atMs).toBeLessThan(300);
    expect(at.scan * 10).toBe(at.atMs);
    expect(caught.checks[0]!.actual).toEqual({ K1: 'closed' });
    expect(caught.checks[0]!.atMs).toBe(1100);
  });
  it('always: fails at the first scan that breaks one entry', () => {
    const r = grade([...START, { wait: 700 }, { during: 500, always: { K1: 'closed', M1: 'forward' } }, { press: 'S1' }, { during: 500, always: { K1: 'closed' } }]);
    expect(r.checks.map((c) => c.passed)).toEqual([true, false]);
    expect(r.checks[1]).toMatchObject({ kind: 'always', actual: { K1: 'open' } });
    expect(r.checks[1]!.failedAt!.atMs).toBeGreaterThan(1400);
    expect(r.checks[1]!.label).toBe('always K1 closed during 500 ms');
  });
});

describe('until … within', () => {
  it('passes when the condition first holds inside the window, reports the time it took, and lasts the whole window', () => {
    const r = grade([{ press: 'S2' }, { until: { K1: 'closed' }, within: [10, 500] }, { expect: { P1: 'lit' } }]);
    expect(r.checks[0]!.passed).toBe(true);
    expect(r.checks[0]!.tookMs).toBeGreaterThanOrEqual(10);
    expect(r.checks[0]!.tookMs).toBeLessThan(300);
    expect(r.checks[0]).toMatchObject({ kind: 'until', within: [10, 500], atMs: 600 });
    expect(r.checks[1]!.atMs).toBe(600);
  });
  it('fails too early, too late and never, saying which', () => {
    const early = grade([{ press: 'S2' }, { until: { K1: 'closed' }, within: [400, 500] }]);
    expect(early.checks[0]).toMatchObject({ passed: false });
    expect(early.checks[0]!.tookMs).toBeLessThan(400);
    const never = grade([{ until: { K1: 'closed' }, within: [0, 300] }]);
    expect(never.checks[0]).toMatchObject({ passed: false, tookMs: null, actual: { K1: 'open' } });
    expect(grade([{ until: { K1: 'open' }, within: [0, 0] }]).checks[0]).toMatchObject({ passed: true, tookMs: 0 });
  });
});

describe('force and unforce', () => {
  it('a forced input drives the program as the field would; unforce gives the field back', () => {
    // %IX2 is S2 (NO start): forcing it TRUE starts the belt without a press.
    const r = grade([
      { force: '%IX2', to: true }, { wait: 500 }, { expect: { K1: 'closed' } },
      { unforce: '%IX2' }, { force: '%IX1', to: false }, { wait: 200 }, { expect: { K1: 'open', '%IX1': false } },
      { unforce: 'all' }, { wait: 50 }, { expect: { '%IX1': true } },
    ]);
    expect(r.checks.map((c) => c.passed)).toEqual([true, true, true]);
    expect(r.checks[0]!.steps).toEqual(['force %IX2 to true', 'wait 500 ms']);
    expect(r.checks[2]!.steps).toEqual(['remove every force', 'wait 50 ms']);
  });
  it('a force of a tag the program lacks is noted, not an error', () => {
    const r = grade([{ force: 'No_Such_Tag', to: true }, { expect: { K1: 'open' } }]);
    expect(r.notes?.[0]).toMatch(/^step 1: force No_Such_Tag did nothing: /);
  });
});

describe('preheat', () => {
  it('starts the relay from its steady image at the factor: hot trips far sooner than cold at the same load', () => {
    const hot = grade([{ preheat: 'F1', factor: 1 }, { load: 'M1', factor: 2 }, ...START, { until: { F1: 'tripped' }, within: [0, 600_000] }]);
    const cold = grade([{ load: 'M1', factor: 2 }, ...START, { until: { F1: 'tripped' }, within: [0, 600_000] }]);
    const [tHot, tCold] = [hot.checks[0]!.tookMs!, cold.checks[0]!.tookMs!];
    expect(tHot).toBeGreaterThan(0);
    expect(tHot).toBeLessThan(tCold / 2);
    expect(hot.checks[0]!.steps).toContain('preheat F1 at 1 × its setting');
  });
});

describe('script errors name the step and the field', () => {
  it.each([
    [[{ during: 0, never: { K1: 'closed' } }], 'step 1: "during" needs a whole number of ms from 1 to 14400000, got 0'],
    [[{ during: 100 }], 'step 1: a "during" step needs exactly one of "never" and "always", got neither'],
    [[{ during: 100, never: { K1: 'closed' }, always: { K2: 'open' } }], 'step 1: a "during" step needs exactly one of "never" and "always", got both'],
    [[{ during: 100, never: { K1: 'hot' } }], 'step 1: "K1" is a contactor: expect "open" or "closed", got "hot"'],
    [[{ during: 100, always: [] }], 'step 1: "always" needs an object of what to check'],
    [[{ until: { F1: 'tripped' } }], 'step 1: "until" needs "within": [earliest, latest]'],
    [[{ until: { F1: 'tripped' }, within: [10, 5] }], 'step 1: "until" needs "within": [earliest, latest]'],
    [[{ until: { F1: 'tripped' }, within: [0, 10], wait: 5 }], 'step 1: one action per step, got "wait" and "until"'],
    [[{ force: '%IX2' }, { expect: { K1: 'open' } }], 'step 1: "force" needs "to": true or false, got nothing'],
    [[{ force: '%IX9', to: true }, { expect: { K1: 'open' } }], 'step 1: "force": %IX9 is out of range'],
    [[{ unforce: '' }, { expect: { K1: 'open' } }], 'step 1: "unforce" needs a bit such as "%IX2", or "all"'],
    [[{ preheat: 'F1', factor: 1.5 }, { expect: { K1: 'open' } }], 'step 1: "preheat" needs "factor": the steady current before the test as a multiple of the setting, from 0 (cold) to 1 (hot); got 1.5'],
    [[{ preheat: 'K1', factor: 1 }, { expect: { K1: 'open' } }], 'step 1: "preheat" needs the id of an overload relay, got "K1" (a contactor)'],
    [[{ during: 100, never: { K1: 'closed' }, colour: 1 }], 'step 1: unknown field "colour" (a "during" step also takes never, always, label, points, hidden)'],
  ])('%j', (steps, message) => {
    expect(errorsOf(steps).some((e) => e.startsWith(message))).toBe(true);
  });
});

describe('rounding a span to whole scans', () => {
  it('is said once in the report', () => {
    const r = grade([{ wait: 15 }, { wait: 25 }, { during: 5, never: { K1: 'closed' } }], 10);
    expect(r.notes).toEqual(['step 1: 15 ms is not a whole number of 10 ms scans; it runs 20 ms, and so does every such span']);
    expect(r.virtualMs).toBe(100 + 20 + 30 + 10);
    expect(grade([{ wait: 20 }, { expect: { K1: 'open' } }]).notes).toBeUndefined();
  });
});

describe('a hidden timed check, as a student sees it', () => {
  const steps = [
    ...START,
    { wait: 300 },
    { during: 1000, never: { K2: 'closed' }, hidden: true, points: 2, label: 'secret interlock' },
    { wait: 200 },
    { expect: { K1: 'closed' }, label: 'still running' },
    { until: { K1: 'open' }, within: [0, 100], hidden: true },
    { press: 'S1' },
    { wait: 100 },
    { expect: { K1: 'open' }, label: 'stopped' },
  ];
  it('reads as a wait of its span, joined with the waits beside it, in the script and the report alike', () => {
    const parsed = parseCheckScript({ steps });
    if (!parsed.ok) throw new Error(parsed.errors.join());
    const cut = studentScript(parsed.value);
    expect(cut.script.steps).toEqual([...START, { wait: 1500 }, { expect: { K1: 'closed' }, label: 'still running' }, { wait: 100 }, { press: 'S1' }, { wait: 100 }, { expect: { K1: 'open' }, label: 'stopped' }]);
    expect(cut.withheld).toEqual({ hiddenChecks: 2, hiddenPoints: 3 });
    const full = grade(steps);
    const student = redactReport(full);
    const self = grade(cut.script.steps);
    const visible = student.checks.filter((c) => !c.hidden);
    expect(visible).toEqual(self.checks);
    expect(student.checks.filter((c) => c.hidden)).toEqual([
      { passed: true, points: 2, hidden: true },
      { passed: false, points: 1, hidden: true },
    ]);
    expect(JSON.stringify(student)).not.toContain('secret');
    expect(JSON.stringify(student)).not.toContain('K2');
    expect([student.virtualMs, student.events, student.trace]).toEqual([self.virtualMs, self.events, self.trace]);
  });
});
