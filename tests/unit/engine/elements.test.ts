import { describe, expect, it } from 'vitest';
import { createRuntime } from '@shared/engine';
import { planOf, programBuilder } from './build';

describe('contacts', () => {
  it('NO passes when its bit is on; NC when it is off', () => {
    const b = programBuilder();
    const rt = createRuntime(planOf(b.program([b.rung(b.no('%IX1'), b.coil('%QX1')), b.rung(b.nc('%IX1'), b.coil('%QX2'))])));
    rt.scan();
    expect([rt.getOutput(1), rt.getOutput(2)]).toEqual([false, true]);
    rt.setInput(1, true);
    rt.scan();
    expect([rt.getOutput(1), rt.getOutput(2)]).toEqual([true, false]);
  });

  it('a rising-edge contact passes for the one scan after its bit went on', () => {
    const b = programBuilder();
    const rt = createRuntime(planOf(b.program([b.rung(b.contact('rising', '%IX1'), b.coil('%QX1'))])));
    const seen: boolean[] = [];
    for (const v of [false, true, true, false, true]) {
      rt.setInput(1, v);
      rt.scan();
      seen.push(rt.getOutput(1));
    }
    expect(seen).toEqual([false, true, false, false, true]);
  });

  it('a falling-edge contact passes for the one scan after its bit went off', () => {
    const b = programBuilder();
    const rt = createRuntime(planOf(b.program([b.rung(b.contact('falling', '%IX1'), b.coil('%QX1'))])));
    const seen: boolean[] = [];
    for (const v of [false, true, false, false]) {
      rt.setInput(1, v);
      rt.scan();
      seen.push(rt.getOutput(1));
    }
    expect(seen).toEqual([false, false, true, false]);
  });

  it('gives each edge contact its own memory, even on the same bit', () => {
    const b = programBuilder();
    // The second rung examines %IX1 only every other scan's worth of power, but its memory follows %IX1 each scan.
    const rt = createRuntime(
      planOf(
        b.program([
          b.rung(b.contact('rising', '%IX1'), b.coil('%QX1')),
          b.rung(b.no('%IX2'), b.contact('rising', '%IX1'), b.coil('%QX2')),
        ]),
      ),
    );
    rt.setInput(1, true);
    rt.scan();
    expect([rt.getOutput(1), rt.getOutput(2)]).toEqual([true, false]);
    rt.setInput(2, true);
    rt.scan();
    // The edge was in the previous scan for both contacts: neither passes now.
    expect([rt.getOutput(1), rt.getOutput(2)]).toEqual([false, false]);
  });

  it('examines block outputs and tags as well as addresses', () => {
    const b = programBuilder();
    const rt = createRuntime(
      planOf(
        b.program(
          [
            b.rung(b.no('Start'), b.block('TON', 'T1', { PT: 'T#20ms' })),
            b.rung(b.no('T1.Q'), b.coil('Lamp')),
            b.rung(b.contact('no', 'TRUE'), b.coil('%MX1')),
          ],
          [
            { name: 'Start', address: '%IX3', comment: '' },
            { name: 'Lamp', address: '%QX4', comment: '' },
          ],
        ),
      ),
    );
    rt.setInput(3, true);
    rt.run(10);
    expect(rt.getOutput(4)).toBe(false);
    rt.run(10);
    expect(rt.getOutput(4)).toBe(true);
    expect(rt.read('%MX1')).toBe(true);
  });
});

describe('coils', () => {
  it('a coil writes its power and a negated coil the inverse', () => {
    const b = programBuilder();
    const rt = createRuntime(planOf(b.program([b.rung(b.no('%IX1'), b.parallel(b.coil('%QX1'), b.coil('%QX2', 'negated')))])));
    rt.scan();
    expect([rt.getOutput(1), rt.getOutput(2)]).toEqual([false, true]);
    rt.setInput(1, true);
    rt.scan();
    expect([rt.getOutput(1), rt.getOutput(2)]).toEqual([true, false]);
  });

  it('set and reset coils latch: the bit keeps its value when their power goes', () => {
    const b = programBuilder();
    const rt = createRuntime(
      planOf(b.program([b.rung(b.no('%IX1'), b.coil('%MX3', 'set')), b.rung(b.no('%IX2'), b.coil('%MX3', 'reset'))])),
    );
    const states: boolean[] = [];
    for (const [set, reset] of [[false, false], [true, false], [false, false], [false, true], [false, false], [true, true]]) {
      rt.setInput(1, set!);
      rt.setInput(2, reset!);
      rt.scan();
      states.push(rt.read('%MX3') as boolean);
    }
    // Last pair: set then reset in rung order, so reset (the later rung) wins.
    expect(states).toEqual([false, true, true, false, false, false]);
  });

  it('passes power through to coils in series after it', () => {
    const b = programBuilder();
    const rt = createRuntime(planOf(b.program([b.rung(b.no('%IX1'), b.coil('%QX1'), b.coil('%QX2'))])));
    rt.setInput(1, true);
    rt.scan();
    expect([rt.getOutput(1), rt.getOutput(2)]).toEqual([true, true]);
  });
});

describe('branches', () => {
  it('series is AND and parallel is OR, nested', () => {
    const b = programBuilder();
    // %IX1 AND (%IX2 OR (%IX3 AND NOT %IX4)) -> %QX1
    const rt = createRuntime(
      planOf(b.program([b.rung(b.no('%IX1'), b.parallel(b.no('%IX2'), b.series(b.no('%IX3'), b.nc('%IX4'))), b.coil('%QX1'))])),
    );
    const cases: Array<[boolean[], boolean]> = [
      [[false, true, true, false], false],
      [[true, false, false, false], false],
      [[true, true, false, false], true],
      [[true, false, true, false], true],
      [[true, false, true, true], false],
    ];
    for (const [inputs, expected] of cases) {
      rt.setInputs(inputs);
      rt.scan();
      expect(rt.getOutput(1), inputs.join()).toBe(expected);
    }
  });
});

describe('blocks in rungs', () => {
  it('take their power-flow input from the rung and pass their output on', () => {
    const b = programBuilder();
    const rt = createRuntime(planOf(b.program([b.rung(b.no('%IX1'), b.block('CTU', 'C1', { PV: '2', R: '%IX2' }), b.coil('%QX1'))])));
    for (const v of [true, false, true]) {
      rt.setInput(1, v);
      rt.scan();
    }
    expect(rt.read('C1.CV')).toBe(2);
    expect(rt.getOutput(1)).toBe(true);
    rt.setInput(2, true);
    rt.scan();
    expect(rt.read('C1.CV')).toBe(0);
    expect(rt.getOutput(1)).toBe(false);
  });

  it('read presets from other blocks and from TRUE/FALSE constants', () => {
    const b = programBuilder();
    const rt = createRuntime(
      planOf(
        b.program([
          b.rung(b.no('%IX1'), b.block('CTU', 'C1', { PV: '99', R: 'FALSE' })),
          // C2 counts the same edges; its preset follows C1's count, so C2.Q stays on.
          b.rung(b.no('%IX1'), b.block('CTU', 'C2', { PV: 'C1.CV', R: 'FALSE' }), b.coil('%QX1')),
        ]),
      ),
    );
    for (const v of [true, false, true]) {
      rt.setInput(1, v);
      rt.scan();
    }
    expect(rt.read('C2.CV')).toBe(2);
    expect(rt.getOutput(1)).toBe(true);
  });

  it('a CTUD counts down from an operand input CD', () => {
    const b = programBuilder();
    const rt = createRuntime(planOf(b.program([b.rung(b.no('%IX1'), b.block('CTUD', 'C1', { PV: '5', CD: '%IX2', LD: '%IX3' }), b.coil('%QX1'))])));
    rt.setInput(3, true);
    rt.scan();
    rt.setInput(3, false);
    rt.setInput(2, true);
    rt.scan();
    expect(rt.read('C1.CV')).toBe(4);
    expect(rt.read('C1.QU')).toBe(false);
    expect(rt.read('C1.QD')).toBe(false);
  });

  it('an instance called from two rungs is charged the scan period once per scan', () => {
    const b = programBuilder();
    const rt = createRuntime(
      planOf(
        b.program([
          b.rung(b.no('%IX1'), b.block('TON', 'T1', { PT: 'T#1s' })),
          b.rung(b.no('%IX1'), b.block('TON', 'T1', { PT: 'T#1s' })),
        ]),
      ),
    );
    rt.setInput(1, true);
    rt.run(100);
    expect(rt.read('T1.ET')).toBe(100);
  });
});
