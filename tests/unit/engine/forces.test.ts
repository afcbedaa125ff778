import { describe, expect, it } from 'vitest';
import { createRuntime, createTrace } from '@shared/engine';
import { planOf, programBuilder } from './build';

function sealIn() {
  const b = programBuilder();
  // %IX1 -> %QX1 ; %QX1 -> %MX1 ; %MX1 -> %QX2
  return planOf(
    b.program(
      [b.rung(b.no('%IX1'), b.coil('%QX1')), b.rung(b.no('%QX1'), b.coil('%MX1')), b.rung(b.no('%MX1'), b.coil('%QX2'))],
      [{ name: 'Start', address: '%IX1', comment: '' }],
    ),
  );
}

describe('forces', () => {
  it('an input force overrides the field value', () => {
    const rt = createRuntime(sealIn());
    expect(rt.force('%IX1', true)).toEqual({ ok: true, value: undefined });
    rt.setInput(1, false);
    rt.scan();
    expect(rt.read('%IX1')).toBe(true);
    expect(rt.getOutput(1)).toBe(true);
    rt.force('Start', false);
    rt.setInput(1, true);
    rt.scan();
    expect(rt.getOutput(1)).toBe(false);
  });

  it('an output force overrides the coil, and later rungs see the forced value', () => {
    const rt = createRuntime(sealIn());
    rt.force('%QX1', true);
    rt.scan();
    expect(rt.getOutput(1)).toBe(true);
    expect(rt.read('%MX1')).toBe(true);
    expect(rt.getOutput(2)).toBe(true);
  });

  it('a memory force overrides the coil that writes it', () => {
    const rt = createRuntime(sealIn());
    rt.setInput(1, true);
    rt.force('%MX1', false);
    rt.scan();
    expect(rt.getOutput(1)).toBe(true);
    expect(rt.read('%MX1')).toBe(false);
    expect(rt.getOutput(2)).toBe(false);
  });

  it('shows an output force in the output image at once', () => {
    const rt = createRuntime(sealIn());
    rt.force('%QX2', true);
    expect(rt.getOutput(2)).toBe(true);
  });

  it('unforcing hands the bit back to the program from the next scan', () => {
    const rt = createRuntime(sealIn());
    rt.force('%QX1', true);
    rt.scan();
    rt.unforce('%QX1');
    rt.scan();
    expect(rt.getOutput(1)).toBe(false);
    expect(rt.forces().size).toBe(0);
  });

  it('lists forces by canonical address and clears them all', () => {
    const rt = createRuntime(sealIn());
    rt.force('start', true);
    rt.force('%qx2', false);
    expect([...rt.forces()]).toEqual([
      ['%IX1', true],
      ['%QX2', false],
    ]);
    rt.clearForces();
    rt.setInput(1, false);
    rt.scan();
    expect(rt.read('%IX1')).toBe(false);
    expect(rt.forces().size).toBe(0);
  });

  it('refuses to force what is not a bit of this panel, saying why', () => {
    const rt = createRuntime(sealIn());
    const member = rt.force('T1.Q', true);
    expect(member.ok).toBe(false);
    const range = rt.force('%MX65', true);
    expect(range).toEqual({ ok: false, error: '%MX65 is out of range: this panel has memory bits %MX1..%MX64' });
    expect(rt.force('Stop', true).ok).toBe(false);
    expect(rt.force('T#2s', true)).toMatchObject({ ok: false, error: expect.stringMatching(/only bits/) });
  });

  it('marks forced signals in the trace', () => {
    const rt = createRuntime(sealIn());
    const trace = createTrace(rt, ['%IX1', '%QX1']);
    rt.scan();
    trace.record();
    rt.force('%IX1', true);
    rt.scan();
    trace.record();
    expect(trace.rows().map((row) => row.forced)).toEqual([
      [false, false],
      [true, false],
    ]);
    expect(trace.rows()[1]!.values).toEqual([true, true]);
    expect(trace.toCSV()).toBe('time_ms,scan,%IX1,%QX1\n10,1,0,0\n20,2,1,1\n');
  });
});
