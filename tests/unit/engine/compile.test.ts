import { describe, expect, it } from 'vitest';
import { compile } from '@shared/engine';
import { COIL_VARIANTS, CONTACT_VARIANTS } from '@shared/engine/elements';
import { NODE_OP, NODE_STRIDE } from '@shared/engine/plan';
import type { Program } from '@shared/ladder/schema';
import { programBuilder } from './build';

describe('compile', () => {
  it('returns located diagnostics for a student mistake instead of throwing', () => {
    const b = programBuilder();
    const program = b.program([b.rung(b.no('Strat'), b.coil('%IX2'))], [{ name: 'Start', address: '%IX1', comment: '' }]);
    const result = compile(program);
    expect(result.ok).toBe(false);
    const rungId = program.rungs[0]!.id;
    const codes = result.diagnostics.map((d) => [d.code, d.rungId, d.elementId]);
    expect(codes).toContainEqual(['unknown-tag', rungId, program.rungs[0]!.network.items[0]!.id]);
    expect(codes).toContainEqual(['coil-on-input', rungId, program.rungs[0]!.network.items[1]!.id]);
    expect(result.diagnostics.find((d) => d.code === 'unknown-tag')!.message).toMatch(/did you mean "Start"/);
  });

  it('checks addresses against the panel it compiles for', () => {
    const b = programBuilder();
    const program = b.program([b.rung(b.no('%IX12'), b.coil('%QX1'))]);
    expect(compile(program).ok).toBe(false);
    expect(compile(program, { space: { inputs: 16, outputs: 6, memory: 64 } }).ok).toBe(true);
  });

  it('passes warnings along with the plan', () => {
    const b = programBuilder();
    const program = b.program([b.rung(b.no('%IX1'), b.coil('%QX1')), b.rung(b.no('%IX2'), b.coil('%QX1'))]);
    const result = compile(program);
    expect(result.ok).toBe(true);
    expect(result.diagnostics.map((d) => [d.code, d.severity])).toEqual([['duplicate-coil', 'warning']]);
  });

  it('answers a document that is not a program with a diagnostic', () => {
    for (const junk of [null, 42, { format: 'rungwright.program' }, { ...programBuilder().program([]), rungs: [{ id: 'r1' }] }]) {
      const result = compile(junk as unknown as Program);
      expect(result.ok).toBe(false);
      expect(result.diagnostics[0]!.severity).toBe('error');
      expect(result.diagnostics[0]!.message.length).toBeGreaterThan(10);
    }
  });

  it('numbers instances, edge memories and power-flow slots in document order', () => {
    const b = programBuilder();
    const program = b.program([
      b.rung(b.contact('rising', '%IX1'), b.block('CTU', 'C1', { PV: '3' })),
      b.rung(b.contact('falling', '%IX1'), b.block('TON', 't2', { PT: 'T#1s' }), b.coil('%QX1')),
    ]);
    const result = compile(program);
    if (!result.ok) throw new Error(result.diagnostics[0]!.message);
    const { plan } = result;
    expect(plan.instances.map((i) => [i.name, i.key, i.type])).toEqual([
      ['C1', 'C1', 'CTU'],
      ['t2', 'T2', 'TON'],
    ]);
    expect(plan.edges.map((e) => e.operand)).toEqual(['%IX1', '%IX1']);
    expect(plan.flowIndex.get(program.rungs[1]!.id)).toBe(plan.flowIndex.get(program.rungs[1]!.network.id));
    expect(plan.elementCount).toBe(5);
  });

  it('lowers the rungs into a node table in document order, and builds the same rungs as objects from it', () => {
    const b = programBuilder();
    const program = b.program([
      b.rung(b.parallel(b.no('%IX1'), b.series(b.nc('%IX2'), b.contact('rising', '%IX1'))), b.coil('%QX1', 'set')),
      b.rung(b.block('TON', 'T1', { PT: 'T#2s' }), b.coil('%MX3')),
    ]);
    const result = compile(program);
    if (!result.ok) throw new Error(result.diagnostics[0]!.message);
    const { plan } = result;
    const { data, roots, elements } = plan.nodes;
    const rows = Array.from({ length: data.length / NODE_STRIDE }, (_, i) => [...data.subarray(NODE_STRIDE * i, NODE_STRIDE * (i + 1))]);
    const { series, parallel, contact, coil, block } = NODE_OP;
    // Sources in order of first use: %IX1 is source 0, %IX2 source 1 (checked below).
    expect(rows).toEqual([
      [series, 2, 0, -1],
      [parallel, 2, 0, -1],
      [contact, CONTACT_VARIANTS.indexOf('no'), 0, -1],
      [series, 2, 0, -1],
      [contact, CONTACT_VARIANTS.indexOf('nc'), 1, -1],
      [contact, CONTACT_VARIANTS.indexOf('rising'), 0, 0],
      [coil, COIL_VARIANTS.indexOf('set'), plan.layout.outputs, -1],
      [series, 2, 0, -1],
      [block, 0, 0, -1],
      [coil, COIL_VARIANTS.indexOf('coil'), plan.layout.memory + 2, -1],
    ]);
    expect([...roots]).toEqual([0, 7]);
    expect([...elements]).toEqual([4, 2]);
    expect(plan.sources).toEqual([
      { kind: 'bit', bit: 0 },
      { kind: 'bit', bit: 1 },
    ]);
    expect(plan.blocks.map((n) => [n.type, n.flow])).toEqual([['TON', 8]]);
    const [first, second] = plan.rungs;
    expect(first!.id).toBe(program.rungs[0]!.id);
    expect(first!.network.items[0]).toMatchObject({ op: 'parallel', flow: 1, id: program.rungs[0]!.network.items[0]!.id });
    expect(first!.network.items[0]!.op === 'parallel' && first!.network.items[0]!.branches[1]).toMatchObject({
      op: 'series',
      items: [
        { op: 'contact', variant: 'nc', source: { kind: 'bit', bit: 1 }, edge: -1, flow: 4 },
        { op: 'contact', variant: 'rising', source: { kind: 'bit', bit: 0 }, edge: 0, flow: 5 },
      ],
    });
    expect(first!.network.items[1]).toMatchObject({ op: 'coil', variant: 'set', bit: plan.layout.outputs, edge: -1, flow: 6 });
    expect(second!.network.items[0]).toBe(plan.blocks[0]);
    expect(plan.rungs).toBe(plan.rungs);
  });
});
