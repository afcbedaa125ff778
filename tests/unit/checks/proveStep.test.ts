import { describe, expect, it } from 'vitest';
import { parseCheckScript, redactReport, runChecks } from '@shared/checks';
import { REVERSING_CONVEYOR } from '@shared/field';
import { standardLab } from '@shared/labs';
import { MISTAKES } from '../labs/mistakes';

const lab = standardLab('forward-reverse')!;
const auxOnly = MISTAKES.find((m) => m.name.startsWith('interlocked on the auxiliary contacts only'))!.program;
const script = {
  panel: 'reversing-conveyor',
  steps: [
    { press: 'S2' },
    { wait: 100 },
    { expect: { K1: 'closed' }, label: 'S2 starts forward' },
    { prove: { never: { '%QX1': true, '%QX2': true } }, label: 'K1 and K2 are never commanded together', points: 3 },
    { prove: { reachable: { K2: 'closed' } }, hidden: true },
  ],
};

describe('the prove step of a check script', () => {
  it('passes for a program where the property holds for every sequence', () => {
    const result = runChecks({ program: lab.solution, panel: REVERSING_CONVEYOR, script });
    if (!result.ok) throw new Error(result.errors.join('\n'));
    expect(result.report.checks.map((c) => [c.label, c.passed, c.points, c.proof?.verdict])).toEqual([
      ['S2 starts forward', true, 1, undefined],
      ['K1 and K2 are never commanded together', true, 3, 'proved'],
      ['reachable K2 closed', true, 1, 'reached'],
    ]);
    expect(result.report.score).toBe(5);
  });

  it('fails with the counterexample as a check script, which the runner reproduces', () => {
    const result = runChecks({ program: auxOnly, panel: REVERSING_CONVEYOR, script });
    if (!result.ok) throw new Error(result.errors.join('\n'));
    const proof = result.report.checks[1]!;
    expect(proof.passed).toBe(false);
    expect(proof.proof?.verdict).toBe('refuted');
    const replay = runChecks({ program: auxOnly, panel: REVERSING_CONVEYOR, script: proof.proof!.counterexample });
    expect(replay.ok && replay.report.passed).toBe(true);
  });

  it('shows a hidden proof to the student as pass or fail only', () => {
    const result = runChecks({ program: auxOnly, panel: REVERSING_CONVEYOR, script });
    if (!result.ok) throw new Error(result.errors.join('\n'));
    const view = redactReport(result.report);
    expect(JSON.stringify(view)).not.toContain('reachable K2 closed');
    expect(view.checks.at(-1)).toEqual({ passed: true, points: 1, hidden: true });
  });

  it('names the step and the field of a bad property', () => {
    const parsed = parseCheckScript({ steps: [{ prove: { never: {} }, label: 'x' }] });
    expect(parsed.ok).toBe(false);
    if (!parsed.ok) expect(parsed.errors[0]).toMatch(/^step 1: "prove" needs a property such as .*prove\.never: a condition names at least one/);
    const unknown = runChecks({ program: lab.solution, panel: REVERSING_CONVEYOR, script: { steps: [{ prove: { never: { K9: 'closed' } } }] } });
    expect(unknown).toEqual({ ok: false, errors: ['step 1: "K9" is not a device on panel reversing-conveyor; as a tag it is a bit: expect true or false, got "closed"'] });
  });

  it('refuses a property on the motor, whose speed the proof does not model', () => {
    const result = runChecks({ program: lab.solution, panel: REVERSING_CONVEYOR, script: { steps: [{ prove: { never: { M1: 'reverse' } } }] } });
    expect(result).toEqual({ ok: false, errors: ['step 1: "M1" is a motor: its speed is not modelled by the proof; name its contactors instead (e.g. "K1": "closed")'] });
  });

  it('counts as the check a script needs', () => {
    expect(parseCheckScript({ steps: [{ prove: { never: { '%QX1': true, '%QX2': true } } }] }).ok).toBe(true);
  });
});
