/**
 * Resolves a validated panel layout into index-based circuits the simulation walks every scan:
 * which device contact feeds which input, each load's circuit (output, series contacts), the two
 * commons, the interlocks, what feeds each motor and what each overload measures. Done once per
 * simulation, so the scan loop does no look-ups by name.
 */
import { parseAddress } from '../ladder/addresses';
import { modelOf, STEP_ORDER, type AnyDeviceModel } from './devices';
import type { DeviceKind } from './devices/model';
import type { ContactRef, DeviceSpec, PanelLayout } from './layout';
import { feedingContact } from './parseLayout';

/** One contact of one device, by device index. */
export interface WiredContact {
  readonly device: number;
  readonly contact: string;
  /** `F1 95-96`, for messages. */
  readonly label: string;
  /** Index of this contact in `Wiring.contacts`: the simulation keeps each one's state in a bit array. */
  readonly slot: number;
}

/** A device contact wired to a PLC input. */
export interface InputWire extends WiredContact {
  /** 1-based input number: `%IX<index>`. */
  readonly index: number;
  readonly address: string;
}

/** A load's circuit: the output that drives it and the hardwired contacts in series. */
export interface LoadCircuit {
  readonly device: number;
  /** 1-based output number: `%QX<output>`. */
  readonly output: number;
  readonly address: string;
  readonly through: readonly WiredContact[];
}

export interface InterlockLink {
  readonly device: number;
  readonly a: number;
  readonly b: number;
}

export interface MotorFeed {
  readonly device: number;
  readonly feeders: readonly { readonly contactor: number; readonly direction: 'forward' | 'reverse' }[];
}

export interface Wiring {
  readonly panel: PanelLayout;
  readonly devices: readonly DeviceSpec[];
  readonly models: readonly AnyDeviceModel[];
  readonly indexOf: ReadonlyMap<string, number>;
  readonly inputs: readonly InputWire[];
  readonly loads: readonly LoadCircuit[];
  /** For each device, the index of its load circuit in `loads`, or -1. */
  readonly loadOf: readonly number[];
  readonly inputCommon: readonly WiredContact[];
  readonly outputCommon: readonly WiredContact[];
  readonly interlocks: readonly InterlockLink[];
  /** For each device, the motor feed if it is a motor. */
  readonly motorFeeds: readonly (MotorFeed | null)[];
  /** For each device, the index of the motor an overload measures, or -1. */
  readonly measures: readonly number[];
  /** Device indices in the order the field advances (see `STEP_ORDER`). */
  readonly stepOrder: readonly number[];
  /** Every wired contact, by slot. */
  readonly contacts: readonly WiredContact[];
  /** For each device, the slots of its wired contacts (to refresh when its state changes). */
  readonly slotsOf: readonly (readonly number[])[];
}

function indexOfAddress(text: string): number {
  const parsed = parseAddress(text);
  // parsePanelLayout has already refused any address that does not parse.
  return parsed.ok ? parsed.value.index : -1;
}

/** Build the wiring of a layout that `parsePanelLayout` accepted. */
export function wirePanel(panel: PanelLayout): Wiring {
  const devices = panel.devices;
  const models = devices.map((d) => modelOf(d.kind));
  const indexOf = new Map(devices.map((d, i) => [d.id, i] as const));
  const contacts: WiredContact[] = [];
  const slotsOf: number[][] = devices.map(() => []);
  const register = <C extends WiredContact>(contact: Omit<C, 'slot'>): C => {
    const wired = { ...contact, slot: contacts.length } as C;
    contacts.push(wired);
    slotsOf[wired.device]?.push(wired.slot);
    return wired;
  };
  const wire = (ref: ContactRef): WiredContact =>
    register({ device: indexOf.get(ref.device) ?? -1, contact: ref.contact, label: `${ref.device} ${ref.contact}` });
  const inputs: InputWire[] = [];
  const loads: LoadCircuit[] = [];
  const loadOf = devices.map(() => -1);
  devices.forEach((device, i) => {
    if (device.feeds !== undefined) {
      const contact = feedingContact(device) ?? '';
      inputs.push(register<InputWire>({ device: i, contact, label: `${device.id} ${contact}`, index: indexOfAddress(device.feeds), address: device.feeds.toUpperCase() }));
    }
    if (device.drivenBy !== undefined) {
      loadOf[i] = loads.length;
      loads.push({ device: i, output: indexOfAddress(device.drivenBy), address: device.drivenBy.toUpperCase(), through: device.through.map(wire) });
    }
  });
  inputs.sort((a, b) => a.index - b.index);
  const interlocks: InterlockLink[] = [];
  const motorFeeds: (MotorFeed | null)[] = devices.map(() => null);
  const measures = devices.map(() => -1);
  // The couplings come from each model's links: no kind is named here.
  devices.forEach((device, i) => {
    const links = models[i]!.links?.(device.params) ?? [];
    const interlocked = links.filter((l) => l.role === 'interlocks');
    if (interlocked.length === 2) {
      interlocks.push({ device: i, a: indexOf.get(interlocked[0]!.device) ?? -1, b: indexOf.get(interlocked[1]!.device) ?? -1 });
    }
    const feeders = links.filter((l) => l.role === 'fedBy');
    if (models[i]!.gathers === 'supply') {
      motorFeeds[i] = { device: i, feeders: feeders.map((f) => ({ contactor: indexOf.get(f.device) ?? -1, direction: f.direction ?? 'forward' })) };
    }
    const measured = links.find((l) => l.role === 'measures');
    if (measured !== undefined) measures[i] = indexOf.get(measured.device) ?? -1;
  });
  const inputCommon = panel.inputCommon.map(wire);
  const outputCommon = panel.outputCommon.map(wire);
  const stepOrder = devices
    .map((d, i) => ({ i, order: STEP_ORDER[d.kind as DeviceKind] }))
    .filter(({ i }) => models[i]!.step !== undefined)
    .sort((a, b) => a.order - b.order || a.i - b.i)
    .map(({ i }) => i);
  return {
    panel,
    devices,
    models,
    indexOf,
    inputs,
    loads,
    loadOf,
    inputCommon,
    outputCommon,
    interlocks,
    motorFeeds,
    measures,
    stepOrder,
    contacts,
    slotsOf,
  };
}
