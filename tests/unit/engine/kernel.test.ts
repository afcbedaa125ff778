import { describe, expect, it } from 'vitest';
import fc from 'fast-check';
import { compile, createRuntime, createTrace, type Plan, type Runtime } from '@shared/engine';
import { BENCH_SPACE, benchProgram } from '../../perf/engine-programs';
import { demoCases } from '../../perf/engine-demo';
import { planOf, programBuilder } from './build';
import { compareRuns } from './oracle/compare';
import { randomProgram } from './oracle/randomProgram';

function everyBlockProgram() {
  const b = programBuilder();
  return b.program([
    b.rung(b.no('%IX1'), b.block('SR', 'B1', { R: '%IX2' }), b.coil('%QX1')),
    b.rung(b.no('%IX2'), b.block('RS', 'B2', { R1: '%IX3' }), b.coil('%QX2')),
    b.rung(b.no('%IX3'), b.block('R_TRIG', 'E1'), b.coil('%MX1')),
    b.rung(b.no('%IX4'), b.block('F_TRIG', 'E2'), b.coil('%MX2')),
    b.rung(b.no('%IX5'), b.block('CTUD', 'C1', { CD: '%IX6', R: '%IX7', LD: '%IX8', PV: '3' }), b.coil('%QX3')),
    b.rung(b.no('C1.QD'), b.block('TOF', 'T1', { PT: 'T#40ms' }), b.coil('%QX4')),
    b.rung(b.no('%MX1'), b.block('TP', 'T2', { PT: 'T#30ms' }), b.coil('%QX5')),
    b.rung(b.parallel(b.no('T2.Q'), b.contact('falling', '%IX8')), b.block('TON', 'T3', { PT: 'T#20ms' }), b.coil('%QX6', 'negated')),
    b.rung(b.no('%IX3'), b.block('CTD', 'C2', { LD: '%IX4', PV: 'C1.CV' }), b.parallel(b.coil('%MX3', 'set'), b.series(b.nc('%IX5'), b.coil('%MX3', 'reset')))),
    // A timer whose preset is its own elapsed time, and a counter loading its own value: inputs are read before the call.
    b.rung(b.no('%IX6'), b.block('TON', 'T4', { PT: 'T4.ET' }), b.coil('%MX4')),
    b.rung(b.no('%IX7'), b.block('CTU', 'C3', { R: 'C3.Q', PV: 'C3.CV' }), b.coil('%MX5')),
  ]);
}

function generatedPlan(shape: 'series' | 'parallel', rungs: number, seed: number): Plan {
  const result = compile(benchProgram(shape, rungs, seed).program, { space: BENCH_SPACE });
  if (!result.ok) throw new Error(result.diagnostics[0]!.message);
  return result.plan;
}

describe('the WebAssembly kernel against the reference interpreter', () => {
  const cases: Array<[string, () => Plan]> = [
    ...demoCases().map((d): [string, () => Plan] => [`the ${d.name} demo`, () => planOf(d.program)]),
    ['a program with every block type', () => planOf(everyBlockProgram())],
    ...[1, 2, 3].flatMap((seed) =>
      (['series', 'parallel'] as const).map((shape): [string, () => Plan] => [`generated ${shape} program ${seed}`, () => generatedPlan(shape, 150, seed)]),
    ),
  ];

  for (const [name, plan] of cases) {
    it(`gives the same state and power flow after every scan on ${name}`, () => {
      expect(compareRuns(plan(), 600, 99)).toBeNull();
    });
  }

  it('gives the same state and power flow on random programs of every element kind', () => {
    fc.assert(
      fc.property(randomProgram, fc.integer({ min: 1, max: 1000 }), (program, seed) => {
        const compiled = compile(program);
        if (!compiled.ok) throw new Error(compiled.diagnostics.map((d) => d.message).join('; '));
        expect(compareRuns(compiled.plan, 120, seed)).toBeNull();
      }),
      { numRuns: 300, seed: 61131 },
    );
  }, 120_000);
});

/** Every output, the first memory bits and every block member, as a trace. */
function scriptedTrace(rt: Runtime, scans: number): string {
  const members = rt.plan.instances.flatMap((i) => (i.type.startsWith('T') ? [`${i.name}.Q`, `${i.name}.ET`] : i.type.startsWith('C') ? [`${i.name}.CV`] : []));
  const trace = createTrace(rt, [...Array.from({ length: 6 }, (_, i) => `%QX${i + 1}`), ...members]);
  for (let k = 0; k < scans; k += 1) {
    for (let i = 1; i <= 8; i += 1) rt.setInput(i, ((k * 7 + i * 13) % 11) < 4);
    rt.scan();
    trace.record();
  }
  return trace.toCSV();
}

describe('a run', () => {
  it('is the same byte for byte when repeated', () => {
    const plan = planOf(everyBlockProgram());
    const a = scriptedTrace(createRuntime(plan), 800);
    expect(a.split('\n').length).toBe(802);
    expect(a).toBe(scriptedTrace(createRuntime(plan), 800));
  });

  it('continues exactly from a saved state', () => {
    const plan = planOf(everyBlockProgram());
    const rt = createRuntime(plan);
    scriptedTrace(rt, 250);
    rt.force('%MX2', true);
    const saved = rt.saveState();
    const after = scriptedTrace(rt, 300);
    const snapshot = JSON.stringify(rt.snapshot());
    rt.clearForces();
    scriptedTrace(rt, 50);
    rt.loadState(saved);
    expect([rt.scanCount, rt.timeMs, [...rt.forces()]]).toEqual([250, 2500, [['%MX2', true]]]);
    expect(scriptedTrace(rt, 300)).toBe(after);
    expect(JSON.stringify(rt.snapshot())).toBe(snapshot);
  });

  it('saves into a state it is given, without allocating another', () => {
    const rt = createRuntime(planOf(everyBlockProgram()));
    const saved = rt.saveState();
    rt.scan();
    expect(rt.saveState(saved)).toBe(saved);
    expect(saved.scanCount).toBe(1);
  });

  it('refuses a state of another plan', () => {
    const rt = createRuntime(planOf(everyBlockProgram()));
    const other = createRuntime(generatedPlan('series', 10, 1));
    expect(() => rt.loadState(other.saveState())).toThrow(/another plan/);
  });
});

describe('where the host refuses to compile WebAssembly', () => {
  it('says so plainly instead of falling back to something else', () => {
    const plan = planOf(everyBlockProgram());
    const wasm = globalThis.WebAssembly;
    const original = wasm.Module;
    try {
      wasm.Module = function refused() {
        throw new wasm.CompileError("WebAssembly.Module(): Refused to compile or instantiate WebAssembly module because 'unsafe-eval' is not an allowed source");
      } as unknown as typeof WebAssembly.Module;
      expect(() => createRuntime(plan)).toThrow(/could not compile its WebAssembly \(a page needs script-src 'wasm-unsafe-eval'\)/);
    } finally {
      wasm.Module = original;
    }
  });
});
