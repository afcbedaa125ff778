/**
 * The I/O status table: for each PLC input, the field contact, whether the input common is live
 * and the bit the program sees; for each output, the output bit, its load circuit (output common,
 * series contacts — which one is open) and what the load actually does, with the reason in words
 * ("%QX1 ON, K1 open (F1 95-96 open)"). This is where a student sees why an output can be ON while
 * its contactor is open.
 */
import type { Runtime } from '../engine';
import type { ContactForm } from './devices/model';
import type { LoadCircuit, WiredContact, Wiring } from './wiring';

export interface InputRow {
  address: string;
  /** The device wired to it, or null when the input is spare. */
  device: string | null;
  contact: string | null;
  form: ContactForm | null;
  /** The field contact itself, ignoring the common. */
  contactClosed: boolean;
  commonLive: boolean;
  /** The bit the program read in the last scan (a force shows here). */
  bit: boolean;
  forced: boolean;
  reason: string;
}

export interface OutputRow {
  address: string;
  bit: boolean;
  forced: boolean;
  /** The load it drives, or null when the output is spare. */
  load: string | null;
  outputCommonLive: boolean;
  /** Series contacts of the load circuit that are open, e.g. ["F1 95-96"]. */
  openContacts: string[];
  /** The load circuit has power. */
  energised: boolean;
  /** The load's state word: closed, lit, sounding… */
  loadWord: string | null;
  reason: string;
}

export interface IoExplanation {
  inputCommonLive: boolean;
  outputCommonLive: boolean;
  /** Open contacts of each common, e.g. ["S0 11-12"]. */
  inputCommonOpen: string[];
  outputCommonOpen: string[];
  inputs: InputRow[];
  outputs: OutputRow[];
}

/** What `explainIO` needs from a running simulation. */
export interface ExplainContext {
  wiring: Wiring;
  runtime: Runtime;
  states: readonly unknown[];
  params: readonly unknown[];
  words: readonly string[];
  energised(device: number): boolean;
  closed(contact: WiredContact): boolean;
  cutReason(load: LoadCircuit): string;
}

const onOff = (bit: boolean): string => (bit ? 'ON' : 'OFF');
const trueFalse = (bit: boolean): string => (bit ? 'TRUE' : 'FALSE');

/** Build the I/O status table after the last scan. */
export function explainIO(ctx: ExplainContext): IoExplanation {
  const { wiring, runtime } = ctx;
  const forces = runtime.forces();
  const inputCommonOpen = wiring.inputCommon.filter((c) => !ctx.closed(c)).map((c) => c.label);
  const outputCommonOpen = wiring.outputCommon.filter((c) => !ctx.closed(c)).map((c) => c.label);
  const inputCommonLive = inputCommonOpen.length === 0;
  const outputCommonLive = outputCommonOpen.length === 0;

  const inputs: InputRow[] = [];
  for (let index = 1; index <= wiring.panel.inputs; index += 1) {
    const address = `%IX${index}`;
    const wire = wiring.inputs.find((w) => w.index === index);
    const bit = runtime.read(address) === true;
    const forced = forces.has(address);
    const forcedNote = forced ? ` (forced ${trueFalse(bit)})` : '';
    if (!wire) {
      inputs.push({ address, device: null, contact: null, form: null, contactClosed: false, commonLive: inputCommonLive, bit, forced, reason: `${address} ${trueFalse(bit)}: not wired${forcedNote}` });
      continue;
    }
    const device = wiring.devices[wire.device]!;
    const model = wiring.models[wire.device]!;
    const spec = model.contacts(ctx.params[wire.device]).find((c) => c.name === wire.contact);
    const form = spec?.form ?? 'NO';
    const contactClosed = ctx.closed(wire);
    const state = ctx.words[wire.device]!;
    const contactText = `${wire.label} ${contactClosed ? 'closed' : 'open'} (${form}, ${state})`;
    const reason = inputCommonLive
      ? `${address} ${trueFalse(bit)}: ${contactText}${forcedNote}`
      : `${address} ${trueFalse(bit)}: input common de-energised (${inputCommonOpen.join(', ')} open); ${contactText}${forcedNote}`;
    inputs.push({ address, device: device.id, contact: wire.contact, form, contactClosed, commonLive: inputCommonLive, bit, forced, reason });
  }

  const outputs: OutputRow[] = [];
  for (let index = 1; index <= wiring.panel.outputs; index += 1) {
    const address = `%QX${index}`;
    const load = wiring.loads.find((l) => l.output === index);
    const bit = runtime.getOutput(index);
    const forced = forces.has(address);
    const head = `${address} ${onOff(bit)}${forced ? ' (forced)' : ''}`;
    if (!load) {
      outputs.push({ address, bit, forced, load: null, outputCommonLive, openContacts: [], energised: false, loadWord: null, reason: `${head}: not wired` });
      continue;
    }
    const device = wiring.devices[load.device]!;
    const openContacts = load.through.filter((c) => !ctx.closed(c)).map((c) => c.label);
    const energised = ctx.energised(load.device);
    const loadWord = ctx.words[load.device]!;
    let why = '';
    if (bit && !energised) {
      why = outputCommonLive ? `${openContacts.join(', ')} open` : `output common de-energised: ${outputCommonOpen.join(', ')} open`;
    } else {
      why = ctx.wiring.models[load.device]!.explainLoad?.(ctx.states[load.device], energised) ?? '';
    }
    const reason = `${head}, ${device.id} ${loadWord}${why ? ` (${why})` : ''}`;
    outputs.push({ address, bit, forced, load: device.id, outputCommonLive, openContacts, energised, loadWord, reason });
  }
  return { inputCommonLive, outputCommonLive, inputCommonOpen, outputCommonOpen, inputs, outputs };
}
