/**
 * Checks a parsed script against the panel it will run on: every device exists and can take the
 * action (`step 4: "trip" needs the id of an overload relay, got "K1" (a contactor)`), selector
 * positions exist, and every `expect` names a device state word, an address on the panel, a tag or
 * a block member with a value of the right type. Tags and members are the program's business: a
 * program that lacks them fails the check at run time rather than making the script invalid.
 */
import { addressInRange, parseAddress } from '../ladder/addresses';
import { DEVICE_KINDS, modelOf } from '../field/devices';
import type { DeviceAction, DeviceKind } from '../field/devices/model';
import type { DeviceSpec, PanelLayout } from '../field/layout';
import { conditionsOf, type Property } from '../proof/property';
import { UNOBSERVABLE_KINDS } from '../proof/abstraction';
import { isCheckStep, stepAction, type CheckScript, type Expectation } from './script';

/** Memory bits the simulator gives every program (the engine's default space). */
export const MEMORY_BITS = 64;

/** The kinds that accept an action, e.g. trip → overload. */
export function kindsFor(action: DeviceAction): DeviceKind[] {
  return DEVICE_KINDS.filter((k) => modelOf(k).actions[action] !== undefined);
}

/** "an overload relay", "a pushbutton, an emergency stop or a limit switch". */
function nounsFor(action: DeviceAction): string {
  const nouns = kindsFor(action).map((k) => modelOf(k).noun);
  return nouns.length <= 1 ? (nouns[0] ?? 'no device') : `${nouns.slice(0, -1).join(', ')} or ${nouns[nouns.length - 1]}`;
}

const show = (value: Expectation): string => JSON.stringify(value);

/** "expect "open" or "closed"" for a device's words. */
function wordChoice(words: readonly string[]): string {
  const quoted = words.map((w) => `"${w}"`);
  return quoted.length <= 1 ? (quoted[0] ?? '') : `${quoted.slice(0, -1).join(', ')} or ${quoted[quoted.length - 1]}`;
}

function checkExpectKey(key: string, value: Expectation, panel: PanelLayout, byId: Map<string, DeviceSpec>, at: string): string | null {
  const device = byId.get(key);
  if (device) {
    const model = modelOf(device.kind);
    const words = model.words(device.params);
    if (typeof value !== 'string' || !words.includes(value)) {
      return `${at}: "${key}" is ${model.noun}: expect ${wordChoice(words)}, got ${show(value)}`;
    }
    return null;
  }
  if (key.startsWith('%')) {
    const parsed = parseAddress(key);
    if (!parsed.ok) return `${at}: ${parsed.error}`;
    const range = addressInRange(parsed.value, { inputs: panel.inputs, outputs: panel.outputs, memory: MEMORY_BITS });
    if (range) return `${at}: ${range}`;
    if (typeof value !== 'boolean') return `${at}: "${key}" is a bit: expect true or false, got ${show(value)}`;
    return null;
  }
  if (/^[A-Za-z_][A-Za-z0-9_]*\.[A-Za-z][A-Za-z0-9_]*$/.test(key)) {
    if (typeof value === 'string') return `${at}: "${key}" is a block value: expect true/false, a number or a range, got ${show(value)}`;
    return null;
  }
  if (/^[A-Za-z_][A-Za-z0-9_]*$/.test(key)) {
    if (typeof value !== 'boolean') {
      return `${at}: "${key}" is not a device on panel ${panel.id}; as a tag it is a bit: expect true or false, got ${show(value)}`;
    }
    return null;
  }
  return `${at}: "${key}" is neither a device, an address (%IX1), a tag nor a block value (T1.ET)`;
}

/** A bit a step may force: an address on the panel, or a tag (the program's business). */
function checkBitOperand(operand: string, panel: PanelLayout, at: string, action: string): string | null {
  if (operand.startsWith('%')) {
    const parsed = parseAddress(operand);
    if (!parsed.ok) return `${at}: "${action}": ${parsed.error}`;
    const range = addressInRange(parsed.value, { inputs: panel.inputs, outputs: panel.outputs, memory: MEMORY_BITS });
    return range ? `${at}: "${action}": ${range}` : null;
  }
  if (/^[A-Za-z_][A-Za-z0-9_]*$/.test(operand)) return null;
  return `${at}: "${action}" needs a bit: an address such as "%IX2" or a tag, got "${operand}"`;
}

/** Every problem of running `script` on `panel`; empty when it fits. */
export function checkScriptAgainstPanel(script: CheckScript, panel: PanelLayout): string[] {
  const errors: string[] = [];
  if (script.panel !== panel.id) errors.push(`the script is written for panel "${script.panel}", but the panel given is "${panel.id}"`);
  const byId = new Map(panel.devices.map((d) => [d.id, d] as const));
  script.steps.forEach((step, i) => {
    const at = `step ${i + 1}`;
    const action = stepAction(step);
    if (action === 'wait' || action === 'power') return;
    if ('prove' in step) {
      // Parsed against PropertySchema already (parseCheckScript).
      for (const condition of conditionsOf(step.prove as unknown as Property)) {
        for (const [key, value] of Object.entries(condition)) {
          const device = byId.get(key);
          const unobservable = device ? UNOBSERVABLE_KINDS[device.kind] : undefined;
          const problem = unobservable ? `${at}: "${key}" is ${modelOf(device!.kind).noun}: ${unobservable}` : checkExpectKey(key, value, panel, byId, at);
          if (problem) errors.push(problem);
        }
      }
      return;
    }
    if (isCheckStep(step)) {
      const s = step as Partial<Record<'expect' | 'never' | 'always' | 'until', Record<string, Expectation>>>;
      const condition = s.expect ?? s.never ?? s.always ?? s.until ?? {};
      for (const [key, value] of Object.entries(condition)) {
        const problem = checkExpectKey(key, value, panel, byId, at);
        if (problem) errors.push(problem);
      }
      return;
    }
    if (action === 'force' || action === 'unforce') {
      const operand = (step as Record<string, string>)[action]!;
      if (action === 'unforce' && operand === 'all') return;
      const problem = checkBitOperand(operand, panel, at, action);
      if (problem) errors.push(problem);
      return;
    }
    if (action === 'preheat') {
      const id = (step as { preheat: string }).preheat;
      const device = byId.get(id);
      if (device?.kind !== 'overload') {
        errors.push(`${at}: "preheat" needs the id of an overload relay, got "${id}"${device ? ` (${modelOf(device.kind).noun})` : `, which is not on panel ${panel.id}`}`);
      }
      return;
    }
    // What is left is a device action (the check steps returned above).
    const deviceAction = action as DeviceAction;
    const id = (step as Record<string, unknown>)[action] as string;
    const device = byId.get(id);
    const needs = `"${action}" needs the id of ${nounsFor(deviceAction)}`;
    if (!device) return void errors.push(`${at}: ${needs}, got "${id}", which is not on panel ${panel.id}`);
    const model = modelOf(device.kind);
    if (model.actions[deviceAction] === undefined) return void errors.push(`${at}: ${needs}, got "${id}" (${model.noun})`);
    if (action === 'set' && device.kind === 'selector') {
      const to = (step as { to: string }).to;
      if (!device.params.positions.includes(to)) {
        errors.push(`${at}: "to": ${id} has positions ${device.params.positions.join(', ')}, got "${to}"`);
      }
    }
  });
  return errors;
}
