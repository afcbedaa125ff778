/**
 * Keyboard bindings for any panel layout: every control of every device gets one key, worked out
 * from the layout so an instructor's own panel is as reachable from the keyboard as the default.
 * Pushbuttons numbered S0..S9 take their digit (S2 forward → "2"); other controls take a letter
 * that hints at what they do (t = trip test, r = reset, l = load, b = box at the photo-eye).
 */
import type { DeviceKind, PanelLayout } from '@shared/field';

/** One thing a student can do on the panel with a key. */
export type PanelControl = 'hold' | 'toggle' | 'cycle' | 'trip' | 'reset' | 'load' | 'box';

/** The controls each device kind offers; devices with none (lamps, contactors) get no key. */
export const CONTROLS_BY_KIND = {
  pushbutton: ['hold'],
  estop: ['toggle'],
  selector: ['cycle'],
  contactor: [],
  interlock: [],
  overload: ['trip', 'reset'],
  lamp: [],
  horn: [],
  motor: ['load'],
  photoeye: ['box'],
  limit: ['hold'],
} as const satisfies Record<DeviceKind, readonly PanelControl[]>;

/** Letters tried first for a control, before the device's own letter and then the alphabet. */
const PREFERRED = { hold: [], toggle: ['e'], cycle: [], trip: ['t'], reset: ['r'], load: ['l'], box: ['b'] } as const satisfies Record<
  PanelControl,
  readonly string[]
>;

export interface KeyBinding {
  deviceId: string;
  control: PanelControl;
  /** A single lower-case letter or digit, as `KeyboardEvent.key` gives it (lower-cased). */
  key: string;
}

const ALPHABET = 'abcdefghijklmnopqrstuvwxyz0123456789'.split('');

/** One key per control, in layout order; a panel with more controls than keys leaves the rest unbound. */
export function panelKeyBindings(panel: Pick<PanelLayout, 'devices'>): KeyBinding[] {
  const used = new Set<string>();
  const bindings: KeyBinding[] = [];
  // Digits first for S0..S9, so no letter rule can take "2" away from S2.
  const digitOf = new Map<string, string>();
  for (const device of panel.devices) {
    const match = /^S([0-9])$/.exec(device.id);
    if (match && CONTROLS_BY_KIND[device.kind].length > 0 && !used.has(match[1]!)) {
      digitOf.set(device.id, match[1]!);
      used.add(match[1]!);
    }
  }
  for (const device of panel.devices) {
    const controls: readonly PanelControl[] = CONTROLS_BY_KIND[device.kind];
    controls.forEach((control, n) => {
      let key: string | undefined;
      if (n === 0 && digitOf.has(device.id)) key = digitOf.get(device.id);
      else {
        const own = device.id[0]!.toLowerCase();
        key = [...PREFERRED[control], own, ...ALPHABET].find((k) => !used.has(k));
      }
      if (key === undefined) return;
      used.add(key);
      bindings.push({ deviceId: device.id, control, key });
    });
  }
  return bindings;
}

/** The binding for a key press, ignoring case; undefined when the key is not bound. */
export function bindingForKey(bindings: readonly KeyBinding[], key: string): KeyBinding | undefined {
  const k = key.toLowerCase();
  return bindings.find((b) => b.key === k);
}

/** What of a key event the focus rule reads (a DOM `KeyboardEvent` fits). */
export interface PanelKeyEvent {
  target: EventTarget | null;
  ctrlKey: boolean;
  metaKey: boolean;
  altKey: boolean;
}

/**
 * The focus rule: a panel key acts only while the keyboard focus is inside the field panel (a
 * device's button, or the panel itself), never while it is on the rungs, the palette or anywhere
 * else, where the same letters are editor keys (T inserts a TON there, trips F1 here). A text
 * field inside the panel, and any chord with Ctrl, Cmd or Alt, are not for the panel either.
 */
export function keyIsForPanel(event: PanelKeyEvent, panel: { contains(node: Node | null): boolean } | null): boolean {
  if (event.ctrlKey || event.metaKey || event.altKey || panel === null) return false;
  const target = event.target as (Node & Partial<Pick<HTMLElement, 'closest'>>) | null;
  if (target === null || !panel.contains(target)) return false;
  if (typeof target.closest !== 'function') return true;
  return target.closest('input, textarea, select, [contenteditable="true"], [role="textbox"]') === null;
}
