/**
 * The one command registry: toolbar, palette, keyboard and context menu all look commands up here
 * and run them through `runCommand`, so a gesture behaves the same wherever it starts.
 */
import { PALETTE } from '../palette';
import { ELEMENT_COMMANDS } from './elementCommands';
import { RUNG_COMMANDS } from './rungCommands';
import type { Command, CommandArgs, CommandName, CommandResult, EditorEffects, EditorState } from './types';
import { VIEW_COMMANDS } from './viewCommands';

export const COMMANDS = { ...ELEMENT_COMMANDS, ...RUNG_COMMANDS, ...VIEW_COMMANDS } as const satisfies Record<
  CommandName,
  Command
>;

export function command(name: CommandName): Command {
  return COMMANDS[name];
}

/** Can the command run now? Document commands never run on a read-only version. */
export function isEnabled(name: CommandName, state: EditorState, args?: CommandArgs): boolean {
  const cmd = command(name);
  if (cmd.edits && state.readOnly) return false;
  return cmd.enabled(state, args);
}

/** Run a command when it is enabled; `undefined` when it was not, or when it changed no state. */
export function runCommand(
  name: CommandName,
  state: EditorState,
  effects: EditorEffects,
  args?: CommandArgs,
): CommandResult | undefined {
  if (!isEnabled(name, state, args)) return undefined;
  return command(name).perform(state, effects, args) ?? undefined;
}

/** The parts of a keyboard event a shortcut depends on (a DOM `KeyboardEvent` fits). */
export interface KeyChord {
  key: string;
  ctrlKey: boolean;
  metaKey: boolean;
  shiftKey: boolean;
  altKey: boolean;
}

/**
 * Does the chord match a shortcut such as `Shift+Mod+Z`? `Mod` is Ctrl or Cmd. Letters compare
 * without case (Shift is matched by its own flag); a plain shortcut never matches with Ctrl, Cmd
 * or Alt held.
 */
export function matchesShortcut(chord: KeyChord, shortcut: string): boolean {
  const parts = shortcut.split('+');
  // `Mod++` splits into ['Mod', '', '']: the key is '+'.
  const key = shortcut.endsWith('++') ? '+' : (parts[parts.length - 1] as string);
  const mods = new Set(shortcut.endsWith('++') ? parts.slice(0, -2) : parts.slice(0, -1));
  const wantMod = mods.has('Mod');
  const hasMod = chord.ctrlKey || chord.metaKey;
  if (wantMod !== hasMod) return false;
  if (mods.has('Alt') !== chord.altKey) return false;
  const printable = key.length === 1 && !/[a-z]/i.test(key);
  // For printable symbols (`+`, `=`) Shift is part of how the key is typed; do not insist on it.
  if (!printable && mods.has('Shift') !== chord.shiftKey) return false;
  return chord.key.length === 1 ? chord.key.toLowerCase() === key.toLowerCase() : chord.key === key;
}

/** What a key chord does in the editor: a command and its argument, or `undefined`. */
export function commandForKey(chord: KeyChord): { name: CommandName; args?: CommandArgs } | undefined {
  for (const cmd of Object.values(COMMANDS) as Command[]) {
    if (cmd.shortcuts.some((s) => matchesShortcut(chord, s))) return { name: cmd.name };
  }
  for (const item of PALETTE) {
    if (item.shortcut !== '' && matchesShortcut(chord, item.shortcut)) return { name: 'insert-element', args: { item: item.key } };
  }
  return undefined;
}

/** A shortcut as shown in menus and tooltips, e.g. `Ctrl+Shift+Z`. */
export function shortcutLabel(shortcut: string, isMac = false): string {
  return shortcut
    .split('+')
    .map((part) => (part === 'Mod' ? (isMac ? '⌘' : 'Ctrl') : part.replace('Arrow', '')))
    .join('+')
    .replace(/\+\+$/, '++');
}
