import { describe, expect, it } from 'vitest';
import { compile, createRuntime, transferMemory, type RuntimeSnapshot } from '@shared/engine';
import { planOf, programBuilder } from './build';

function timedLatch(instanceType: 'TON' | 'TOF' = 'TON', instance = 'T1') {
  const b = programBuilder();
  return b.program([
    b.rung(b.no('%IX1'), b.coil('%MX5', 'set')),
    b.rung(b.no('%MX5'), b.block(instanceType, instance, { PT: 'T#1s' }), b.coil('%QX1')),
    b.rung(b.contact('rising', '%IX2'), b.block('CTU', 'C1', { PV: '3' })),
  ]);
}

describe('snapshot and restore', () => {
  it('gives plain data that survives JSON', () => {
    const rt = createRuntime(planOf(timedLatch()));
    rt.setInput(1, true);
    rt.run(300);
    const snap = rt.snapshot();
    expect(JSON.parse(JSON.stringify(snap))).toEqual(snap);
    expect(snap.instances.map((i) => i.name)).toEqual(['T1', 'C1']);
    expect(snap.timeMs).toBe(300);
  });

  it('puts the state back so the run continues exactly as before', () => {
    const plan = planOf(timedLatch());
    const a = createRuntime(plan);
    a.setInput(1, true);
    a.setInput(2, true);
    a.run(400);
    a.force('%QX3', true);
    const snap: RuntimeSnapshot = JSON.parse(JSON.stringify(a.snapshot()));
    a.run(700);

    const b = createRuntime(plan);
    b.restore(snap);
    expect([b.scanCount, b.timeMs, b.read('T1.ET')]).toEqual([40, 400, 400]);
    expect([...b.forces()]).toEqual([['%QX3', true]]);
    b.run(700);
    expect(b.snapshot()).toEqual(a.snapshot());
  });

  it('refuses something that is not a snapshot', () => {
    const rt = createRuntime(planOf(timedLatch()));
    expect(() => rt.restore({ format: 'other' } as unknown as RuntimeSnapshot)).toThrow(/expected a rungwright.runtime-snapshot/);
  });

  it('skips an instance state of the wrong shape and reports it', () => {
    const rt = createRuntime(planOf(timedLatch()));
    const snap = rt.snapshot();
    snap.instances[0] = { name: 'T1', type: 'TON', state: { Q: 1, ET: 'x' } as never };
    expect(rt.restore(snap)).toEqual({ kept: ['C1'], dropped: ['T1'] });
  });
});

describe('transferMemory', () => {
  it('keeps memory bits, outputs, time and the states of instances that still exist', () => {
    const from = createRuntime(planOf(timedLatch()));
    from.setInput(1, true);
    from.run(500);
    from.setInput(1, false);
    const to = createRuntime(planOf(timedLatch()));
    const report = transferMemory(from, to);
    expect(report).toEqual({ kept: ['T1', 'C1'], dropped: [] });
    expect([to.read('%MX5'), to.read('T1.ET'), to.timeMs]).toEqual([true, 500, 500]);
    to.run(500);
    expect(to.getOutput(1)).toBe(true);
  });

  it('drops the state of an instance whose type changed, and of one that is gone', () => {
    const from = createRuntime(planOf(timedLatch()));
    from.setInput(1, true);
    from.run(500);
    const to = createRuntime(planOf(timedLatch('TOF')));
    expect(transferMemory(from, to)).toEqual({ kept: ['C1'], dropped: ['T1'] });
    expect(to.read('T1.ET')).toBe(0);
    const renamed = createRuntime(planOf(timedLatch('TON', 'T7')));
    expect(transferMemory(from, renamed)).toEqual({ kept: ['C1'], dropped: ['T1'] });
  });

  it('keeps an edge contact from firing again when the program is recompiled', () => {
    const from = createRuntime(planOf(timedLatch()));
    from.setInput(2, true);
    from.run(20);
    expect(from.read('C1.CV')).toBe(1);
    const to = createRuntime(planOf(timedLatch()));
    transferMemory(from, to);
    to.setInput(2, true);
    to.run(20);
    expect(to.read('C1.CV')).toBe(1);
  });

  it('reports bits the new panel has no room for', () => {
    const from = createRuntime(planOf(timedLatch()));
    from.setInput(1, true);
    from.scan();
    const small = compile(timedLatch(), { space: { inputs: 8, outputs: 6, memory: 4 } });
    expect(small.ok).toBe(false);
    const b = programBuilder();
    const other = compile(b.program([b.rung(b.no('%IX1'), b.coil('%MX1'))]), { space: { inputs: 8, outputs: 6, memory: 4 } });
    if (!other.ok) throw new Error('expected to compile');
    expect(transferMemory(from, createRuntime(other.plan)).dropped).toEqual(['%MX5', 'T1', 'C1']);
  });
});
