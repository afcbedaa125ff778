/**
 * The keyboard sheet (`?`): every key of the workbench, generated from the command registry, the
 * palette and the panel's bindings, grouped by the area it acts in. Nothing is listed by hand, so
 * a new command or a new device control appears here by itself.
 */
import type { PanelLayout } from '@shared/field/layout';
import { panelKeyBindings, type PanelControl } from '@/simulation/panelKeys';
import { COMMANDS, shortcutLabel } from './commands/registry';
import type { Command, CommandArea } from './commands/types';
import { PALETTE } from './palette';

/** Where a group of keys acts. */
export type KeyArea = CommandArea | 'panel';

export interface KeyRow {
  /** What the key does. */
  action: string;
  /** The keys, as shown (`Ctrl+Z`, `Shift+C`, `2`). */
  keys: string[];
}

export interface KeySection {
  area: KeyArea;
  title: string;
  /** When the keys of this area act. */
  when: string;
  rows: KeyRow[];
}

const AREA_TEXT = {
  page: { title: 'Anywhere on the workbench', when: 'Outside text fields (Ctrl/⌘+S works in them too).' },
  editor: { title: 'Rungs and palette', when: 'While the rungs or the palette have the focus (click the rungs, or Tab to them).' },
  panel: { title: 'Field panel', when: 'While the field panel has the focus (click the panel or one of its devices, or Tab to it).' },
} as const satisfies Record<KeyArea, { title: string; when: string }>;

const CONTROL_WORDS = {
  hold: 'hold down (Shift+key keeps it pressed)',
  toggle: 'press / reset',
  cycle: 'next position',
  trip: 'trip test',
  reset: 'reset',
  load: 'next motor load',
  box: 'put / take away a box',
} as const satisfies Record<PanelControl, string>;

const label = (shortcut: string, isMac: boolean) => shortcutLabel(shortcut, isMac);

/** The sheet for the panel in use (its own bindings), with Mac or PC modifier names. */
export function keyboardSheet(panel: Pick<PanelLayout, 'devices'> | null, isMac = false): KeySection[] {
  const commands = (Object.values(COMMANDS) as Command[]).filter((c) => c.shortcuts.length > 0);
  const rowsOf = (area: CommandArea): KeyRow[] =>
    commands.filter((c) => (c.area ?? 'editor') === area).map((c) => ({ action: c.label, keys: c.shortcuts.map((s) => label(s, isMac)) }));
  const palette: KeyRow[] = PALETTE.filter((item) => item.shortcut !== '').map((item) => ({ action: `Insert ${item.name}`, keys: [label(item.shortcut, isMac)] }));
  const sections: KeySection[] = [
    { area: 'page', ...AREA_TEXT.page, rows: rowsOf('page') },
    { area: 'editor', ...AREA_TEXT.editor, rows: [...rowsOf('editor'), ...palette] },
  ];
  if (panel) {
    const labels = new Map(panel.devices.map((d) => [d.id, d.label]));
    const rows = panelKeyBindings(panel).map((b) => ({ action: `${b.deviceId} ${labels.get(b.deviceId) ?? ''}: ${CONTROL_WORDS[b.control]}`.replace(/ +:/, ':'), keys: [b.key.toUpperCase()] }));
    sections.push({ area: 'panel', ...AREA_TEXT.panel, rows });
  }
  return sections;
}
