/**
 * Commands on elements: insert from the palette, delete, branch, move along the rung, copy, cut
 * and paste. Each `perform` is pure over the editor state; the document changes are the shared
 * edits, reached through `../gestures`.
 */
import type { Element } from '@shared/ladder/schema';
import { elementsOfProgram, findElement } from '@shared/ladder/walk';
import { createElement } from '../elementFactory';
import {
  addBranchUnder,
  deleteElements,
  deleteRungs,
  freshCopies,
  freshElementId,
  insertAtSlot,
  moveElementBy,
  newEmptyBranchSlot,
  pasteRungs,
  rungOfElement,
  wrapElements,
} from '../gestures';
import { paletteItem } from '../palette';
import { NO_SELECTION, focusElementId, selectElements, selectRungs, selectSlot, selectedElementIds, selectedRungIds } from '../selection';
import { insertionSlot, selectionRungId, slotAfter } from '../slots';
import type { Command, CommandName, EditorState } from './types';

const hasElements = (s: EditorState) => selectedElementIds(s.selection).length > 0;
const hasFocus = (s: EditorState) => focusElementId(s.selection) !== undefined;

/** The selected elements in document order (the order they are copied and pasted in). */
function selectedNodes(state: EditorState): Element[] {
  const ids = new Set(selectedElementIds(state.selection));
  return elementsOfProgram(state.doc)
    .filter((located) => ids.has(located.element.id))
    .map((located) => located.element);
}

export const ELEMENT_COMMANDS = {
  'insert-element': {
    name: 'insert-element',
    label: 'Insert element',
    group: 'element',
    shortcuts: [],
    edits: true,
    enabled: (s, args) => {
      const item = args?.item ? paletteItem(args.item) : undefined;
      return item !== undefined && insertionSlot(s.doc, s.selection, item) !== undefined;
    },
    perform: (s, _effects, args) => {
      const item = args?.item ? paletteItem(args.item) : undefined;
      if (!item) return;
      const slot = insertionSlot(s.doc, s.selection, item);
      if (!slot) return;
      const element = createElement(item, freshElementId(s.doc, item.kind), s.doc);
      const doc = insertAtSlot(s.doc, slot, [element]);
      return doc === s.doc ? undefined : { doc, selection: selectElements([element.id]) };
    },
  },
  'delete-selection': {
    name: 'delete-selection',
    label: 'Delete',
    group: 'element',
    shortcuts: ['Delete', 'Backspace'],
    edits: true,
    enabled: (s) => hasElements(s) || selectedRungIds(s.selection).length > 0,
    perform: (s) => {
      const rungIds = selectedRungIds(s.selection);
      if (rungIds.length > 0) return { doc: deleteRungs(s.doc, rungIds), selection: NO_SELECTION };
      const ids = selectedElementIds(s.selection);
      const after = slotAfterDeletion(s, ids);
      return { doc: deleteElements(s.doc, ids), selection: after };
    },
  },
  'wrap-in-parallel': {
    name: 'wrap-in-parallel',
    label: 'Wrap in parallel branch',
    group: 'element',
    shortcuts: ['Shift+B'],
    edits: true,
    enabled: (s) => hasElements(s) && wrapElements(s.doc, selectedElementIds(s.selection)) !== s.doc,
    perform: (s) => withBranchSelected(s, wrapElements(s.doc, selectedElementIds(s.selection)), selectedElementIds(s.selection)[0]),
  },
  'add-branch-below': {
    name: 'add-branch-below',
    label: 'Add branch below',
    group: 'element',
    shortcuts: ['B'],
    edits: true,
    enabled: hasFocus,
    perform: (s) => {
      const focus = focusElementId(s.selection);
      if (focus === undefined) return;
      return withBranchSelected(s, addBranchUnder(s.doc, focus), focus);
    },
  },
  'move-element-left': {
    name: 'move-element-left',
    label: 'Move left along the rung',
    group: 'element',
    shortcuts: ['Alt+ArrowLeft'],
    edits: true,
    enabled: (s) => hasFocus(s) && moveElementBy(s.doc, focusElementId(s.selection) as string, -1) !== s.doc,
    perform: (s) => ({ doc: moveElementBy(s.doc, focusElementId(s.selection) as string, -1) }),
  },
  'move-element-right': {
    name: 'move-element-right',
    label: 'Move right along the rung',
    group: 'element',
    shortcuts: ['Alt+ArrowRight'],
    edits: true,
    enabled: (s) => hasFocus(s) && moveElementBy(s.doc, focusElementId(s.selection) as string, 1) !== s.doc,
    perform: (s) => ({ doc: moveElementBy(s.doc, focusElementId(s.selection) as string, 1) }),
  },
  copy: {
    name: 'copy',
    label: 'Copy',
    group: 'clipboard',
    shortcuts: ['Mod+C'],
    edits: false,
    enabled: (s) => hasElements(s) || selectedRungIds(s.selection).length > 0,
    perform: (s) => ({ clipboard: copyOf(s) }),
  },
  cut: {
    name: 'cut',
    label: 'Cut',
    group: 'clipboard',
    shortcuts: ['Mod+X'],
    edits: true,
    enabled: (s) => hasElements(s) || selectedRungIds(s.selection).length > 0,
    perform: (s) => {
      const clipboard = copyOf(s);
      const rungIds = selectedRungIds(s.selection);
      const doc = rungIds.length > 0 ? deleteRungs(s.doc, rungIds) : deleteElements(s.doc, selectedElementIds(s.selection));
      return { doc, clipboard, selection: NO_SELECTION };
    },
  },
  paste: {
    name: 'paste',
    label: 'Paste',
    group: 'clipboard',
    shortcuts: ['Mod+V'],
    edits: true,
    enabled: (s) => s.clipboard !== null && (s.clipboard.kind === 'rungs' || pasteSlot(s) !== undefined),
    perform: (s) => {
      const clip = s.clipboard;
      if (!clip) return;
      if (clip.kind === 'rungs') {
        const anchor = selectionRungId(s.doc, s.selection);
        const at = anchor === undefined ? s.doc.rungs.length : s.doc.rungs.findIndex((r) => r.id === anchor) + 1;
        const pasted = pasteRungs(s.doc, at, clip.rungs);
        return { doc: pasted.doc, selection: selectRungs(pasted.rungIds) };
      }
      const slot = pasteSlot(s);
      if (!slot) return;
      const copies = freshCopies(s.doc, clip.elements);
      const doc = insertAtSlot(s.doc, slot, copies);
      return doc === s.doc ? undefined : { doc, selection: selectElements(copies.map((n) => n.id)) };
    },
  },
} as const satisfies Partial<Record<CommandName, Command>>;

/**
 * A branch command's result with the new empty branch's slot selected: the next key press or
 * palette click then goes into the branch (the seal-in contact under a start button), not on in
 * series after the element the branch was drawn from.
 */
function withBranchSelected(s: EditorState, doc: EditorState['doc'], elementId: string | undefined) {
  const rungId = elementId === undefined ? undefined : rungOfElement(s.doc, elementId);
  const slot = rungId === undefined ? undefined : newEmptyBranchSlot(s.doc, doc, rungId);
  return slot ? { doc, selection: selectSlot(slot) } : { doc };
}

function copyOf(s: EditorState): EditorState['clipboard'] {
  const rungIds = new Set(selectedRungIds(s.selection));
  if (rungIds.size > 0) return { kind: 'rungs', rungs: s.doc.rungs.filter((r) => rungIds.has(r.id)) };
  return { kind: 'elements', elements: selectedNodes(s) };
}

function pasteSlot(s: EditorState) {
  if (s.selection.kind === 'slot') return s.selection.slot;
  const focus = focusElementId(s.selection);
  return focus === undefined ? undefined : slotAfter(s.doc, focus);
}

/** After deleting elements, stand on the slot where the first of them was, so typing can go on. */
function slotAfterDeletion(s: EditorState, ids: readonly string[]) {
  const first = ids[0];
  const located = first === undefined ? null : findElement(s.doc, first);
  if (!located) return NO_SELECTION;
  const slot = slotAfter(s.doc, located.element.id);
  if (!slot || slot.path.length !== located.path.length - 1) return NO_SELECTION;
  return { kind: 'slot' as const, slot: { ...slot, index: Math.max(0, slot.index - 1) } };
}
