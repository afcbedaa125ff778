/**
 * Commands on whole rungs and on the selection itself (arrow keys, select all). Rung changes are
 * the shared edits (`shared/ladder/edits.ts`), some through `../gestures`.
 */
import { duplicateRung, moveRung } from '@shared/ladder/edits';
import { elementsOfProgram } from '@shared/ladder/walk';
import { addEmptyRung, deleteRungs } from '../gestures';
import { moveSelection } from '../navigation';
import { NO_SELECTION, selectElements, selectRungs, selectedRungIds, selectSlot } from '../selection';
import { selectionRungId } from '../slots';
import type { Command, CommandName, EditorState } from './types';

const rungOf = (s: EditorState) => selectionRungId(s.doc, s.selection);
const rungIndex = (s: EditorState) => {
  const id = rungOf(s);
  return id === undefined ? -1 : s.doc.rungs.findIndex((r) => r.id === id);
};

/** A new empty rung at `at`, with its one slot selected so the next key press fills it. */
function newRungAt(s: EditorState, at: number) {
  const added = addEmptyRung(s.doc, at);
  if (added.rungId === null) return;
  return { doc: added.doc, selection: selectSlot({ rungId: added.rungId, path: [], index: 0 }) };
}

const select = (name: CommandName, label: string, key: string, direction: 'left' | 'right' | 'up' | 'down'): Command => ({
  name,
  label,
  group: 'selection',
  shortcuts: [key],
  edits: false,
  enabled: (s) => s.layout.rungs.length > 0,
  perform: (s) => ({ selection: moveSelection(s.layout, s.selection, direction) }),
});

export const RUNG_COMMANDS = {
  'select-left': select('select-left', 'Select to the left', 'ArrowLeft', 'left'),
  'select-right': select('select-right', 'Select to the right', 'ArrowRight', 'right'),
  'select-up': select('select-up', 'Select above', 'ArrowUp', 'up'),
  'select-down': select('select-down', 'Select below', 'ArrowDown', 'down'),
  'select-all': {
    name: 'select-all',
    label: 'Select all elements',
    group: 'selection',
    shortcuts: ['Mod+A'],
    edits: false,
    enabled: (s) => s.doc.rungs.length > 0,
    perform: (s) => ({ selection: selectElements(elementsOfProgram(s.doc).map((e) => e.element.id)) }),
  },
  'clear-selection': {
    name: 'clear-selection',
    label: 'Clear the selection',
    group: 'selection',
    shortcuts: ['Escape'],
    edits: false,
    enabled: (s) => s.selection.kind !== 'none',
    perform: (s) => {
      // Escape steps out: from elements or a slot to their rung, from a rung to nothing.
      if (s.selection.kind === 'rungs') return { selection: NO_SELECTION };
      const rung = rungOf(s);
      return { selection: rung === undefined ? NO_SELECTION : selectRungs([rung]) };
    },
  },
  'add-rung': {
    name: 'add-rung',
    label: 'Add rung below',
    group: 'rung',
    shortcuts: ['Mod+Enter'],
    edits: true,
    enabled: () => true,
    perform: (s) => newRungAt(s, rungIndex(s) < 0 ? s.doc.rungs.length : rungIndex(s) + 1),
  },
  'insert-rung-above': {
    name: 'insert-rung-above',
    label: 'Insert rung above',
    group: 'rung',
    shortcuts: ['Shift+Mod+Enter'],
    edits: true,
    enabled: () => true,
    perform: (s) => newRungAt(s, Math.max(0, rungIndex(s))),
  },
  'duplicate-rung': {
    name: 'duplicate-rung',
    label: 'Duplicate rung',
    group: 'rung',
    shortcuts: ['Mod+D'],
    edits: true,
    enabled: (s) => rungIndex(s) >= 0,
    perform: (s) => {
      const index = rungIndex(s);
      const rung = s.doc.rungs[index];
      if (!rung) return;
      const doc = duplicateRung(s.doc, { rungId: rung.id });
      const copy = doc.rungs[index + 1];
      return doc === s.doc || !copy ? undefined : { doc, selection: selectRungs([copy.id]) };
    },
  },
  'move-rung-up': {
    name: 'move-rung-up',
    label: 'Move rung up',
    group: 'rung',
    shortcuts: ['Alt+ArrowUp'],
    edits: true,
    enabled: (s) => rungIndex(s) > 0,
    perform: (s) => ({ doc: moveRung(s.doc, { rungId: rungOf(s) as string, offset: -1 }) }),
  },
  'move-rung-down': {
    name: 'move-rung-down',
    label: 'Move rung down',
    group: 'rung',
    shortcuts: ['Alt+ArrowDown'],
    edits: true,
    enabled: (s) => rungIndex(s) >= 0 && rungIndex(s) < s.doc.rungs.length - 1,
    perform: (s) => ({ doc: moveRung(s.doc, { rungId: rungOf(s) as string, offset: 1 }) }),
  },
  'delete-rung': {
    name: 'delete-rung',
    label: 'Delete rung',
    group: 'rung',
    shortcuts: ['Shift+Delete'],
    edits: true,
    enabled: (s) => rungIndex(s) >= 0,
    perform: (s) => {
      const ids = selectedRungIds(s.selection);
      return { doc: deleteRungs(s.doc, ids.length > 0 ? ids : [rungOf(s) as string]), selection: NO_SELECTION };
    },
  },
  'edit-rung-comment': {
    name: 'edit-rung-comment',
    label: 'Edit rung comment',
    group: 'rung',
    shortcuts: ['Shift+Enter'],
    edits: true,
    enabled: (s) => rungIndex(s) >= 0,
    perform: (s, effects) => effects.editRungComment(rungOf(s) as string),
  },
} as const satisfies Partial<Record<CommandName, Command>>;
