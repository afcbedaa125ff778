/**
 * Property check against an independent evaluator: random series-parallel rungs of NO/NC contacts
 * over %IX1..%IX8, rendered as boolean expressions and evaluated by mathjs (`evaluate` with
 * `and` / `or` / `not`), must agree with the engine's coil on random input vectors — series is AND,
 * parallel is OR, NC is NOT (IEC 61131-3:2013 8.2.3, 8.2.4 [memory for the sub-numbers]).
 */
import { describe, expect, it } from 'vitest';
import fc from 'fast-check';
import { evaluate } from 'mathjs';
import { compile, createRuntime } from '@shared/engine';
import type { NetworkNode } from '@shared/ladder/schema';
import { programBuilder, type ProgramBuilder } from '../unit/engine/build';

/** A network shape, independent of the document ids. */
type Shape = { contact: 'no' | 'nc'; input: number } | { series: Shape[] } | { parallel: Shape[] };

const shape: fc.Arbitrary<Shape> = fc.letrec<{ node: Shape }>((tie) => ({
  node: fc.oneof(
    { depthSize: 'small', withCrossShrink: true },
    fc.record({ contact: fc.constantFrom('no' as const, 'nc' as const), input: fc.integer({ min: 1, max: 8 }) }),
    fc.record({ series: fc.array(tie('node'), { minLength: 1, maxLength: 4 }) }),
    fc.record({ parallel: fc.array(tie('node'), { minLength: 2, maxLength: 3 }) }),
  ),
})).node;

function toNetwork(s: Shape, b: ProgramBuilder): NetworkNode {
  if ('contact' in s) return b.contact(s.contact, `%IX${s.input}`);
  if ('series' in s) return b.series(...s.series.map((x) => toNetwork(x, b)));
  return b.parallel(...s.parallel.map((x) => toNetwork(x, b)));
}

/** The same network as a mathjs boolean expression over x1..x8. */
function toExpression(s: Shape): string {
  if ('contact' in s) return s.contact === 'no' ? `x${s.input}` : `(not x${s.input})`;
  if ('series' in s) return `(${s.series.map(toExpression).join(' and ')})`;
  return `(${s.parallel.map(toExpression).join(' or ')})`;
}

describe('random series-parallel rungs (checked with mathjs)', () => {
  it('energise the coil exactly when the boolean expression is TRUE', () => {
    fc.assert(
      fc.property(shape, fc.array(fc.array(fc.boolean(), { minLength: 8, maxLength: 8 }), { minLength: 1, maxLength: 6 }), (s, vectors) => {
        const b = programBuilder();
        const program = b.program([b.rung(toNetwork(s, b), b.coil('%QX1')), b.rung(toNetwork(s, b), b.coil('%QX2', 'negated'))]);
        const compiled = compile(program);
        if (!compiled.ok) throw new Error(compiled.diagnostics.map((d) => d.message).join('; '));
        const expression = toExpression(s);
        const rt = createRuntime(compiled.plan);
        for (const inputs of vectors) {
          rt.setInputs(inputs);
          rt.scan();
          const scope = Object.fromEntries(inputs.map((v, i) => [`x${i + 1}`, v]));
          const expected = evaluate(expression, scope) as boolean;
          expect(rt.getOutput(1)).toBe(expected);
          expect(rt.getOutput(2)).toBe(!expected);
        }
      }),
      { numRuns: 300, seed: 61131 },
    );
  });

  it('the mathjs evaluator itself reads and/or/not as expected', () => {
    expect(evaluate('(x1 and (not x2)) or x3', { x1: true, x2: false, x3: false })).toBe(true);
    expect(evaluate('(x1 and (not x2)) or x3', { x1: true, x2: true, x3: false })).toBe(false);
  });
});
