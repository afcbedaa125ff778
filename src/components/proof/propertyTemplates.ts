/**
 * The templates the Proof tab adds properties from, built from the panel in use: which outputs
 * drive which devices, which button is the stop, which device is the e-stop, which state words a
 * device has. Each template turns a few choices into a property (data, never code); a choice the
 * panel does not offer gives a message instead of a property.
 */
import type { DeviceSpec, PanelLayout } from '@shared/field/layout';
import { modelOf } from '@shared/field/devices';
import type { Property } from '@shared/proof';
import { UNOBSERVABLE_KINDS } from '@shared/proof/abstraction';

export type TemplateKind = 'never-together' | 'estop-clears' | 'stop-wins' | 'reachable' | 'responds';

export const TEMPLATE_TITLES: Readonly<Record<TemplateKind, string>> = {
  'never-together': 'Never together',
  'estop-clears': 'E-stop removes every output',
  'stop-wins': 'Stop wins over start',
  reachable: 'Can happen',
  responds: 'After … within … ms',
};

/** An output of the panel with the device it drives: `%QX1` → K1 (Forward contactor). */
export interface OutputChoice {
  address: string;
  device: string;
  label: string;
}

/** A device state a property can name: `K1` `closed`. */
export interface StateChoice {
  device: string;
  word: string;
}

/** The outputs that drive a device, contactors first (the usual pair for "never together"). */
export function outputChoices(panel: PanelLayout): OutputChoice[] {
  const driven = panel.devices.filter((d) => d.drivenBy !== undefined);
  const rank = (d: DeviceSpec) => (d.kind === 'contactor' ? 0 : 1);
  return [...driven].sort((a, b) => rank(a) - rank(b)).map((d) => ({ address: d.drivenBy!, device: d.id, label: d.label }));
}

/** The devices a property may name (not a motor, whose speed the proof does not model), with their words. */
export function nameableDevices(panel: PanelLayout): { device: DeviceSpec; words: readonly string[] }[] {
  return panel.devices
    .filter((d) => UNOBSERVABLE_KINDS[d.kind] === undefined && d.kind !== 'interlock')
    .map((d) => ({ device: d, words: modelOf(d.kind).words(d.params) }));
}

/** The momentary pushbuttons; the stop is the NC one or the red one, when there is one. */
export function pushbuttons(panel: PanelLayout): DeviceSpec[] {
  return panel.devices.filter((d) => d.kind === 'pushbutton');
}

export function guessStop(panel: PanelLayout): string | null {
  const buttons = pushbuttons(panel);
  const nc = buttons.find((d) => (d.params as { form?: string }).form === 'NC');
  const red = buttons.find((d) => (d.params as { colour?: string }).colour === 'red');
  return (nc ?? red)?.id ?? null;
}

export function estopOf(panel: PanelLayout): string | null {
  return panel.devices.find((d) => d.kind === 'estop')?.id ?? null;
}

export type Built = { ok: true; property: Property } | { ok: false; error: string };

const need = (error: string): Built => ({ ok: false, error });

/** "K1 and K2 are never commanded together": two outputs never on in the same scan. */
export function neverTogether(a: string, b: string): Built {
  if (!a || !b) return need('Pick two outputs.');
  if (a === b) return need('Pick two different outputs.');
  return { ok: true, property: { never: { [a]: true, [b]: true } } };
}

/** "While the e-stop is pressed every output is off": every chosen output false while it is pressed. */
export function estopClears(panel: PanelLayout, outputs: readonly string[]): Built {
  const estop = estopOf(panel);
  if (!estop) return need('This panel has no e-stop.');
  if (outputs.length === 0) return need('Pick at least one output.');
  return { ok: true, property: { always: Object.fromEntries(outputs.map((a) => [a, false])), when: { [estop]: 'pressed' } } };
}

/** "While stop and start are both pressed, the contactor's coil output is off." */
export function stopWins(stop: string, start: string, coil: string): Built {
  if (!stop || !start || !coil) return need('Pick the stop button, the start button and the contactor output.');
  if (stop === start) return need('The stop and start buttons must be two different buttons.');
  return { ok: true, property: { always: { [coil]: false }, when: { [stop]: 'pressed', [start]: 'pressed' } } };
}

/** "P3 can be lit". */
export function reachable(state: StateChoice): Built {
  if (!state.device || !state.word) return need('Pick a device and its state.');
  return { ok: true, property: { reachable: { [state.device]: state.word } } };
}

/** "After S1 is pressed, K1 is open within 100 ms". */
export function responds(trigger: StateChoice, withinMs: number, expect: StateChoice): Built {
  if (!trigger.device || !trigger.word || !expect.device || !expect.word) return need('Pick the trigger and the expected state.');
  if (!Number.isInteger(withinMs) || withinMs < 0) return need('The time is a whole number of ms, 0 or more.');
  return { ok: true, property: { after: { [trigger.device]: trigger.word }, within: withinMs, expect: { [expect.device]: expect.word } } };
}
