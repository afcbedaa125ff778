/**
 * The student's script and the student's report tell one story: a self-check of a program (the
 * student's script run in the browser) shows exactly what the redacted grade report of the same
 * program shows — the same visible checks, numbered alike, at the same times, with the same
 * steps, findings and points, and the same events and trace — and neither shows where a hidden
 * check sat.
 */
import fc from 'fast-check';
import { describe, expect, it } from 'vitest';
import {
  MAX_WAIT_MS,
  parseCheckScript,
  redactReport,
  runChecks,
  studentScript,
  type CheckResult,
  type CheckScript,
  type CheckScriptInput,
  type GradeReport,
  type StudentReport,
} from '@shared/checks';
import { REVERSING_CONVEYOR } from '@shared/field';
import { STANDARD_LABS, THREE_WIRE, WARNING_HORN } from '@shared/labs';
import { buildProgram, coil, no, rung } from '@shared/labs/build';
import { conveyorTags } from '@shared/labs/conveyorTags';
import type { Program } from '@shared/ladder/schema';
import { MISTAKES } from '../labs/mistakes';

function parsed(script: CheckScriptInput): CheckScript {
  const result = parseCheckScript(script);
  if (!result.ok) throw new Error(result.errors.join('\n'));
  return result.value;
}

function run(program: Program, script: unknown): GradeReport {
  const result = runChecks({ program, panel: REVERSING_CONVEYOR, script });
  if (!result.ok) throw new Error(result.errors.join('\n'));
  return result.report;
}

const visibleOf = (report: StudentReport): CheckResult[] => report.checks.filter((c): c is CheckResult => !c.hidden);
const visiblePoints = (checks: CheckResult[]): number => checks.reduce((sum, c) => sum + (c.passed && !c.hidden ? c.points : 0), 0);

/** The student's two views of one program: the graded report redacted, and a self-check run. */
function bothViews(program: Program, script: CheckScript): { full: GradeReport; student: StudentReport; self: GradeReport } {
  const full = run(program, script);
  return { full, student: redactReport(full), self: run(program, studentScript(script).script) };
}

/** Everything but the hidden results and the grade, which only the server can give. */
function expectSameStory(program: Program, script: CheckScript, name: string): void {
  if (studentScript(script).script.steps.length === 0) {
    // Every check hidden: nothing to self-check, and the report shows only the settling time.
    const student = redactReport(run(program, script));
    expect(visibleOf(student), name).toEqual([]);
    expect([student.virtualMs, student.scans, student.trace.rows], name).toEqual([0, 0, []]);
    expect(student.events.every((e) => e.step === 0), name).toBe(true);
    return;
  }
  const { full, student, self } = bothViews(program, script);
  expect(visibleOf(student), name).toEqual(self.checks);
  expect(student.events, name).toEqual(self.events);
  expect(student.trace, name).toEqual(self.trace);
  expect([student.virtualMs, student.scans, student.eventsDropped], name).toEqual([self.virtualMs, self.scans, self.eventsDropped]);
  // The visible score a self-check gives is the visible part of the server's grade.
  expect(self.score, name).toBe(visiblePoints(full.checks));
}

/** A program that does not compile: every check fails, nothing runs. */
const BROKEN = buildProgram('broken', '', conveyorTags(), [rung('', no('%IX42'), coil('%QX1'))]);

describe('the student script of each standard lab', () => {
  describe.each(STANDARD_LABS.map((lab) => [lab.id, lab] as const))('%s', (_id, lab) => {
    const script = parsed(lab.script);
    const cut = studentScript(script);
    const wrong = MISTAKES.filter((m) => m.lab === lab.id);

    it('holds no hidden check and ends with the last visible check', () => {
      expect(cut.script.steps.some((s) => 'expect' in s && s.hidden)).toBe(false);
      expect('expect' in cut.script.steps.at(-1)!).toBe(true);
      const hidden = script.steps.filter((s) => 'expect' in s && s.hidden);
      expect(cut.withheld).toEqual({ hiddenChecks: hidden.length, hiddenPoints: hidden.reduce((sum, s) => sum + ('expect' in s ? (s.points ?? 1) : 0), 0) });
    });

    it('shows the same story as the redacted grade report, for the reference solution, the starter and wrong answers', () => {
      expect(wrong.length).toBeGreaterThan(0);
      expectSameStory(lab.solution, script, 'solution');
      expectSameStory(lab.starter, script, 'starter');
      for (const mistake of wrong) expectSameStory(mistake.program, script, mistake.name);
      expectSameStory(BROKEN, script, 'does not compile');
    });

    it('gives a wrong answer the visible score the server gives it', () => {
      for (const mistake of wrong) {
        const { full, self } = bothViews(mistake.program, script);
        expect(self.score, mistake.name).toBe(visiblePoints(full.checks));
        expect(self.checks.map((c) => [c.label, c.passed, c.atMs]), mistake.name).toEqual(full.checks.filter((c) => !c.hidden).map((c) => [c.label, c.passed, c.atMs]));
      }
    });
  });

  it('joins the two waits around the warning lab\'s hidden check at 2.8 s, so no step starts there', () => {
    const script = parsed(WARNING_HORN.script);
    const cut = studentScript(script).script;
    // Full: … check (1 s), wait 1800, hidden check (2.8 s), wait 400, check (3.2 s) …
    const first = cut.steps.findIndex((s) => 'expect' in s && s.label?.startsWith('1 s after S2'));
    expect(cut.steps[first + 1]).toEqual({ wait: 2200 });
    expect(cut.steps[first + 2]).toMatchObject({ label: 'after 3 s the belt starts and the horn stops' });
    const { student } = bothViews(WARNING_HORN.solution, script);
    const visible = visibleOf(student);
    expect(visible.map((c) => c.index)).toEqual(cut.steps.flatMap((s, i) => ('expect' in s ? [i + 1] : [])));
    expect(visible.find((c) => c.label.startsWith('after 3 s'))!.steps).toEqual(['wait 2200 ms']);
    expect(JSON.stringify(visible.map((c) => c.steps))).not.toContain('1800');
  });
});

describe('the student script', () => {
  const script = (steps: CheckScriptInput['steps'], scanMs = 10): CheckScript => parsed({ panel: 'reversing-conveyor', scanMs, steps });

  it('rounds the first of two joined waits up to whole scans, so the joined wait runs the same scans', () => {
    const s = script([{ press: 'S2' }, { wait: 25 }, { expect: { K1: 'open' }, hidden: true }, { wait: 31 }, { release: 'S2' }, { expect: { K1: 'open' } }], 10);
    expect(studentScript(s).script.steps).toEqual([{ press: 'S2' }, { wait: 61 }, { release: 'S2' }, { expect: { K1: 'open' } }]);
    expectSameStory(THREE_WIRE.solution, s, 'uneven waits');
  });

  it('joins the waits around several hidden checks in a row, and keeps apart waits no hidden check separated', () => {
    const s = script([
      { wait: 30 }, { wait: 40 },
      { expect: { K1: 'open' }, hidden: true }, { expect: { P2: 'lit' }, hidden: true },
      { wait: 50 }, { wait: 60 },
      { expect: { K1: 'open' } },
    ]);
    expect(studentScript(s).script.steps).toEqual([{ wait: 30 }, { wait: 90 }, { wait: 60 }, { expect: { K1: 'open' } }]);
    expectSameStory(THREE_WIRE.solution, s, 'hidden in a row');
  });

  it('keeps the waits apart when joined they would pass the longest wait a script may hold', () => {
    const s = script([{ wait: MAX_WAIT_MS - 10 }, { expect: { K1: 'open' }, hidden: true }, { wait: 20 }, { expect: { K1: 'open' } }]);
    expect(studentScript(s).script.steps).toEqual([{ wait: MAX_WAIT_MS - 10 }, { wait: 20 }, { expect: { K1: 'open' } }]);
    expectSameStory(THREE_WIRE.solution, s, 'long waits');
  });

  it('has no steps when every check is hidden, and a student report then shows only the settling', () => {
    const s = script([{ press: 'S2' }, { wait: 100 }, { expect: { K1: 'closed' }, hidden: true, points: 3 }]);
    expect(studentScript(s)).toMatchObject({ script: { steps: [] }, withheld: { hiddenChecks: 1, hiddenPoints: 3 } });
    const student = redactReport(run(THREE_WIRE.solution, s));
    expect(student.checks).toEqual([{ passed: true, points: 3, hidden: true }]);
    expect(student.events.every((e) => e.step === 0)).toBe(true);
  });
});

describe('any script, any program', () => {
  const device = fc.constantFrom('S1', 'S2', 'S3', 'S0');
  const step = fc.oneof(
    { weight: 3, arbitrary: fc.integer({ min: 0, max: 700 }).map((wait) => ({ wait })) },
    { weight: 2, arbitrary: device.map((press) => ({ press })) },
    { weight: 2, arbitrary: device.map((release) => ({ release })) },
    { weight: 1, arbitrary: fc.constantFrom('JOG', 'RUN').map((to) => ({ set: 'S4', to })) },
    { weight: 1, arbitrary: fc.constantFrom({ trip: 'F1' }, { reset: 'F1' }) },
    {
      weight: 3,
      arbitrary: fc.record({ hidden: fc.boolean(), points: fc.integer({ min: 0, max: 3 }), key: fc.constantFrom('K1', 'P2', '%QX1', 'M1') }).map(({ hidden, points, key }) => ({
        expect: { [key]: key === 'K1' ? 'closed' : key === 'P2' ? 'lit' : key === 'M1' ? 'forward' : true },
        hidden,
        points,
      })),
    },
    {
      weight: 1,
      arbitrary: fc.record({ hidden: fc.boolean(), span: fc.integer({ min: 1, max: 400 }), never: fc.boolean() }).map(({ hidden, span, never }) =>
        never ? { during: span, never: { K1: 'closed', P2: 'lit' }, hidden } : { during: span, always: { P2: 'lit' }, hidden },
      ),
    },
    {
      weight: 1,
      arbitrary: fc.record({ hidden: fc.boolean(), a: fc.integer({ min: 0, max: 300 }), b: fc.integer({ min: 0, max: 300 }) }).map(({ hidden, a, b }) => ({
        until: { K1: 'closed' },
        within: [Math.min(a, b), Math.max(a, b)],
        hidden,
      })),
    },
    { weight: 1, arbitrary: fc.constantFrom({ force: '%IX2', to: true }, { force: '%QX5', to: false }, { unforce: '%IX2' }, { unforce: 'all' }) },
    { weight: 1, arbitrary: fc.constantFrom(0, 0.5, 1).map((factor) => ({ preheat: 'F1', factor })) },
  );
  const hasCheck = (steps: object[]): boolean => steps.some((s) => 'expect' in s || 'during' in s || 'until' in s);
  const programs = STANDARD_LABS.flatMap((lab) => [lab.solution, lab.starter]);

  it('self-check and redacted report agree, whatever the steps, scan period and program', () => {
    fc.assert(
      fc.property(fc.array(step, { minLength: 1, maxLength: 30 }).filter(hasCheck), fc.constantFrom(1, 7, 10, 25), fc.constantFrom(...programs), (steps, scanMs, program) => {
        const s = parseCheckScript({ panel: 'reversing-conveyor', scanMs, steps });
        if (!s.ok) throw new Error(s.errors.join('\n'));
        expectSameStory(program, s.value, 'random script');
      }),
      { numRuns: 150 },
    );
    // Three runs per script at up to 1 ms scans: a correctness bound on a shared machine, not a speed target.
  }, 120_000);
});
