import { describe, expect, it } from 'vitest';
import { builtInPanel, type PanelLayout } from '@shared/field';
import { bindingForKey, keyIsForPanel, panelKeyBindings, type PanelKeyEvent } from '@/simulation/panelKeys';

describe('keyboard bindings for a panel layout', () => {
  it('gives the default panel digits for S0..S4 and hinting letters for the rest', () => {
    const bindings = panelKeyBindings(builtInPanel('reversing-conveyor')!);
    const keyOf = (id: string, control: string) => bindings.find((b) => b.deviceId === id && b.control === control)?.key;
    expect(keyOf('S0', 'toggle')).toBe('0');
    expect(keyOf('S1', 'hold')).toBe('1');
    expect(keyOf('S2', 'hold')).toBe('2');
    expect(keyOf('S3', 'hold')).toBe('3');
    expect(keyOf('S4', 'cycle')).toBe('4');
    expect(keyOf('F1', 'trip')).toBe('t');
    expect(keyOf('F1', 'reset')).toBe('r');
    expect(keyOf('M1', 'load')).toBe('l');
    expect(keyOf('B1', 'box')).toBe('b');
    expect(new Set(bindings.map((b) => b.key)).size).toBe(bindings.length);
    expect(bindings.some((b) => b.deviceId === 'K1' || b.deviceId === 'P1')).toBe(false);
  });

  it('binds every control of a layout with many buttons, each to a key of its own', () => {
    const devices = Array.from({ length: 20 }, (_, i) => ({ id: `S${i + 1}`, kind: 'pushbutton' })) as unknown as PanelLayout['devices'];
    const bindings = panelKeyBindings({ devices });
    expect(bindings).toHaveLength(20);
    expect(new Set(bindings.map((b) => b.key)).size).toBe(20);
    expect(bindingForKey(bindings, '9')!.deviceId).toBe('S9');
    expect(bindingForKey(bindings, 'S')!.deviceId).toBe('S10');
  });
});

describe('the focus rule of the panel keys', () => {
  /** A stand-in for the panel element: it holds exactly the nodes listed. */
  const panelHolding = (...nodes: unknown[]) => ({ contains: (n: Node | null) => nodes.includes(n) });
  const event = (target: unknown, mods: Partial<PanelKeyEvent> = {}): PanelKeyEvent => ({ target: target as EventTarget, ctrlKey: false, metaKey: false, altKey: false, ...mods });
  const button = { closest: () => null };
  const fieldInPanel = { closest: (s: string) => (s.includes('input') ? {} : null) };

  it('gives a key to the panel only while the focus is inside it', () => {
    expect(keyIsForPanel(event(button), panelHolding(button))).toBe(true);
    const canvas = { closest: () => null };
    expect(keyIsForPanel(event(canvas), panelHolding(button))).toBe(false);
    expect(keyIsForPanel(event(null), panelHolding(button))).toBe(false);
    expect(keyIsForPanel(event(button), null)).toBe(false);
  });

  it('leaves chords with Ctrl, Cmd or Alt and text fields inside the panel alone', () => {
    const panel = panelHolding(button, fieldInPanel);
    expect(keyIsForPanel(event(button, { ctrlKey: true }), panel)).toBe(false);
    expect(keyIsForPanel(event(button, { metaKey: true }), panel)).toBe(false);
    expect(keyIsForPanel(event(button, { altKey: true }), panel)).toBe(false);
    expect(keyIsForPanel(event(fieldInPanel), panel)).toBe(false);
  });
});
