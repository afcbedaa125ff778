/**
 * The demo programs teach the seal-in the three-wire lab teaches: on the contactor's auxiliary
 * contact, so an overload trip breaks the seal and resetting F1 does not restart the belt by itself
 * (a reset must not restart a machine: common practice, the lab's brief). Each demo runs the same
 * check script through the shared runner; the seal-in on the output bit, the pattern the lab calls
 * wrong, is run too and shown to fail the script, so the script can tell the two apart.
 */
import { describe, expect, it } from 'vitest';
import { runChecks, type CheckScriptInput } from '@shared/checks';
import { builtInPanel } from '@shared/field';
import { buildProgram, coil, no, par, rung } from '@shared/labs/build';
import { conveyorTags } from '@shared/labs/conveyorTags';
import type { NetworkNode, Program } from '@shared/ladder/schema';
import { MISSING_INTERLOCK_DEMO, REVERSING_DEMO, THREE_WIRE_DEMO } from '../../../server/db/demoPrograms';
import { largeProgram, threeWireProgram } from '@/simulation/demoPrograms';

const panel = builtInPanel('reversing-conveyor')!;

/** Start forward at RUN, trip F1, reset it, and expect the belt to stay stopped; S2 then starts it again. */
const TRIP_AND_RESET: CheckScriptInput = {
  panel: 'reversing-conveyor',
  scanMs: 10,
  steps: [
    { set: 'S4', to: 'RUN' },
    { press: 'S2' }, { wait: 100 }, { release: 'S2' }, { wait: 300 },
    { expect: { K1: 'closed', M1: 'forward' }, label: 'S2 starts the belt and it stays sealed in' },
    { trip: 'F1' }, { wait: 100 },
    { expect: { K1: 'open', '%IX7': false }, label: 'the trip drops K1 and its auxiliary contact opens' },
    { reset: 'F1' }, { wait: 1000 },
    { expect: { F1: 'ok', K1: 'open', '%QX1': false, M1: 'stopped' }, label: 'resetting F1 does not restart the belt' },
    { press: 'S2' }, { wait: 100 }, { release: 'S2' }, { wait: 300 },
    { expect: { K1: 'closed', M1: 'forward' }, label: 'S2 starts it again after the reset' },
  ],
};

function failedChecks(program: Program): string[] {
  const result = runChecks({ program, panel, script: TRIP_AND_RESET });
  if (!result.ok) throw new Error(result.errors.join('; '));
  return result.report.checks.filter((c) => !c.passed).map((c) => c.label);
}

describe('the demo programs after an overload trip', () => {
  const demos: [string, Program][] = [
    ['the seeded three-wire start/stop', THREE_WIRE_DEMO],
    ['the seeded forward/reverse', REVERSING_DEMO],
    ['the seeded forward/reverse without interlocks', MISSING_INTERLOCK_DEMO],
    ['the simulator\'s three-wire reversing', threeWireProgram()],
    ['the simulator\'s large generated program', largeProgram(40)],
  ];
  for (const [name, program] of demos) {
    it(`${name}: resetting F1 after a trip does not restart the motor`, () => {
      expect(failedChecks(program)).toEqual([]);
    });
  }

  it('the seal-in on the output bit %QX1 restarts the motor when F1 is reset, and the script catches it', () => {
    const onOutput = buildProgram('Sealed in on %QX1', '', conveyorTags(), [rung('', no('Stop_PB'), par(no('Fwd_PB'), no('K1_Coil')), coil('K1_Coil'))]);
    expect(failedChecks(onOutput)).toEqual(['resetting F1 does not restart the belt']);
  });

  it('no demo seals in on an output bit: no NO contact in a rung examines that rung\'s own coil', () => {
    const sealsOnOwnCoil = (program: Program) =>
      program.rungs.flatMap((r) => {
        const nodes: NetworkNode[] = [];
        const walk = (node: NetworkNode): void => {
          nodes.push(node);
          if (node.kind === 'series') node.items.forEach(walk);
          if (node.kind === 'parallel') node.branches.forEach(walk);
        };
        walk(r.network);
        const coils = new Set(nodes.flatMap((n) => (n.kind === 'coil' ? [n.operand] : [])));
        return nodes.flatMap((n) => (n.kind === 'contact' && n.variant === 'no' && coils.has(n.operand) ? [`${r.id}: ${n.operand}`] : []));
      });
    const onOutput = buildProgram('Sealed in on %QX1', '', conveyorTags(), [rung('', no('Stop_PB'), par(no('Fwd_PB'), no('K1_Coil')), coil('K1_Coil'))]);
    expect(sealsOnOwnCoil(onOutput)).toEqual(['r1: K1_Coil']);
    for (const program of [THREE_WIRE_DEMO, REVERSING_DEMO, MISSING_INTERLOCK_DEMO, threeWireProgram()]) expect(sealsOnOwnCoil(program), program.title).toEqual([]);
  });
});
