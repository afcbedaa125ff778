import { describe, expect, it } from 'vitest';
import { runChecks } from '@shared/checks';
import { REVERSING_CONVEYOR } from '@shared/field';
import { THREE_WIRE } from '@shared/labs';
import { buildProgram, coil, nc, no, par, resetCoil, rung, setCoil, tag } from '@shared/labs/build';
import { conveyorTags } from '@shared/labs/conveyorTags';
import type { Program } from '@shared/ladder/schema';
import { ALIKE_THRESHOLD, compareProgramStructure } from '@shared/ladder/similarity';

/** Every check of the three-wire lab passes: the program is a correct solution, not a straw man. */
function expectCorrect(program: Program): void {
  const result = runChecks({ program, panel: REVERSING_CONVEYOR, script: THREE_WIRE.script });
  if (!result.ok) throw new Error(result.errors.join('\n'));
  expect(result.report.checks.filter((c) => !c.passed).map((c) => c.label)).toEqual([]);
}

/**
 * The reference solution copied with every tag renamed, the rungs' comments rewritten, the seal-in's
 * branches swapped and the lamp rungs in the other order: what a copy that tries to look different
 * would do without changing how it works.
 */
const renamedCopy = buildProgram('My conveyor', 'Done by me.', [
  tag('Halt', '%IX1'),
  tag('Go', '%IX2'),
  tag('Running', '%IX7'),
  tag('Motor_Fwd', '%QX1'),
  tag('Lamp_G', '%QX4'),
  tag('Lamp_R', '%QX5'),
], [
  rung('motor', no('Halt'), par(no('Running'), no('Go')), coil('Motor_Fwd')),
  rung('red', nc('Running'), coil('Lamp_R')),
  rung('green', no('Running'), coil('Lamp_G')),
]);

/**
 * An independent correct solution with another structure: a memory bit set by start and reset by
 * stop or by an overload trip, driving the contactor; no seal-in branch at all.
 */
const latchSolution = buildProgram('Three-wire with a latch', '', [...conveyorTags(), tag('Run_Req', '%MX1')], [
  rung('stop pressed (NC input reads FALSE) ends the run request', nc('Stop_PB'), resetCoil('Run_Req')),
  rung('an overload trip ends it too', no('OL_Tripped'), resetCoil('Run_Req')),
  rung('start sets it while stop is not pressed', no('Fwd_PB'), no('Stop_PB'), setCoil('Run_Req')),
  rung('the request drives K1', no('Run_Req'), coil('K1_Coil')),
  rung('green lamp', no('K1_Aux'), coil('Green_Lamp')),
  rung('red lamp', nc('K1_Aux'), coil('Red_Lamp')),
]);

describe('structural similarity of two programs', () => {
  it('scores a renamed-tag copy of a solution as alike (1.0), and marks every written rung as matched', () => {
    expectCorrect(THREE_WIRE.solution);
    expectCorrect(renamedCopy);
    const result = compareProgramStructure(THREE_WIRE.solution, renamedCopy, THREE_WIRE.starter);
    expect(result.score).toBe(1);
    expect(result.score).toBeGreaterThanOrEqual(ALIKE_THRESHOLD);
    expect(result.matchedA).toEqual([true, true, true]);
    expect(result.matchedB).toEqual([true, true, true]);
  });

  it('does not score two independent correct solutions with different structures as alike', () => {
    expectCorrect(THREE_WIRE.solution);
    expectCorrect(latchSolution);
    const result = compareProgramStructure(THREE_WIRE.solution, latchSolution, THREE_WIRE.starter);
    expect(result.score).toBeLessThan(ALIKE_THRESHOLD);
    // The lamp rungs are the same in both (there is one natural way to write them); the motor rungs are not.
    expect(result.matchedA).toEqual([false, true, true]);
  });

  it('leaves out what the starter explains: the untouched starter against itself scores 0', () => {
    const result = compareProgramStructure(THREE_WIRE.starter, THREE_WIRE.starter, THREE_WIRE.starter);
    expect(result.score).toBe(0);
    expect(result.matchedA).toEqual([false]);
  });

  it('sees a renamed memory bit and a renamed timer instance as the same', () => {
    const a = buildProgram('a', '', [tag('M_A', '%MX3')], [rung('', no('%IX2'), setCoil('M_A')), rung('', no('M_A'), coil('%QX1'))]);
    const b = buildProgram('b', '', [tag('Other', '%MX9')], [rung('', no('%IX2'), setCoil('Other')), rung('', no('Other'), coil('%QX1'))]);
    expect(compareProgramStructure(a, b, null).score).toBe(1);
  });

  it('tells a changed contact variant apart', () => {
    const a = buildProgram('a', '', [], [rung('', no('%IX1'), no('%IX2'), coil('%QX1'))]);
    const b = buildProgram('b', '', [], [rung('', nc('%IX1'), no('%IX2'), coil('%QX1'))]);
    expect(compareProgramStructure(a, b, null).score).toBe(0);
  });
});
