import { describe, expect, it } from 'vitest';
import fc from 'fast-check';
import * as edits from '@shared/ladder/edits';
import { parseProgram } from '@shared/ladder/restore';
import { ProgramSchema, type Element, type Program } from '@shared/ladder/schema';
import { allIds, visitNodes } from '@shared/ladder/walk';
import { threeWireForward } from './fixtures';

/** A small id pool so that edits keep colliding with ids already in the document. */
const idArb = fc.constantFrom<string>('c1', 'c2', 'k1', 'p1', 'r1', 'x', 'con1', 'ser1', 'blk1');
const operandArb = fc.constantFrom<string>('S1', 'S2', 'K1', '%IX3', '%QX2', 'T1.Q', '', 'T#2s', '3');
const elementArb: fc.Arbitrary<Element> = fc.oneof(
  fc.record({ kind: fc.constant('contact' as const), id: idArb, variant: fc.constantFrom('no', 'nc', 'rising', 'falling'), operand: operandArb }),
  fc.record({ kind: fc.constant('coil' as const), id: idArb, variant: fc.constantFrom('coil', 'negated', 'set', 'reset'), operand: operandArb }),
  fc.record({
    kind: fc.constant('block' as const),
    id: idArb,
    type: fc.constantFrom('TON', 'CTU', 'SR'),
    instance: fc.constantFrom('T1', 'C1', ''),
    inputs: fc.constantFrom<Record<string, string>>({}, { PT: 'T#1s' }, { PV: '2' }),
  }),
);

/** Seeds pick rungs and nodes of whatever document the edit meets. */
const command = fc.record({
  op: fc.constantFrom(
    'insert', 'append', 'wrap', 'branch', 'delete', 'move', 'operand', 'variant', 'input', 'comment',
    'addRung', 'moveRung', 'duplicateRung', 'deleteRung', 'renameTag', 'addTag', 'deleteTag', 'normalize',
  ),
  rung: fc.nat(),
  node: fc.nat(),
  span: fc.integer({ min: 1, max: 3 }),
  flag: fc.boolean(),
  element: elementArb,
  operand: operandArb,
  name: fc.constantFrom('S1', 'S2', 'Start', 'K1', 'Lamp', 'bad name'),
});
type Command = typeof command extends fc.Arbitrary<infer C> ? C : never;

function apply(doc: Program, c: Command): Program {
  if (doc.rungs.length === 0 && !['addRung', 'addTag', 'renameTag', 'deleteTag'].includes(c.op)) return edits.addRung(doc);
  const rung = doc.rungs[c.rung % Math.max(1, doc.rungs.length)];
  const paths: number[][] = [];
  const ids: string[] = [];
  if (rung) visitNodes(rung.network, (node, path) => { paths.push(path); ids.push(node.id); });
  const path = paths[c.node % Math.max(1, paths.length)] ?? [];
  const rungId = rung?.id ?? 'none';
  const elementId = ids[c.node % Math.max(1, ids.length)] ?? 'none';
  const offset = c.flag ? 1 : -1;
  switch (c.op) {
    case 'insert':
      return edits.insertElement(doc, { rungId, path, position: c.flag ? 'after' : 'before', element: c.element });
    case 'append':
      return edits.appendElement(doc, { rungId, element: c.element });
    case 'wrap': {
      if (path.length === 0) return edits.wrapInParallel(doc, { rungId, paths: [path] });
      const start = path[path.length - 1]!;
      const run = Array.from({ length: c.span }, (_, i) => [...path.slice(0, -1), start + i]);
      return edits.wrapInParallel(doc, { rungId, paths: run, ...(c.flag ? { element: c.element } : {}) });
    }
    case 'branch':
      return edits.addBranchBelow(doc, { rungId, path, element: c.element });
    case 'delete':
      return edits.deleteNodes(doc, { rungId, paths: [path, paths[(c.node + c.span) % Math.max(1, paths.length)] ?? []] });
    case 'move':
      return edits.moveElement(doc, { rungId, path, offset });
    case 'operand':
      return edits.setOperand(doc, { elementId, operand: c.operand });
    case 'variant':
      return edits.setVariant(doc, { elementId, variant: c.flag ? 'nc' : 'set' });
    case 'input':
      return edits.setBlockInput(doc, { elementId, input: c.flag ? 'PT' : 'PV', operand: c.operand });
    case 'comment':
      return edits.setComment(doc, { elementId, comment: c.flag ? 'note' : '' });
    case 'addRung':
      return edits.addRung(doc, c.flag ? { afterRungId: rung?.id ?? null } : { rung: { id: 'r1', network: { kind: 'series', id: 'c1', items: [c.element] } } });
    case 'moveRung':
      return edits.moveRung(doc, { rungId, offset });
    case 'duplicateRung':
      return edits.duplicateRung(doc, { rungId });
    case 'deleteRung':
      return edits.deleteRung(doc, { rungId });
    case 'renameTag':
      return edits.renameTag(doc, { from: doc.tags[c.node % Math.max(1, doc.tags.length)]?.name ?? 'S1', to: c.name });
    case 'addTag':
      return edits.addTag(doc, { tag: { name: c.name, address: c.flag ? '%IX4' : '%QX3' } });
    case 'deleteTag':
      return edits.deleteTag(doc, { name: c.name });
    case 'normalize':
      return rung ? { ...doc, rungs: doc.rungs.map((r) => (r === rung ? { ...r, network: edits.normalizeNetwork(r.network) } : r)) } : doc;
  }
  return doc;
}

describe('random edit sequences', () => {
  it('never produce a document the schema refuses, and never repeat an id', () => {
    fc.assert(
      fc.property(fc.array(command, { maxLength: 30 }), (commands) => {
        let doc = threeWireForward();
        for (const c of commands) {
          doc = apply(doc, c);
          expect(ProgramSchema.safeParse(doc).success).toBe(true);
          const ids = allIds(doc);
          expect(new Set(ids).size).toBe(ids.length);
        }
        // The loader accepts the result and gives back an equal document.
        expect(parseProgram(JSON.parse(JSON.stringify(doc)))).toEqual({ ok: true, value: doc });
      }),
      { numRuns: 300 },
    );
  });

  it('leave networks in normal form after a delete (bar the branches already empty before it), and normalising twice changes nothing', () => {
    fc.assert(
      fc.property(fc.array(command, { maxLength: 20 }), fc.nat(), fc.nat(), (commands, rungSeed, nodeSeed) => {
        let doc = threeWireForward();
        for (const c of commands) doc = apply(doc, c);
        const rung = doc.rungs[rungSeed % Math.max(1, doc.rungs.length)];
        if (!rung) return;
        const paths: number[][] = [];
        visitNodes(rung.network, (_, p) => paths.push(p));
        const emptyBefore = new Set<string>();
        visitNodes(rung.network, (node) => {
          if (node.kind === 'parallel') for (const b of node.branches) if (b.kind === 'series' && b.items.length === 0) emptyBefore.add(b.id);
        });
        const after = edits.deleteNodes(doc, { rungId: rung.id, paths: [paths[nodeSeed % paths.length]!] });
        const network = after.rungs.find((r) => r.id === rung.id)!.network;
        if (after !== doc) expect(edits.normalizeNetwork(network, emptyBefore)).toBe(network);
        const once = edits.normalizeNetwork(rung.network);
        expect(edits.normalizeNetwork(once)).toBe(once);
      }),
      { numRuns: 200 },
    );
  });
});
