import { describe, expect, it } from 'vitest';
import fc from 'fast-check';
import { compile } from '@shared/engine';
import { SCHEMA_LIMITS, isParsedProgram } from '@shared/ladder/wellFormed';
import { DOCUMENT_LIMITS } from '@shared/ladder/schema';
import { createEmptyProgram, parseProgram } from '@shared/ladder/restore';
import type { Program } from '@shared/ladder/schema';
import { benchProgram } from '../../perf/engine-programs';
import { demoCases } from '../../perf/engine-demo';
import { programBuilder } from '../engine/build';
import { randomProgram } from '../engine/oracle/randomProgram';

/** The one property that matters: the fast check never accepts what the schema refuses or changes. */
function expectSound(value: unknown): void {
  if (!isParsedProgram(value)) return;
  const parsed = parseProgram(value);
  expect(parsed.ok ? 'accepted' : parsed.error).toBe('accepted');
  if (parsed.ok) expect(parsed.value).toStrictEqual(value);
}

/** Every object and array inside a document, to mutate one of them. */
function containers(value: unknown, out: Array<Record<string, unknown> | unknown[]> = []): Array<Record<string, unknown> | unknown[]> {
  if (typeof value !== 'object' || value === null) return out;
  out.push(value as Record<string, unknown> | unknown[]);
  for (const child of Object.values(value)) containers(child, out);
  return out;
}

const mutation = fc.oneof(
  fc.record({ op: fc.constant('set' as const), key: fc.constantFrom('id', 'kind', 'variant', 'operand', 'type', 'instance', 'inputs', 'items', 'branches', 'comment', 'name', 'address', 'title', 'format', 'version', 'rungs', 'tags', 'network', 'extra'), value: fc.jsonValue({ maxDepth: 2 }) }),
  fc.record({ op: fc.constant('long' as const), key: fc.constantFrom('id', 'operand', 'instance', 'comment', 'name', 'address', 'title'), length: fc.constantFrom(17, 33, 65, 201, 501, 2001) }),
  fc.record({ op: fc.constant('odd' as const), key: fc.constantFrom('id', 'name'), text: fc.constantFrom('', 'a b', 'é', '1abc', 'a.b', 'x'.repeat(64)) }),
  fc.record({ op: fc.constant('delete' as const), key: fc.constantFrom('id', 'kind', 'comment', 'tags', 'title', 'description', 'inputs', 'items', 'operand') }),
  fc.record({ op: fc.constant('duplicate-id' as const) }),
  fc.record({ op: fc.constant('grow' as const), times: fc.constantFrom(65, 201) }),
);

function mutate(program: Program, which: number, m: Record<string, unknown>): unknown {
  const copy = structuredClone(program) as unknown;
  const all = containers(copy);
  const target = all[which % all.length]!;
  if (Array.isArray(target)) {
    if (m.op === 'grow' && target.length > 0) for (let i = 0; i < (m.times as number); i += 1) target.push(structuredClone(target[0]));
    else if (m.op === 'set') target.push(m.value);
    return copy;
  }
  const key = m.key as string;
  if (m.op === 'set') target[key] = m.value;
  else if (m.op === 'long') target[key] = 'a'.repeat(m.length as number);
  else if (m.op === 'odd') target[key] = m.text;
  else if (m.op === 'delete') delete target[key];
  else if (m.op === 'duplicate-id' && typeof target.id === 'string') {
    const other = all.find((c) => !Array.isArray(c) && c !== target && typeof (c as Record<string, unknown>).id === 'string') as Record<string, unknown> | undefined;
    if (other) target.id = other.id;
  }
  return copy;
}

describe('isParsedProgram', () => {
  it('accepts what parseProgram returns, unchanged', () => {
    const documents: Program[] = [
      createEmptyProgram('x'),
      ...demoCases().map((d) => d.program),
      benchProgram('series', 100, 1).program,
      benchProgram('parallel', 100, 1).program,
      { ...programBuilder().program([]), tags: [{ name: 'Start', address: '%IX1', comment: 'a' }] },
    ];
    for (const doc of documents) {
      expect(isParsedProgram(doc)).toBe(true);
      const parsed = parseProgram(doc);
      expect(parsed.ok && parsed.value).toStrictEqual(doc);
    }
    fc.assert(fc.property(randomProgram, (doc) => isParsedProgram(doc) && parseProgram(doc).ok), { numRuns: 200, seed: 7 });
  }, 60_000);

  it('never accepts a document the schema refuses or would change', () => {
    fc.assert(
      fc.property(randomProgram, fc.nat(), mutation, (doc, which, m) => {
        expectSound(mutate(doc, which, m as Record<string, unknown>));
      }),
      { numRuns: 2000, seed: 2026 },
    );
  }, 120_000);

  it('refuses what is not a plain JSON document', () => {
    const doc = programBuilder().program([]);
    for (const junk of [null, 42, 'x', [], new Map(), Object.assign(Object.create({ inherited: 1 }), doc), { ...doc, extra: 1 }]) {
      expect(isParsedProgram(junk)).toBe(false);
    }
  });

  it('holds the same limits as the schema', () => {
    const b = programBuilder();
    const at = (limit: number, make: (n: number) => Program): void => {
      expect(isParsedProgram(make(limit))).toBe(true);
      expect(parseProgram(make(limit)).ok).toBe(true);
      expect(parseProgram(make(limit + 1)).ok).toBe(false);
      expect(isParsedProgram(make(limit + 1))).toBe(false);
    };
    const rung = (items: Program['rungs'][number]['network']['items']): Program['rungs'][number] => ({ id: 'r', comment: '', network: { kind: 'series', id: 's', items } });
    const one = (node: Program['rungs'][number]['network']['items'][number]): Program => b.program([rung([node])]);
    at(SCHEMA_LIMITS.id, (n) => one({ kind: 'contact', id: 'a'.repeat(n), variant: 'no', operand: '' }));
    at(SCHEMA_LIMITS.operand, (n) => one({ kind: 'contact', id: 'c', variant: 'no', operand: 'a'.repeat(n) }));
    at(SCHEMA_LIMITS.elementComment, (n) => one({ kind: 'coil', id: 'c', variant: 'set', operand: '', comment: 'a'.repeat(n) }));
    at(SCHEMA_LIMITS.instance, (n) => one({ kind: 'block', id: 'c', type: 'TON', instance: 'a'.repeat(n), inputs: {} }));
    at(SCHEMA_LIMITS.seriesItems, (n) => b.program([rung(Array.from({ length: n }, (_, i) => ({ kind: 'contact', id: `c${i}`, variant: 'no', operand: '' })))]));
    at(SCHEMA_LIMITS.parallelBranches, (n) => one({ kind: 'parallel', id: 'p', branches: Array.from({ length: n }, (_, i) => ({ kind: 'contact', id: `c${i}`, variant: 'no', operand: '' })) }));
    at(SCHEMA_LIMITS.rungComment, (n) => b.program([{ ...rung([]), comment: 'a'.repeat(n) }]));
    at(SCHEMA_LIMITS.tagName, (n) => ({ ...b.program([]), tags: [{ name: 'a'.repeat(n), address: '%IX1', comment: '' }] }));
    at(SCHEMA_LIMITS.tagAddress, (n) => ({ ...b.program([]), tags: [{ name: 'a', address: '%'.repeat(n), comment: '' }] }));
    at(SCHEMA_LIMITS.tagComment, (n) => ({ ...b.program([]), tags: [{ name: 'a', address: '', comment: 'a'.repeat(n) }] }));
    at(SCHEMA_LIMITS.tags, (n) => ({ ...b.program([]), tags: Array.from({ length: n }, (_, i) => ({ name: `t${i}`, address: '', comment: '' })) }));
    at(SCHEMA_LIMITS.title, (n) => ({ ...b.program([]), title: 'a'.repeat(n) }));
    at(SCHEMA_LIMITS.description, (n) => ({ ...b.program([]), description: 'a'.repeat(n) }));
    at(SCHEMA_LIMITS.rungs, (n) => b.program(Array.from({ length: n }, (_, i) => ({ id: `r${i}`, comment: '', network: { kind: 'series', id: `s${i}`, items: [] } }))));
  });

  it('holds the size limits parseProgram checks first: depth, nodes per rung and per program, no NUL', () => {
    const b = programBuilder();
    const at = (limit: number, make: (n: number) => Program): void => {
      expect([isParsedProgram(make(limit)), parseProgram(make(limit)).ok]).toEqual([true, true]);
      expect([isParsedProgram(make(limit + 1)), parseProgram(make(limit + 1)).ok]).toEqual([false, false]);
    };
    type Node = Program['rungs'][number]['network']['items'][number];
    // `levels` series and parallel nodes nested in one another, the rung's root series the first.
    const nested = (levels: number): Program => {
      let node: Node = { kind: 'contact', id: 'c', variant: 'no', operand: '' };
      for (let level = levels; level >= 2; level -= 1) node = level % 2 === 0 ? { kind: 'parallel', id: `n${level}`, branches: [node] } : { kind: 'series', id: `n${level}`, items: [node] };
      return b.program([{ id: 'r', comment: '', network: { kind: 'series', id: 's', items: [node] } }]);
    };
    at(DOCUMENT_LIMITS.depth, nested);
    // 100 rungs of 200 nodes (the root series and 199 contacts) are the 20,000; one more contact passes it.
    const perRung = DOCUMENT_LIMITS.nodesPerProgram / 100;
    const many = (total: number): Program =>
      b.program(
        Array.from({ length: 100 }, (_, r) => {
          const contacts = perRung - 1 + (r === 99 ? total - DOCUMENT_LIMITS.nodesPerProgram : 0);
          return { id: `r${r}`, comment: '', network: { kind: 'series', id: `s${r}`, items: Array.from({ length: contacts }, (_, i): Node => ({ kind: 'contact', id: `c${r}_${i}`, variant: 'no', operand: '' })) } };
        }),
      );
    at(DOCUMENT_LIMITS.nodesPerProgram, many);
    // One rung of `total` nodes: its root series, parallels of up to 64 contacts, and contacts.
    const wide = (total: number): Program => {
      const items: Node[] = [];
      let left = total - 1;
      for (let p = 0; left > 0; p += 1) {
        const branches = Math.min(64, left - 1);
        if (branches < 1) {
          items.push({ kind: 'contact', id: `x${p}`, variant: 'no', operand: '' });
          left -= 1;
          continue;
        }
        items.push({ kind: 'parallel', id: `p${p}`, branches: Array.from({ length: branches }, (_, i): Node => ({ kind: 'contact', id: `c${p}_${i}`, variant: 'no', operand: '' })) });
        left -= branches + 1;
      }
      return b.program([{ id: 'r', comment: '', network: { kind: 'series', id: 's', items } }]);
    };
    at(DOCUMENT_LIMITS.nodesPerRung, wide);
    // NUL is refused in every string, a block input's name included.
    const nul = 'a\u0000b';
    const block = (inputs: Record<string, string>): Program => b.program([{ id: 'r', comment: '', network: { kind: 'series', id: 's', items: [{ kind: 'block', id: 'k', type: 'TON', instance: 'T1', inputs }] } }]);
    for (const doc of [
      { ...b.program([]), title: nul },
      { ...b.program([]), description: nul },
      { ...b.program([]), tags: [{ name: 'a', address: '%IX1', comment: nul }] },
      b.program([{ id: 'r', comment: nul, network: { kind: 'series', id: 's', items: [] } }]),
      b.program([{ id: 'r', comment: '', network: { kind: 'series', id: 's', items: [{ kind: 'contact', id: 'c', variant: 'no', operand: nul }] } }]),
      b.program([{ id: 'r', comment: '', network: { kind: 'series', id: 's', items: [{ kind: 'coil', id: 'c', variant: 'coil', operand: '%QX1', comment: nul }] } }]),
      block({ PT: nul }),
      block({ [nul]: 'T#1s' }),
    ]) {
      expect([isParsedProgram(doc), parseProgram(doc).ok]).toEqual([false, false]);
    }
    expect([isParsedProgram(block({ PT: 'T#1s' })), parseProgram(block({ PT: 'T#1s' })).ok]).toEqual([true, true]);
  });

  it('leaves a document it refuses to the schema, whose message compile passes on', () => {
    const doc = { ...programBuilder().program([]), rungs: [{ id: 'r1' }] } as unknown as Program;
    const result = compile(doc);
    expect(result.ok).toBe(false);
    expect(result.diagnostics[0]!.message).toMatch(/rungs\[0\]\.network/);
  });
});
