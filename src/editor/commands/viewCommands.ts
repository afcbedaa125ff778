/** Commands that act on the view, the history or the file: they call the effects they are given. */
import { focusElementId } from '../selection';
import type { Command, CommandName, EditorEffects } from './types';

const effect = (
  name: CommandName,
  label: string,
  group: Command['group'],
  shortcuts: readonly string[],
  run: (effects: EditorEffects) => void,
): Command => ({ name, label, group, shortcuts, edits: false, enabled: () => true, perform: (_s, effects) => run(effects) });

export const VIEW_COMMANDS = {
  undo: effect('undo', 'Undo', 'history', ['Mod+Z'], (e) => e.undo()),
  redo: effect('redo', 'Redo', 'history', ['Shift+Mod+Z', 'Mod+Y'], (e) => e.redo()),
  save: { ...effect('save', 'Save a version…', 'file', ['Mod+S'], (e) => e.save()), area: 'page', enabled: (s) => !s.readOnly },
  'zoom-in': effect('zoom-in', 'Zoom in', 'view', ['Mod+=', 'Mod++', '+'], (e) => e.zoomBy(1.2)),
  'zoom-out': effect('zoom-out', 'Zoom out', 'view', ['Mod+-', '-'], (e) => e.zoomBy(1 / 1.2)),
  'zoom-reset': effect('zoom-reset', 'Actual size', 'view', ['Mod+0'], (e) => e.zoomReset()),
  'fit-to-view': effect('fit-to-view', 'Fit to view', 'view', ['Shift+F'], (e) => e.fitToView()),
  'toggle-text-form': effect('toggle-text-form', 'Show text form of rungs', 'view', ['Shift+T'], (e) => e.toggleTextForm()),
  'show-structured-text': effect('show-structured-text', 'Structured Text view', 'view', ['Shift+S'], (e) => e.showStructuredText()),
  'export-png': effect('export-png', 'Export as PNG', 'file', [], (e) => e.exportPng()),
  print: effect('print', 'Print…', 'file', ['Mod+P'], (e) => e.print()),
  'toggle-messages': effect('toggle-messages', 'Show messages', 'view', ['Shift+M'], (e) => e.toggleMessages()),
  'show-history': effect('show-history', 'Version history', 'file', ['Shift+H'], (e) => e.showHistory()),
  'show-keys': { ...effect('show-keys', 'Keyboard sheet', 'view', ['?'], (e) => e.showKeys()), area: 'page' },
  'edit-selection': {
    ...effect('edit-selection', 'Edit the selected element', 'element', ['Enter', 'F2'], (e) => e.editSelection()),
    enabled: (s) => focusElementId(s.selection) !== undefined || s.selection.kind === 'slot',
  },
} as const satisfies Partial<Record<CommandName, Command>>;
