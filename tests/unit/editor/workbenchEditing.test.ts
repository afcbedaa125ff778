/**
 * The editor in the one workbench: branch commands leave the new branch selected, the document is
 * validated against the panel in use (once per edit), and a new program is not an error.
 */
import { beforeEach, describe, expect, it } from 'vitest';
import { createPinia, setActivePinia } from 'pinia';
import { parsePanelLayout, REVERSING_CONVEYOR_INPUT } from '@shared/field';
import { builtInPanel } from '@shared/field/panels';
import { createEmptyProgram } from '@shared/ladder/restore';
import { validateProgram } from '@shared/ladder/validate';
import type { KeyChord } from '@/editor/commands/registry';
import { selectElements } from '@/editor/selection';
import { panelAddressSpace } from '@/editor/addressSpace';
import { useEditorStore } from '@/stores/editor';
import { coil, no, program, rung, series } from './fixtures';

const key = (k: string, mods: Partial<KeyChord> = {}): KeyChord => ({ key: k, ctrlKey: false, metaKey: false, shiftKey: false, altKey: false, ...mods });
const startStop = () => program([rung('r1', series('n1', no('stop', '%IX1'), no('start', '%IX2'), coil('k1', '%QX1')))]);

/** The default panel with a seventh output: a second horn, H2 on %QX7 (a lab's own panel). */
function panelWithSeventhOutput() {
  const input = structuredClone(REVERSING_CONVEYOR_INPUT) as unknown as { outputs: number; devices: unknown[] };
  input.outputs = 7;
  input.devices.push({ id: 'H2', kind: 'horn', label: 'Second horn', params: {}, drivenBy: '%QX7' });
  const parsed = parsePanelLayout(input);
  if (!parsed.ok) throw new Error(parsed.errors.join('; '));
  return parsed.value;
}

beforeEach(() => setActivePinia(createPinia()));

describe('branch commands', () => {
  it('select the new branch after "Branch below", so the next key goes into the branch, not on in series', () => {
    const editor = useEditorStore();
    editor.load(startStop());
    editor.select(selectElements(['start']));
    expect(editor.handleKey(key('b'))).toBe(true);
    expect(editor.selection.kind).toBe('slot');
    editor.handleKey(key('c'));
    const items = editor.doc.rungs[0]!.network.items;
    expect(items.map((n) => n.kind)).toEqual(['contact', 'parallel', 'coil']);
    const parallel = items[1]!;
    if (parallel.kind !== 'parallel') throw new Error('no parallel');
    // The start button and, below it, the new contact: the seal-in branch.
    expect(parallel.branches.map((b) => (b.kind === 'series' ? b.items.map((i) => i.id) : [b.id]))).toEqual([['start'], [expect.any(String)]]);
    expect(parallel.branches[1]!.kind === 'series' && parallel.branches[1]!.items[0]!.kind).toBe('contact');
  });

  it('select the new empty branch after "Wrap in branch" too', () => {
    const editor = useEditorStore();
    editor.load(startStop());
    editor.select(selectElements(['start']));
    editor.dispatch('wrap-in-parallel');
    editor.dispatch('insert-element', { item: 'contact:no' });
    const parallel = editor.doc.rungs[0]!.network.items[1]!;
    expect(parallel.kind === 'parallel' && parallel.branches.map((b) => b.kind === 'series' ? b.items.length : 1)).toEqual([1, 1]);
  });
});

describe('the address space of the panel in use', () => {
  it('accepts %QX7 on a lab panel with a seventh output, and flags it on the default panel', () => {
    const editor = useEditorStore();
    editor.load(program([rung('r1', series('n1', no('a', '%IX1'), coil('h', '%QX7')))]));
    expect(editor.diagnostics.map((d) => d.code)).toEqual(['address-out-of-range']);
    editor.usePanel(builtInPanel('reversing-conveyor')!);
    expect(editor.diagnostics.map((d) => d.code)).toEqual(['address-out-of-range']);
    editor.usePanel(panelWithSeventhOutput());
    expect(editor.space).toEqual({ inputs: 8, outputs: 7, memory: 64 });
    expect(editor.diagnostics).toEqual([]);
  });

  it('validates each document once per space: the editor and anyone else asking get the very same answer', () => {
    const editor = useEditorStore();
    editor.usePanel(panelWithSeventhOutput());
    editor.load(startStop());
    const first = editor.problems;
    expect(validateProgram(editor.doc, panelAddressSpace(panelWithSeventhOutput()))).toBe(first);
    expect(Object.isFrozen(first)).toBe(true);
  });
});

describe('a new program', () => {
  it('is not told its empty rung is an error before anything is drawn; a rung added later is', () => {
    const editor = useEditorStore();
    editor.load(createEmptyProgram('Fresh'));
    expect(editor.blank).toBe(true);
    expect(editor.diagnostics).toEqual([]);
    expect(editor.problems.map((d) => d.code)).toEqual(['empty-rung']);
    editor.dispatch('select-right');
    editor.handleKey(key('c'));
    expect(editor.blank).toBe(false);
    expect(editor.diagnostics.length).toBeGreaterThan(0);
  });
});
