import { describe, expect, it } from 'vitest';
import { compile, createRuntime, createTrace, kernelSource, type Plan, type Runtime } from '@shared/engine';
import { GENERATED_SPACE, generateCase } from '../../perf/engine-generated';
import { demoProgram } from '../../perf/engine-demo';
import { planOf, programBuilder } from './build';

/** Every output and the first memory bits, plus every block member. */
function signalsOf(plan: Plan): string[] {
  const bits = [
    ...Array.from({ length: plan.space.outputs }, (_, i) => `%QX${i + 1}`),
    ...Array.from({ length: Math.min(plan.space.memory, 64) }, (_, i) => `%MX${i + 1}`),
  ];
  const members = plan.instances.flatMap((instance) =>
    instance.type.startsWith('T') ? [`${instance.name}.Q`, `${instance.name}.ET`] : instance.type.startsWith('C') ? [`${instance.name}.CV`] : [`${instance.name}.${instance.type === 'SR' || instance.type === 'RS' ? 'Q1' : 'Q'}`],
  );
  return [...bits, ...members];
}

/** A seeded run: inputs change every few scans, with a force and an unforce on the way. */
function scriptedRun(rt: Runtime, scans: number, seed: number): string {
  const trace = createTrace(rt, signalsOf(rt.plan));
  let a = seed >>> 0;
  const next = (): number => {
    a = (Math.imul(a, 1664525) + 1013904223) >>> 0;
    return a / 4294967296;
  };
  const inputs = rt.plan.space.inputs;
  for (let k = 0; k < scans; k += 1) {
    if (k % 3 === 0) for (let i = 1; i <= inputs; i += 1) if (next() < 0.3) rt.setInput(i, next() < 0.5);
    if (k === Math.floor(scans / 3)) rt.force('%QX2', true);
    if (k === Math.floor(scans / 2)) rt.force('%IX1', false);
    if (k === Math.floor((2 * scans) / 3)) rt.clearForces();
    rt.scan();
    trace.record();
  }
  return trace.toCSV();
}

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
  ]);
}

describe('the interpreter and the generated kernel', () => {
  const cases: Array<[string, () => Plan]> = [
    ['the demo program', () => planOf(demoProgram())],
    ['a program with every block type', () => planOf(everyBlockProgram())],
    ...[1, 2, 3].map((seed): [string, () => Plan] => [
      `generated program ${seed}`,
      () => {
        const result = compile(generateCase(150, seed).program, { space: GENERATED_SPACE });
        if (!result.ok) throw new Error(result.diagnostics[0]!.message);
        return result.plan;
      },
    ]),
  ];

  for (const [name, plan] of cases) {
    it(`give byte-identical traces and snapshots on ${name}`, () => {
      const p = plan();
      const generated = createRuntime(p, { evaluator: 'generated' });
      const interpreted = createRuntime(p, { evaluator: 'interpreter' });
      expect([generated.evaluator, interpreted.evaluator]).toEqual(['generated', 'interpreter']);
      const a = scriptedRun(generated, 600, 99);
      const b = scriptedRun(interpreted, 600, 99);
      expect(a.split('\n').length).toBe(602);
      expect(a).toBe(b);
      expect(JSON.stringify(generated.snapshot())).toBe(JSON.stringify(interpreted.snapshot()));
    });
  }

  it('falls back to the interpreter where code generation is forbidden', () => {
    const plan = planOf(demoProgram());
    const original = globalThis.Function;
    let rt: Runtime;
    try {
      globalThis.Function = function forbidden() {
        throw new EvalError('Refused to evaluate a string as JavaScript because unsafe-eval is not allowed');
      } as unknown as FunctionConstructor;
      rt = createRuntime(plan);
    } finally {
      globalThis.Function = original;
    }
    expect(rt.evaluator).toBe('interpreter');
    rt.setInput(1, true);
    rt.setInput(2, true);
    rt.scan();
    expect(rt.getOutput(1)).toBe(true);
  });
});

describe('a run', () => {
  it('is the same byte for byte when repeated', () => {
    const plan = planOf(everyBlockProgram());
    expect(scriptedRun(createRuntime(plan), 800, 5)).toBe(scriptedRun(createRuntime(plan), 800, 5));
  });
});

describe('generated code', () => {
  it('holds no text a user typed, only fixed templates and numbers', () => {
    const b = programBuilder();
    const hostile = "x'); globalThis.pwned = 1; ('";
    const program = b.program(
      [
        {
          ...b.rung(b.no('Evil_Name'), b.block('TON', 'Payload_T', { PT: 'T#1s' }), b.coil('%QX1')),
          comment: hostile,
        },
        b.rung({ ...b.no('Payload_T.Q'), comment: hostile }, b.coil('%MX1')),
      ],
      [{ name: 'Evil_Name', address: '%IX1', comment: hostile }],
    );
    const plan = planOf(program);
    const source = kernelSource(plan);
    for (const text of ['Evil_Name', 'Payload', 'pwned', 'globalThis', ...program.rungs.map((r) => r.id)]) {
      expect(source).not.toContain(text);
    }
    const allowedWords = new Set([
      'use', 'strict', 'const', 'let', 'function', 'return', 'true', 'false', 'kernel', 'steps', 'b', 'e', 's', 'k', 'f', 't', 'dt',
      'IN', 'PT', 'Q', 'ET', 'CU', 'CD', 'R', 'LD', 'PV', 'CV', 'QU', 'QD', 'CLK', 'S1', 'S', 'R1', 'Q1',
    ]);
    const words = source.match(/[A-Za-z_][A-Za-z0-9_]*/g) ?? [];
    const unexpected = words.filter((w) => !allowedWords.has(w) && !/^(step|in|chunk|r|l|o)[0-9]+$/.test(w));
    expect(unexpected).toEqual([]);
    expect(source).toMatch(/^[A-Za-z0-9_ \n;:,.'(){}[\]=&|^!?+-]*$/);
  });
});
