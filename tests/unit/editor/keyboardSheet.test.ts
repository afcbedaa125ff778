import { describe, expect, it } from 'vitest';
import { builtInPanel } from '@shared/field/panels';
import { COMMANDS, shortcutLabel } from '@/editor/commands/registry';
import type { Command } from '@/editor/commands/types';
import { keyboardSheet } from '@/editor/keyboardSheet';
import { PALETTE } from '@/editor/palette';

const sheet = keyboardSheet(builtInPanel('reversing-conveyor')!);
const section = (area: string) => sheet.find((s) => s.area === area)!;

describe('the keyboard sheet', () => {
  it('lists every command that has a key, once, in the area it acts in', () => {
    for (const cmd of Object.values(COMMANDS) as Command[]) {
      if (cmd.shortcuts.length === 0) continue;
      const rows = sheet.flatMap((s) => s.rows.map((r) => ({ area: s.area, ...r }))).filter((r) => r.action === cmd.label);
      expect(rows, cmd.name).toEqual([{ area: cmd.area ?? 'editor', action: cmd.label, keys: cmd.shortcuts.map((k) => shortcutLabel(k)) }]);
    }
  });

  it('puts saving and the sheet itself on the page, editing on the rungs and palette, and every palette key', () => {
    expect(section('page').rows.map((r) => r.action)).toEqual(expect.arrayContaining(['Save a version…', 'Keyboard sheet']));
    expect(section('editor').rows.map((r) => r.action)).toEqual(expect.arrayContaining(['Undo', 'Add branch below', 'Delete']));
    for (const item of PALETTE.filter((i) => i.shortcut)) expect(section('editor').rows).toContainEqual({ action: `Insert ${item.name}`, keys: [item.shortcut] });
    expect(section('editor').when).toMatch(/rungs or the palette have the focus/);
  });

  it('lists the panel\'s own keys, T for the trip test among them, as acting while the panel has the focus', () => {
    const panel = section('panel');
    expect(panel.when).toMatch(/field panel has the focus/);
    expect(panel.rows).toContainEqual({ action: 'F1 Motor overload: trip test', keys: ['T'] });
    expect(panel.rows).toContainEqual({ action: 'S2 Forward: hold down (Shift+key keeps it pressed)', keys: ['2'] });
    // The same letter is an editor key too: the sheet says where each acts.
    expect(section('editor').rows).toContainEqual({ action: 'Insert TON', keys: ['T'] });
  });

  it('has no panel section without a panel, and names ⌘ on a Mac', () => {
    const mac = keyboardSheet(null, true);
    expect(mac.map((s) => s.area)).toEqual(['page', 'editor']);
    expect(mac[0]!.rows.find((r) => r.action === 'Save a version…')!.keys).toEqual(['⌘+S']);
  });
});
