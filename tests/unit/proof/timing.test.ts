/**
 * Properties whose truth depends on a timer, decided to the scan: the warning horn's 3 s
 * (PT T#3s, 10 ms scans) makes "the belt is never commanded before 3 s of warning" true for the
 * reference and false, at 300 ms, for the wrong answer with T#300ms; "the horn stops within W"
 * holds for W = 2990 ms (the horn sounds from the first scan of the request, ET = 10 ms, until
 * ET = 3000 ms) and fails for W = 2980 ms, with a counterexample that spans exactly the window.
 */
import { describe, expect, it } from 'vitest';
import { runChecks, type Step } from '@shared/checks';
import { REVERSING_CONVEYOR } from '@shared/field';
import { standardLab } from '@shared/labs';
import { prove, type Property } from '@shared/proof';
import { MISTAKES } from '../labs/mistakes';

const horn = standardLab('warning-horn')!;
const shortWarning = MISTAKES.find((m) => m.name === 'warning time 300 ms instead of 3 s')!.program;
const NO_EARLY_START: Property = { never: { '%QX1': true, 'T1.ET': { max: 2999 } }, label: 'the belt is never commanded before 3 s of warning' };

const waited = (steps: readonly Step[]): number => steps.reduce((sum, s) => sum + ('wait' in s ? s.wait : 0), 0);
const horns = (within: number): Property => ({ after: { H1: 'sounding' }, within, expect: { H1: 'silent' }, label: `the horn stops within ${within} ms` });

describe('timer-dependent properties', () => {
  it('proves the 3 s warning for the reference and refutes it, at 300 ms, for a 300 ms timer', () => {
    const right = prove({ program: horn.solution, panel: REVERSING_CONVEYOR, properties: [NO_EARLY_START] });
    if (!right.ok) throw new Error(right.errors.join('\n'));
    expect(right.results[0]!.verdict).toBe('proved');
    const wrong = prove({ program: shortWarning, panel: REVERSING_CONVEYOR, properties: [NO_EARLY_START] });
    if (!wrong.ok) throw new Error(wrong.errors.join('\n'));
    const result = wrong.results[0]!;
    expect(result.verdict).toBe('refuted');
    const steps = result.counterexample!.steps;
    // Press S2, then 30 scans of 10 ms: the request is set in the first, T1.Q in the 30th.
    expect(steps[0]).toEqual({ press: 'S2' });
    expect(waited(steps)).toBe(300);
    expect(steps.at(-1)).toMatchObject({ expect: { '%QX1': true, 'T1.ET': { max: 2999 } } });
  });

  it('decides the horn window to the scan: 2990 ms holds, 2980 ms does not', () => {
    const result = prove({ program: horn.solution, panel: REVERSING_CONVEYOR, properties: [horns(2990), horns(2980)] });
    if (!result.ok) throw new Error(result.errors.join('\n'));
    const [holds, fails] = result.results;
    expect(holds!.verdict).toBe('proved');
    expect(fails!.verdict).toBe('refuted');
    const steps = fails!.counterexample!.steps;
    // The horn sounds from the first scan after S2 and is still sounding at every scan of the
    // 2980 ms window (it falls silent 10 ms later).
    expect(steps[0]).toEqual({ press: 'S2' });
    const during = steps.filter((s): s is Extract<Step, { during: number }> => 'during' in s);
    expect(during.reduce((sum, s) => sum + s.during, 0)).toBe(2980);
    const replay = runChecks({ program: horn.solution, panel: REVERSING_CONVEYOR, script: fails!.counterexample });
    expect(replay.ok && replay.report.passed).toBe(true);
  });
});
