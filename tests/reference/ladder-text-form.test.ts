/**
 * The text form and the Structured Text rendering must mean what the ladder means. Random
 * series-parallel rungs of NO/NC contacts are rendered, and the rendered expression is evaluated by
 * mathjs (`evaluate` with `and`/`or`/`not`, a general-purpose reference evaluator) against a
 * direct reading of the network: a series conducts when all its items do, a parallel when any
 * branch does, a NO contact when its bit is TRUE, an NC contact when it is FALSE (IEC 61131-3
 * clause 8.2 [memory for the sub-clause numbers], docs/published-values.md).
 */
import { describe, expect, it } from 'vitest';
import fc from 'fast-check';
import { evaluate } from 'mathjs';
import type { NetworkNode } from '@shared/ladder/schema';
import { programToStructuredText } from '@shared/ladder/st';
import { rungText } from '@shared/ladder/text';
import { coil, program, rung, tag } from '../unit/ladder/fixtures';

const NAMES = ['S1', 'S2', 'S3', 'S4', 'B1'] as const;
const TAGS = [...NAMES.map((n, i) => tag(n, `%IX${i + 1}`)), tag('K1', '%QX1')];

/** Ids play no part in rendering, so one will do. */
const nextId = () => 'n';

const networkArb: fc.Arbitrary<NetworkNode> = fc.letrec<{ node: NetworkNode }>((tie) => ({
  node: fc.oneof(
    { depthSize: 'small', withCrossShrink: true },
    fc.record({ name: fc.constantFrom(...NAMES), nc: fc.boolean() }).map(
      ({ name, nc }): NetworkNode => ({ kind: 'contact', id: nextId(), variant: nc ? 'nc' : 'no', operand: name }),
    ),
    fc.array(tie('node'), { minLength: 1, maxLength: 3 }).map((items): NetworkNode => ({ kind: 'series', id: nextId(), items })),
    fc.array(tie('node'), { minLength: 2, maxLength: 3 }).map((branches): NetworkNode => ({ kind: 'parallel', id: nextId(), branches })),
  ),
})).node;

/** Direct reading of the network (the oracle). */
function conducts(node: NetworkNode, bits: Record<string, boolean>): boolean {
  switch (node.kind) {
    case 'contact':
      return node.variant === 'nc' ? !bits[node.operand] : Boolean(bits[node.operand]);
    case 'series':
      return node.items.every((n) => conducts(n, bits));
    case 'parallel':
      return node.branches.some((n) => conducts(n, bits));
    default:
      return true;
  }
}

function toMathjs(expression: string): string {
  return expression.replace(/\bAND\b/g, 'and').replace(/\bOR\b/g, 'or').replace(/\bNOT\b/g, 'not').replace(/\bTRUE\b/g, 'true');
}

const bitsArb = fc.record(Object.fromEntries(NAMES.map((n) => [n, fc.boolean()])) as Record<(typeof NAMES)[number], fc.Arbitrary<boolean>>);

describe('rendered expressions agree with the network (checked by mathjs)', () => {
  it('the text form before "->" evaluates to the rung\'s power flow', () => {
    fc.assert(
      fc.property(networkArb, bitsArb, (network, bits) => {
        const doc = program([rung('r', network, coil('k', 'K1'))], TAGS);
        const text = rungText(doc.rungs[0]!, doc);
        const [expression] = text.split(' -> ');
        expect(evaluate(toMathjs(expression!), { ...bits })).toBe(conducts(network, bits));
      }),
      { numRuns: 400 },
    );
  });

  it('the Structured Text assignment evaluates to the rung\'s power flow', () => {
    fc.assert(
      fc.property(networkArb, bitsArb, (network, bits) => {
        const doc = program([rung('r', network, coil('k', 'K1'))], TAGS);
        const line = programToStructuredText(doc).split('\n').find((l) => l.startsWith('K1 := '));
        expect(line).toBeDefined();
        const expression = line!.slice('K1 := '.length, -1);
        expect(evaluate(toMathjs(expression), { ...bits })).toBe(conducts(network, bits));
      }),
      { numRuns: 400 },
    );
  });
});
