/**
 * Counter vectors V8–V9 (IEC 61131-3:2013 6.6.3.5.4, Table 45), the CTUD rules, bistable vector
 * V10 (6.6.3.5.2, Table 43) and the edge detectors (6.6.3.5.3, Table 44), as docs/published-values.md
 * summarises them ([memory], consistent with the clauses). Each runs through a compiled program, not
 * the step functions alone, so the wiring of power-flow and operand inputs is checked too.
 */
import { describe, expect, it } from 'vitest';
import { createRuntime, type Runtime } from '@shared/engine';
import type { Block } from '@shared/ladder/schema';
import { planOf, programBuilder } from '../unit/engine/build';

/** %IX1 → block → %QX1, other inputs on %IX2.. as given. */
function oneBlock(type: Block['type'], inputs: Record<string, string>): Runtime {
  const b = programBuilder();
  return createRuntime(planOf(b.program([b.rung(b.no('%IX1'), b.block(type, 'B1', inputs), b.coil('%QX1'))])));
}

/** Give inputs for one scan; an input not named goes FALSE. */
function step(rt: Runtime, on: number[]): void {
  for (let i = 1; i <= 8; i += 1) rt.setInput(i, on.includes(i));
  rt.scan();
}

/** A rising edge on each named input: one scan on, one scan off. */
function pulse(rt: Runtime, on: number[], held: number[] = []): void {
  step(rt, [...on, ...held]);
  step(rt, held);
}

describe('CTU (IEC 61131-3:2013 6.6.3.5.4, Table 45)', () => {
  it('V8: PV=3: four CU edges count 1, 2, 3 (Q on), 4; R clears; R with a CU edge stays 0', () => {
    const rt = oneBlock('CTU', { PV: '3', R: '%IX2' });
    const counts: Array<[unknown, unknown]> = [];
    for (let n = 0; n < 4; n += 1) {
      pulse(rt, [1]);
      counts.push([rt.read('B1.CV'), rt.read('B1.Q')]);
    }
    expect(counts).toEqual([
      [1, false],
      [2, false],
      [3, true],
      [4, true],
    ]);
    step(rt, [2]);
    expect([rt.read('B1.CV'), rt.read('B1.Q')]).toEqual([0, false]);
    step(rt, [1, 2]);
    expect([rt.read('B1.CV'), rt.read('B1.Q')]).toEqual([0, false]);
  });

  it('counts a CU held on once', () => {
    const rt = oneBlock('CTU', { PV: '3' });
    for (let n = 0; n < 5; n += 1) step(rt, [1]);
    expect(rt.read('B1.CV')).toBe(1);
  });
});

describe('CTD (IEC 61131-3:2013 6.6.3.5.4, Table 45)', () => {
  it('V9: PV=2: LD, then three CD edges: CV 2 (Q off), 1, 0 (Q on), -1', () => {
    const rt = oneBlock('CTD', { PV: '2', LD: '%IX2' });
    step(rt, [2]);
    const seen: Array<[unknown, unknown]> = [[rt.read('B1.CV'), rt.read('B1.Q')]];
    for (let n = 0; n < 3; n += 1) {
      pulse(rt, [1]);
      seen.push([rt.read('B1.CV'), rt.read('B1.Q')]);
    }
    expect(seen).toEqual([
      [2, false],
      [1, false],
      [0, true],
      [-1, true],
    ]);
  });

  it('gives LD priority over a CD edge', () => {
    const rt = oneBlock('CTD', { PV: '2', LD: '%IX2' });
    step(rt, [1, 2]);
    expect(rt.read('B1.CV')).toBe(2);
  });
});

describe('CTUD (IEC 61131-3:2013 6.6.3.5.4, Table 45)', () => {
  const ctud = () => oneBlock('CTUD', { PV: '2', CD: '%IX2', R: '%IX3', LD: '%IX4' });

  it('counts up and down, with QU at CV ≥ PV and QD at CV ≤ 0', () => {
    const rt = ctud();
    step(rt, []);
    expect([rt.read('B1.QU'), rt.read('B1.QD')]).toEqual([false, true]);
    pulse(rt, [1]);
    pulse(rt, [1]);
    expect([rt.read('B1.CV'), rt.read('B1.QU'), rt.read('B1.QD')]).toEqual([2, true, false]);
    pulse(rt, [2]);
    expect([rt.read('B1.CV'), rt.read('B1.QU')]).toEqual([1, false]);
  });

  it('leaves CV as it was when CU and CD rise in the same scan', () => {
    const rt = ctud();
    pulse(rt, [1]);
    pulse(rt, [1, 2]);
    expect(rt.read('B1.CV')).toBe(1);
  });

  it('gives R priority over LD', () => {
    const rt = ctud();
    step(rt, [4]);
    expect(rt.read('B1.CV')).toBe(2);
    step(rt, [3, 4]);
    expect(rt.read('B1.CV')).toBe(0);
  });
});

describe('bistables (IEC 61131-3:2013 6.6.3.5.2, Table 43)', () => {
  it('V10: with S and R both TRUE, SR (set-dominant) gives Q1 TRUE and RS (reset-dominant) FALSE', () => {
    const sr = oneBlock('SR', { R: '%IX2' });
    step(sr, [1, 2]);
    expect(sr.read('B1.Q1')).toBe(true);
    const rs = oneBlock('RS', { R1: '%IX2' });
    step(rs, [1]);
    step(rs, [1, 2]);
    expect(rs.read('B1.Q1')).toBe(false);
  });

  it('both hold their state when S and R are FALSE', () => {
    for (const [type, reset] of [['SR', 'R'], ['RS', 'R1']] as const) {
      const rt = oneBlock(type, { [reset]: '%IX2' });
      step(rt, [1]);
      step(rt, []);
      expect(rt.read('B1.Q1'), type).toBe(true);
      step(rt, [2]);
      expect(rt.read('B1.Q1'), type).toBe(false);
    }
  });
});

describe('edge detection (IEC 61131-3:2013 6.6.3.5.3, Table 44)', () => {
  it('R_TRIG: Q := CLK AND NOT M, for one scan per rising edge', () => {
    const rt = oneBlock('R_TRIG', {});
    const q: unknown[] = [];
    for (const on of [[1], [1], [], [1]]) {
      step(rt, on);
      q.push(rt.read('B1.Q'));
    }
    expect(q).toEqual([true, false, false, true]);
  });

  it('F_TRIG: one scan per falling edge, and none on a first call with CLK FALSE', () => {
    const rt = oneBlock('F_TRIG', {});
    const q: unknown[] = [];
    for (const on of [[], [1], [], []]) {
      step(rt, on);
      q.push(rt.read('B1.Q'));
    }
    expect(q).toEqual([false, false, true, false]);
  });
});
