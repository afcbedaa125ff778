import { describe, expect, it } from 'vitest';
import { createRuntime } from '@shared/engine';
import { planOf, programBuilder } from './build';

describe('the scan cycle', () => {
  it('lets later rungs see a coil write in the same scan', () => {
    const b = programBuilder();
    const rt = createRuntime(planOf(b.program([b.rung(b.no('%IX1'), b.coil('%MX1')), b.rung(b.no('%MX1'), b.coil('%QX1'))])));
    rt.setInput(1, true);
    rt.scan();
    expect(rt.getOutput(1)).toBe(true);
  });

  it('lets earlier rungs see it only in the next scan', () => {
    const b = programBuilder();
    const rt = createRuntime(planOf(b.program([b.rung(b.no('%MX1'), b.coil('%QX1')), b.rung(b.no('%IX1'), b.coil('%MX1'))])));
    rt.setInput(1, true);
    rt.scan();
    expect(rt.read('%MX1')).toBe(true);
    expect(rt.getOutput(1)).toBe(false);
    rt.scan();
    expect(rt.getOutput(1)).toBe(true);
  });

  it('reads the field inputs once, at the start of the scan', () => {
    const b = programBuilder();
    const rt = createRuntime(planOf(b.program([b.rung(b.no('%IX1'), b.coil('%QX1'))])));
    rt.setInput(1, true);
    expect(rt.read('%IX1')).toBe(false);
    rt.scan();
    expect(rt.read('%IX1')).toBe(true);
  });

  it('advances virtual time by the scan period and counts scans', () => {
    const b = programBuilder();
    const rt = createRuntime(planOf(b.program([b.rung(b.no('%IX1'), b.coil('%QX1'))])), { scanMs: 25 });
    rt.scan();
    rt.scan();
    expect([rt.scanCount, rt.timeMs]).toEqual([2, 50]);
  });

  it('runs whole scans covering the time asked for', () => {
    const b = programBuilder();
    const rt = createRuntime(planOf(b.program([b.rung(b.no('%IX1'), b.coil('%QX1'))])), { scanMs: 10 });
    rt.run(95);
    expect(rt.scanCount).toBe(10);
    rt.run(0);
    expect(rt.scanCount).toBe(10);
    expect(() => rt.run(Number.NaN)).toThrow(/run: the time must be a number/);
  });

  it('refuses a scan period outside 1..1000 ms with a clear message', () => {
    const b = programBuilder();
    const plan = planOf(b.program([b.rung(b.no('%IX1'), b.coil('%QX1'))]));
    expect(() => createRuntime(plan, { scanMs: 0 })).toThrow(/from 1 to 1000/);
    expect(() => createRuntime(plan, { scanMs: 2.5 })).toThrow(/whole number/);
    expect(createRuntime(plan).scanMs).toBe(10);
  });

  it('names the address when an input or output index does not exist', () => {
    const b = programBuilder();
    const rt = createRuntime(planOf(b.program([b.rung(b.no('%IX1'), b.coil('%QX1'))])));
    expect(() => rt.setInput(9, true)).toThrow('setInput: %IX9 does not exist; this panel has %IX1..%IX8');
    expect(() => rt.getOutput(0)).toThrow(/%QX0 does not exist/);
  });

  it('reads addresses, tags and members, and undefined for what names nothing', () => {
    const b = programBuilder();
    const rt = createRuntime(
      planOf(b.program([b.rung(b.no('Go'), b.block('TP', 'P1', { PT: 'T#1s' }), b.coil('%QX1'))], [{ name: 'Go', address: '%IX2', comment: '' }])),
    );
    rt.setInput(2, true);
    rt.run(30);
    expect(rt.read('go')).toBe(true);
    expect(rt.read('%ix2')).toBe(true);
    expect(rt.read('P1.ET')).toBe(30);
    expect(rt.read('p1.q')).toBe(true);
    expect(rt.read('P9.Q')).toBeUndefined();
    expect(rt.read('Nope')).toBeUndefined();
    expect(rt.read('%IX99')).toBeUndefined();
  });
});
