import { beforeEach, describe, expect, it } from 'vitest';
import { createPinia, setActivePinia } from 'pinia';
import type { KeyChord } from '@/editor/commands/registry';
import { findElement } from '@shared/ladder/walk';
import { selectElements, selectRungs, selectSlot } from '@/editor/selection';
import { useEditorStore } from '@/stores/editor';
import { coil, no, program, rung, series, threeWire } from './fixtures';

const key = (k: string, mods: Partial<KeyChord> = {}): KeyChord => ({ key: k, ctrlKey: false, metaKey: false, shiftKey: false, altKey: false, ...mods });

beforeEach(() => setActivePinia(createPinia()));

describe('the editor store', () => {
  it('gives back the very same document after edit, undo and redo', () => {
    const editor = useEditorStore();
    const start = threeWire();
    editor.load(start);
    editor.select(selectSlot({ rungId: 'r1', path: [], index: 1 }));
    editor.dispatch('insert-element', { item: 'contact:nc' });
    const edited = editor.doc;
    expect(edited).not.toBe(start);
    expect(editor.dirty).toBe(true);
    editor.undo();
    expect(editor.doc).toBe(start);
    expect(editor.dirty).toBe(false);
    editor.redo();
    expect(editor.doc).toBe(edited);
    expect(edited.rungs[0]!.network.items[1]).toMatchObject({ kind: 'contact', variant: 'nc', operand: '' });
  });

  it('restores the selection an edit was made with when it is undone', () => {
    const editor = useEditorStore();
    editor.load(threeWire());
    editor.select(selectElements(['stop']));
    editor.dispatch('delete-selection');
    expect(findElement(editor.doc, 'stop')).toBeNull();
    editor.undo();
    expect(findElement(editor.doc, 'stop')).not.toBeNull();
    expect(editor.selection).toEqual(selectElements(['stop']));
  });

  it('records a burst of typing in one field as one undo step', () => {
    const editor = useEditorStore();
    const start = threeWire();
    editor.load(start);
    for (const text of ['%', '%Q', '%QX', '%QX2']) {
      editor.edit((doc) => ({ ...doc, title: text }), 'title');
    }
    expect(editor.doc.title).toBe('%QX2');
    editor.undo();
    expect(editor.doc).toBe(start);
  });

  it('refuses document commands on a version opened read-only but still moves the selection', () => {
    const editor = useEditorStore();
    const start = threeWire();
    editor.load(start, { readOnly: true });
    editor.select(selectElements(['stop']));
    expect(editor.dispatch('delete-selection')).toBe(false);
    expect(editor.doc).toBe(start);
    expect(editor.dispatch('select-right')).toBe(true);
    expect(editor.selection.kind).toBe('slot');
  });
});

describe('keyboard commands', () => {
  it('draws a start/stop rung with keys only: arrows to a slot, letters insert, Enter-free', () => {
    const editor = useEditorStore();
    editor.load(program([rung('r1', series('n1'))]));
    expect(editor.handleKey(key('ArrowRight'))).toBe(true); // first slot of the empty rung
    editor.handleKey(key('c')); // NO contact, selected after insertion
    const first = editor.selection;
    expect(first.kind).toBe('elements');
    editor.handleKey(key('C', { shiftKey: true })); // NC contact after it
    editor.handleKey(key('o')); // coil after that
    const items = editor.doc.rungs[0]!.network.items;
    expect(items.map((i) => (i.kind === 'contact' || i.kind === 'coil' ? `${i.kind}:${i.variant}` : i.kind))).toEqual([
      'contact:no',
      'contact:nc',
      'coil:coil',
    ]);
  });

  it('deletes the selected element with Delete and undoes with Ctrl+Z, redoes with Ctrl+Shift+Z and Ctrl+Y', () => {
    const editor = useEditorStore();
    const start = threeWire();
    editor.load(start);
    editor.select(selectElements(['k1']));
    editor.handleKey(key('Delete'));
    const deleted = editor.doc;
    expect(findElement(deleted, 'k1')).toBeNull();
    editor.handleKey(key('z', { ctrlKey: true }));
    expect(editor.doc).toBe(start);
    editor.handleKey(key('Z', { ctrlKey: true, shiftKey: true }));
    expect(editor.doc).toBe(deleted);
    editor.handleKey(key('z', { ctrlKey: true }));
    editor.handleKey(key('y', { ctrlKey: true }));
    expect(editor.doc).toBe(deleted);
  });

  it('wraps a contact in a parallel branch and moves an element along the rung', () => {
    const editor = useEditorStore();
    editor.load(program([rung('r1', series('n1', no('a', 'S1'), no('b', 'S2'), coil('q', '%QX1')))]));
    editor.select(selectElements(['b']));
    editor.handleKey(key('B', { shiftKey: true }));
    const wrapped = editor.doc.rungs[0]!.network.items[1]!;
    expect(wrapped.kind).toBe('parallel');
    expect(wrapped.kind === 'parallel' && wrapped.branches.length).toBe(2);
    editor.undo();
    editor.select(selectElements(['a']));
    editor.handleKey(key('ArrowRight', { altKey: true }));
    expect(editor.doc.rungs[0]!.network.items.map((i) => i.id)).toEqual(['b', 'a', 'q']);
  });

  it('copies a rung and pastes it below with fresh ids', () => {
    const editor = useEditorStore();
    editor.load(threeWire());
    editor.select(selectRungs(['r1']));
    editor.handleKey(key('c', { ctrlKey: true }));
    editor.handleKey(key('v', { ctrlKey: true }));
    expect(editor.doc.rungs).toHaveLength(2);
    const [a, b] = editor.doc.rungs;
    expect(b!.id).not.toBe(a!.id);
    expect(JSON.stringify(b!.network).includes('"stop"')).toBe(false);
    expect(b!.network.items).toHaveLength(3);
  });

  it('adds, duplicates, moves and deletes rungs by keyboard', () => {
    const editor = useEditorStore();
    editor.load(threeWire());
    editor.select(selectRungs(['r1']));
    editor.handleKey(key('Enter', { ctrlKey: true }));
    expect(editor.doc.rungs).toHaveLength(2);
    expect(editor.selection.kind).toBe('slot');
    editor.handleKey(key('ArrowUp', { altKey: true }));
    expect(editor.doc.rungs[0]!.network.items).toHaveLength(0);
    editor.handleKey(key('Delete', { shiftKey: true }));
    expect(editor.doc.rungs.map((r) => r.id)).toEqual(['r1']);
  });

  it('leaves keys it does not know to the browser', () => {
    const editor = useEditorStore();
    editor.load(threeWire());
    expect(editor.handleKey(key('q'))).toBe(false);
  });
});
