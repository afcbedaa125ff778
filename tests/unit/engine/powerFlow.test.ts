import { describe, expect, it } from 'vitest';
import { compile, createRuntime } from '@shared/engine';
import { BENCH_SPACE, benchProgram } from '../../perf/engine-programs';
import { planOf, programBuilder } from './build';

function program() {
  const b = programBuilder();
  const start = b.no('%IX2');
  const seal = b.no('%QX1');
  const stop = b.no('%IX1');
  const coil = b.coil('%QX1');
  const branch = b.parallel(start, seal);
  const rung = b.rung(branch, stop, coil);
  return { program: b.program([rung]), ids: { start: start.id, seal: seal.id, stop: stop.id, coil: coil.id, branch: branch.id, rung: rung.id } };
}

describe('power flow', () => {
  it('shows, per element of the last scan, power on its left and right', () => {
    const { program: p, ids } = program();
    const rt = createRuntime(planOf(p), { recordPowerFlow: true });
    rt.setInput(1, true);
    rt.setInput(2, true);
    rt.scan();
    const flow = rt.powerFlow();
    expect(flow.recorded).toBe(true);
    expect(flow.scanCount).toBe(1);
    expect(flow.get(ids.start)).toEqual({ left: true, right: true });
    // The seal-in contact examined %QX1 before the coil wrote it in this scan.
    expect(flow.get(ids.seal)).toEqual({ left: true, right: false });
    expect(flow.get(ids.branch)).toEqual({ left: true, right: true });
    expect(flow.get(ids.coil)).toEqual({ left: true, right: true });
    expect(flow.get(ids.rung)).toEqual({ left: true, right: true });
    expect(flow.get('no-such-id')).toBeUndefined();
  });

  it('agrees with what the scan wrote when the stop opens', () => {
    const { program: p, ids } = program();
    const rt = createRuntime(planOf(p), { recordPowerFlow: true });
    rt.setInputs([true, true]);
    rt.scan();
    rt.setInputs([false, false]);
    rt.scan();
    const flow = rt.powerFlow();
    expect(flow.get(ids.seal)).toEqual({ left: true, right: true });
    expect(flow.get(ids.stop)).toEqual({ left: true, right: false });
    expect(flow.get(ids.coil)!.left).toBe(rt.getOutput(1));
  });

  it('starts recording at the first request when not asked for up front', () => {
    const { program: p, ids } = program();
    const rt = createRuntime(planOf(p));
    rt.setInputs([true, true]);
    rt.scan();
    const first = rt.powerFlow();
    expect(first.recorded).toBe(false);
    expect(first.get(ids.start)).toEqual({ left: false, right: false });
    rt.scan();
    expect(rt.powerFlow().recorded).toBe(true);
    expect(rt.powerFlow().get(ids.start)).toEqual({ left: true, right: true });
  });

  it('returns the same view until the next scan', () => {
    const { program: p } = program();
    const rt = createRuntime(planOf(p), { recordPowerFlow: true });
    rt.scan();
    expect(rt.powerFlow()).toBe(rt.powerFlow());
    rt.scan();
    expect(rt.powerFlow().scanCount).toBe(2);
  });

  it('is not recorded for the scan before a restore', () => {
    const { program: p } = program();
    const rt = createRuntime(planOf(p), { recordPowerFlow: true });
    rt.scan();
    rt.restore(rt.snapshot());
    expect(rt.powerFlow().recorded).toBe(false);
  });
});

describe('the recording kernel', () => {
  it('agrees with what each plain coil of a large generated program wrote', () => {
    const generated = benchProgram('series', 300, 7);
    const compiled = compile(generated.program, { space: BENCH_SPACE });
    if (!compiled.ok) throw new Error(compiled.diagnostics[0]!.message);
    const rt = createRuntime(compiled.plan, { recordPowerFlow: true });
    // Each rung writes its own %MX bit (BENCH_SPACE gives room), so the bit holds what its coil wrote.
    const coils = generated.program.rungs.flatMap((rung) =>
      rung.network.items.filter((item) => item.kind === 'coil' && item.operand.startsWith('%MX') && (item.variant === 'coil' || item.variant === 'negated')),
    );
    expect(coils.length).toBeGreaterThan(200);
    for (let k = 0; k < 40; k += 1) {
      for (let i = 1; i <= BENCH_SPACE.inputs; i += 1) rt.setInput(i, ((k * 7 + i * 3) % 5) < 2);
      rt.scan();
      const flow = rt.powerFlow();
      for (const coil of coils) {
        if (coil.kind !== 'coil') continue;
        const written = rt.read(coil.operand) as boolean;
        expect(flow.get(coil.id)!.left, `${coil.operand} at scan ${k + 1}`).toBe(coil.variant === 'coil' ? written : !written);
      }
    }
  });
});
