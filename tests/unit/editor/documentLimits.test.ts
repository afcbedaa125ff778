import { beforeEach, describe, expect, it } from 'vitest';
import { createPinia, setActivePinia } from 'pinia';
import { DOCUMENT_LIMITS, type NetworkNode, type Program } from '@shared/ladder/schema';
import { useEditorStore } from '@/stores/editor';
import { threeWire } from './fixtures';

beforeEach(() => setActivePinia(createPinia()));

/** `levels` series/parallel levels under a rung's root series, around one contact. */
function nestedNetwork(levels: number): NetworkNode {
  let node: NetworkNode = { kind: 'contact', id: 'deep', variant: 'no', operand: '%IX1' };
  for (let i = levels; i >= 1; i -= 1) node = i % 2 === 1 ? { kind: 'parallel', id: `p${i}`, branches: [node] } : { kind: 'series', id: `s${i}`, items: [node] };
  return node;
}

const withNetwork = (doc: Program, node: NetworkNode): Program => ({
  ...doc,
  rungs: [{ ...doc.rungs[0]!, network: { ...doc.rungs[0]!.network, items: [node] } }, ...doc.rungs.slice(1)],
});

describe('the editor and the document limits', () => {
  it('makes an edit that stays within the depth limit', () => {
    const editor = useEditorStore();
    editor.load(threeWire());
    editor.edit((doc) => withNetwork(doc, nestedNetwork(DOCUMENT_LIMITS.depth - 1)));
    expect(editor.refusedEdit).toBeNull();
    expect(editor.doc.rungs[0]!.network.items).toHaveLength(1);
  });

  it('refuses an edit that nests branches past the limit, says why and keeps the document', () => {
    const editor = useEditorStore();
    const start = threeWire();
    editor.load(start);
    editor.edit((doc) => withNetwork(doc, nestedNetwork(DOCUMENT_LIMITS.depth)));
    expect(editor.doc).toBe(start);
    expect(editor.undoable).toBe(false);
    expect(editor.refusedEdit?.message).toBe('That change was not made: branches nest more than 32 levels deep in rung 1.');
    const first = editor.refusedEdit!.at;
    editor.edit((doc) => withNetwork(doc, nestedNetwork(DOCUMENT_LIMITS.depth)));
    // A second refusal of the same kind is a new event for the workbench to show.
    expect(editor.refusedEdit!.at).toBe(first + 1);
  });

  it('refuses an edit that puts more elements in a rung than the limit allows', () => {
    const editor = useEditorStore();
    const start = threeWire();
    editor.load(start);
    const many: NetworkNode = { kind: 'series', id: 'many', items: Array.from({ length: DOCUMENT_LIMITS.nodesPerRung }, (_, i) => ({ kind: 'contact', id: `m${i}`, variant: 'no', operand: '%IX1' })) };
    editor.edit((doc) => withNetwork(doc, many));
    expect(editor.doc).toBe(start);
    expect(editor.refusedEdit?.message).toBe(`That change was not made: rung 1 has more than ${DOCUMENT_LIMITS.nodesPerRung} elements and branches.`);
  });
});
