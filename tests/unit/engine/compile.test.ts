import { describe, expect, it } from 'vitest';
import { compile } from '@shared/engine';
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
});
