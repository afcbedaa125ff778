/**
 * Power loss and warm restart of the controller, and retained variables, against IEC 61131-3:
 * a variable declared RETAIN keeps its value through a power failure and a warm restart; every
 * other variable takes its initial value (IEC 61131-3:2013, 6.5.6 retentive variables and the
 * restart rules [memory for the clause number]; docs/published-values.md). The first scan after
 * the restart reads the inputs as they are, so edge memories start from their initial values
 * (common practice).
 *
 * The trade's consequence (common practice; docs/published-values.md, "Control circuits taught"):
 * a three-wire circuit stays off after power returns, until start is pressed again. A seal-in
 * held on a retained bit does not: the motor restarts by itself.
 */
import { describe, expect, it } from 'vitest';
import { runChecks, type GradeReport } from '@shared/checks';
import { compile, createRuntime } from '@shared/engine';
import { REVERSING_CONVEYOR } from '@shared/field';
import { block, buildProgram, coil, no, par, rising, rung, tag } from '@shared/labs/build';
import { conveyorTags } from '@shared/labs/conveyorTags';
import { THREE_WIRE } from '@shared/labs';
import type { Program } from '@shared/ladder/schema';

/** Three-wire control sealed in on a memory bit `Run` (%MX1), retained or not; K1 follows `Run`. */
function sealedOnMemory(retain: boolean): Program {
  const tags = [...conveyorTags(), { ...tag('Run', '%MX1', 'the belt should run'), ...(retain && { retain: true }) }];
  return buildProgram('seal-in on a memory bit', '', tags, [rung('seal-in on Run', no('Stop_PB'), par(no('Fwd_PB'), no('Run')), coil('Run')), rung('K1 follows Run', no('Run'), coil('K1_Coil'))]);
}

const POWER_CYCLE = [
  { press: 'S2' }, { wait: 100 }, { release: 'S2' }, { wait: 700 },
  { expect: { K1: 'closed', M1: 'forward' }, label: 'running before the power loss' },
  { power: 'off' }, { wait: 100 },
  { expect: { '%QX1': false, K1: 'open' }, label: 'without power every output is open and K1 drops' },
  { wait: 1000 },
  { expect: { M1: 'stopped' }, label: 'the field goes on: the motor has coasted to rest' },
  { power: 'on' }, { wait: 1000 },
];

function grade(program: Program, steps: unknown[]): GradeReport {
  const result = runChecks({ program, panel: REVERSING_CONVEYOR, script: { steps: [...POWER_CYCLE, ...steps] } });
  if (!result.ok) throw new Error(result.errors.join('\n'));
  return result.report;
}

describe('IEC 61131-3 RETAIN and warm restart (6.5.6 [memory]) on the panel', () => {
  it('a seal-in on a retained bit restarts the motor after a power loss', () => {
    const r = grade(sealedOnMemory(true), [{ expect: { Run: true, K1: 'closed', M1: 'forward' }, label: 'restarted by itself' }]);
    expect(r.checks.map((c) => c.passed)).toEqual([true, true, true, true]);
  });
  it('a seal-in on a plain bit does not: the bit starts at its initial value, FALSE', () => {
    const r = grade(sealedOnMemory(false), [{ expect: { Run: false, K1: 'open', M1: 'stopped' }, label: 'stays stopped' }]);
    expect(r.checks.map((c) => c.passed)).toEqual([true, true, true, true]);
  });
  it('the three-wire lab\'s solution (seal-in on K1\'s auxiliary contact) stays stopped and starts again with S2', () => {
    const r = grade(THREE_WIRE.solution, [
      { expect: { K1: 'open', M1: 'stopped' }, label: 'stays stopped after power returns' },
      { press: 'S2' }, { wait: 100 }, { release: 'S2' }, { wait: 700 },
      { expect: { K1: 'closed' }, label: 'starts with S2' },
    ]);
    expect(r.passed).toBe(true);
  });
  it('the three-wire lab has a hidden check that fails a seal-in on a retained bit and passes the reference', () => {
    const hidden = (program: Program) => {
      const result = runChecks({ program, panel: REVERSING_CONVEYOR, script: THREE_WIRE.script });
      if (!result.ok) throw new Error(result.errors.join('\n'));
      return result.report.checks.find((c) => c.label === 'after a power loss of the controller the belt stays stopped')!;
    };
    expect(hidden(THREE_WIRE.solution)).toMatchObject({ passed: true, hidden: true });
    expect(hidden(sealedOnMemory(true))).toMatchObject({ passed: false, actual: { K1: 'closed', M1: 'forward', '%QX1': true } });
    expect(hidden(sealedOnMemory(false)).passed).toBe(true);
  });
});

describe('IEC 61131-3 warm restart in the engine', () => {
  const runtimeOf = (program: Program) => {
    const compiled = compile(program, { space: { inputs: 8, outputs: 6, memory: 64 } });
    if (!compiled.ok) throw new Error(compiled.diagnostics.map((d) => d.message).join('\n'));
    return createRuntime(compiled.plan, { scanMs: 10 });
  };
  it('without power no scan runs and the outputs are open; time still passes', () => {
    const rt = runtimeOf(sealedOnMemory(false));
    rt.setInput(1, true);
    rt.setInput(2, true);
    rt.scan();
    expect(rt.getOutput(1)).toBe(true);
    rt.powerOff();
    rt.setInput(1, false);
    rt.run(100);
    expect(rt.powered).toBe(false);
    expect(rt.getOutput(1)).toBe(false);
    expect(rt.timeMs).toBe(110);
    // The program did not run: the stop input falling changed nothing inside.
    expect(rt.read('%MX1')).toBe(true);
  });
  it('retained bits keep their value, every other bit, edge memory and block restarts from its initial value', () => {
    const tags = [tag('Kept', '%MX1'), tag('Lost', '%MX2'), tag('Edge_Seen', '%MX3')].map((t, i) => (i === 0 ? { ...t, retain: true } : t));
    tags.push(tag('Start', '%IX2'));
    const rt = runtimeOf(
      buildProgram('retain', '', tags, [
        rung('Start seals Kept in', par(no('Start'), no('Kept')), coil('Kept')),
        rung('Start seals Lost in', par(no('Start'), no('Lost')), coil('Lost')),
        rung('rising edge of Start latches Edge_Seen', par(rising('Start'), no('Edge_Seen')), coil('Edge_Seen')),
        rung('C1 counts Start', no('Start'), block('CTU', 'C1', { PV: '5' }), coil('%MX4')),
      ]),
    );
    rt.setInput(2, true);
    rt.scan();
    rt.setInput(2, false);
    rt.scan();
    expect([rt.read('Kept'), rt.read('Lost'), rt.read('Edge_Seen'), rt.read('C1.CV')]).toEqual([true, true, true, 1]);
    rt.powerOff();
    rt.run(50);
    rt.setInput(2, true);
    rt.powerOn();
    expect([rt.read('Kept'), rt.read('Lost'), rt.read('Edge_Seen'), rt.read('C1.CV')]).toEqual([true, false, false, 0]);
    // First scan with the input as it is: Start already TRUE and its edge memory at its initial
    // FALSE give a rising edge (common practice).
    rt.scan();
    expect(rt.read('Edge_Seen')).toBe(true);
  });
});
