/**
 * `parsePanelLayout`: the one door a panel layout comes in by. The zod schema checks the shape;
 * then every cross reference is checked (device ids unique, addresses on the panel and wired once,
 * contacts that exist, interlocks between two contactors, an overload measuring a motor…). Every
 * problem comes back as a located message; nothing is thrown.
 */
import { addressInRange, parseAddress, type Area } from '../ladder/addresses';
import { DEVICE_KINDS, modelOf } from './devices';
import type { DeviceKind } from './devices/model';
import { formatIssues } from './issues';
import { PanelLayoutSchema, type ContactRef, type DeviceSpec, type PanelLayout } from './layout';

/** A parsed layout, or every problem found in it. */
export type LayoutResult = { ok: true; value: PanelLayout } | { ok: false; errors: string[] };

/** Loads that a PLC output can drive. */
/** "a contactor, a lamp or a horn": the kinds an output may drive, in words. */
const LOAD_NOUNS = ((): string => {
  const nouns = DEVICE_KINDS.filter((k) => modelOf(k).load === true).map((k) => modelOf(k).noun.replace(/^an? /, ''));
  return nouns.length < 2 ? `a ${nouns.join('')}` : `a ${nouns.slice(0, -1).join(', a ')} or a ${nouns.at(-1)!}`;
})();

/** Validate JSON (already parsed) as a panel layout. */
export function parsePanelLayout(json: unknown): LayoutResult {
  const kindErrors = unknownKinds(json);
  if (kindErrors.length > 0) return { ok: false, errors: kindErrors };
  const parsed = PanelLayoutSchema.safeParse(json);
  if (!parsed.success) return { ok: false, errors: formatIssues(parsed.error) };
  const errors = crossCheck(parsed.data);
  return errors.length === 0 ? { ok: true, value: parsed.data } : { ok: false, errors };
}

/** zod's message for an unknown discriminator is vague; name the kinds instead. */
function unknownKinds(json: unknown): string[] {
  if (typeof json !== 'object' || json === null) return [];
  const devices = (json as { devices?: unknown }).devices;
  if (!Array.isArray(devices)) return [];
  const errors: string[] = [];
  devices.forEach((entry: unknown, i) => {
    const kind = typeof entry === 'object' && entry !== null ? (entry as { kind?: unknown }).kind : undefined;
    if (typeof kind !== 'string' || !(DEVICE_KINDS as string[]).includes(kind)) {
      errors.push(`devices[${i}].kind: unknown device kind ${JSON.stringify(kind)}; use one of ${DEVICE_KINDS.join(', ')}`);
    }
  });
  return errors;
}

/** The contacts a device offers, as "11-12 (NC), 21-22 (NC)". */
export function describeContacts(device: DeviceSpec): string {
  const contacts = modelOf(device.kind).contacts(device.params);
  return contacts.map((c) => `${c.name} (${c.form})`).join(', ');
}

/** The contact a `feeds` entry uses: the one named, or the device's first. */
export function feedingContact(device: DeviceSpec): string | undefined {
  return device.contact ?? modelOf(device.kind).contacts(device.params)[0]?.name;
}

function crossCheck(panel: PanelLayout): string[] {
  const errors: string[] = [];
  const byId = new Map<string, DeviceSpec>();
  panel.devices.forEach((device, i) => {
    if (byId.has(device.id)) errors.push(`devices[${i}].id: "${device.id}" is used by two devices`);
    else byId.set(device.id, device);
  });
  const space = { inputs: panel.inputs, outputs: panel.outputs, memory: 0 };
  const inputsUsed = new Map<number, string>();
  const outputsUsed = new Map<number, string>();

  const checkRef = (ref: ContactRef, where: string): void => {
    const device = byId.get(ref.device);
    if (!device) return void errors.push(`${where}.device: no device "${ref.device}" on this panel`);
    const names = modelOf(device.kind).contacts(device.params).map((c) => c.name);
    if (names.length === 0) return void errors.push(`${where}: ${device.id} (${modelOf(device.kind).noun}) has no contacts`);
    if (!names.includes(ref.contact)) {
      errors.push(`${where}.contact: ${device.id} has no contact "${ref.contact}"; it has ${describeContacts(device)}`);
    }
  };

  const checkAddress = (text: string, area: Area, where: string, used: Map<number, string>, owner: string): void => {
    const parsed = parseAddress(text);
    if (!parsed.ok) return void errors.push(`${where}: ${parsed.error}`);
    const wanted = area === 'I' ? 'an input such as %IX1' : 'an output such as %QX1';
    if (parsed.value.area !== area) return void errors.push(`${where}: ${text} is not ${wanted}`);
    const range = addressInRange(parsed.value, space);
    if (range) return void errors.push(`${where}: ${range}`);
    const other = used.get(parsed.value.index);
    if (other !== undefined) return void errors.push(`${where}: ${text} is already wired to ${other}`);
    used.set(parsed.value.index, owner);
  };

  const expectKind = (id: string, kind: DeviceKind, where: string): void => {
    const device = byId.get(id);
    if (!device) errors.push(`${where}: no device "${id}" on this panel`);
    else if (device.kind !== kind) {
      errors.push(`${where}: "${id}" is ${modelOf(device.kind).noun}, not ${modelOf(kind).noun}`);
    }
  };

  panel.devices.forEach((device, i) => {
    const at = `devices[${i}]`;
    const model = modelOf(device.kind);
    if (device.feeds !== undefined) {
      if (model.contacts(device.params).length === 0) {
        errors.push(`${at}.feeds: ${device.id} (${model.noun}) has no contact to wire to an input`);
      } else {
        checkAddress(device.feeds, 'I', `${at}.feeds`, inputsUsed, device.id);
        if (device.contact !== undefined) checkRef({ device: device.id, contact: device.contact }, at);
      }
    } else if (device.contact !== undefined) {
      errors.push(`${at}.contact: "contact" says which contact feeds an input; add "feeds" or remove it`);
    }
    if (device.drivenBy !== undefined) {
      if (model.load !== true) {
        errors.push(`${at}.drivenBy: ${device.id} is ${model.noun}; an output drives ${LOAD_NOUNS}`);
      } else {
        checkAddress(device.drivenBy, 'Q', `${at}.drivenBy`, outputsUsed, device.id);
      }
    }
    if (device.through.length > 0 && device.drivenBy === undefined) {
      errors.push(`${at}.through: series contacts belong to a load's circuit; add "drivenBy" or remove them`);
    }
    device.through.forEach((ref, j) => checkRef(ref, `${at}.through[${j}]`));
    for (const link of model.links?.(device.params) ?? []) expectKind(link.device, link.kind, `${at}.params.${link.path}`);
    for (const problem of model.checkLinks?.(device.params) ?? []) errors.push(`${at}.params.${problem}`);
  });
  panel.inputCommon.forEach((ref, j) => checkRef(ref, `inputCommon[${j}]`));
  panel.outputCommon.forEach((ref, j) => checkRef(ref, `outputCommon[${j}]`));
  return errors;
}
