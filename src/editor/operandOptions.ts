/**
 * What the operand field offers while a student types: the program's tags, every address of the
 * panel in use and the block outputs, each with what it is on the panel, so the list reads
 * "%IX2 — S2 forward, green" or "Fwd_PB — %IX2 · S2 forward, green" rather than bare addresses.
 * Pure, over the document and the panel.
 */
import { BLOCK_SPECS } from '@shared/ladder/blocks';
import { allAddresses, type AddressSpace } from '@shared/ladder/addresses';
import type { Program } from '@shared/ladder/schema';
import { visitNodes } from '@shared/ladder/walk';
import type { DeviceSpec, PanelLayout } from '@shared/field/layout';

/** A type alias, not an interface: naive-ui's option type wants an index signature an interface does not give. */
export type OperandOption = {
  /** What goes in the field. */
  value: string;
  /** What the list shows. */
  label: string;
};

const lowerFirst = (text: string) => text.charAt(0).toLowerCase() + text.slice(1);

/** A device's colour, when it has one its label does not already say. */
function colourOf(device: DeviceSpec): string {
  const params = device.params as { colour?: unknown };
  const colour = typeof params.colour === 'string' ? params.colour : '';
  return colour && !device.label.toLowerCase().includes(colour) ? `, ${colour}` : '';
}

/** Each panel address (upper case) → the device on it, in words: "S2 forward, green", "K1 forward contactor coil". */
export function addressNames(panel: Pick<PanelLayout, 'devices'> | null): Map<string, string> {
  const names = new Map<string, string>();
  for (const device of panel?.devices ?? []) {
    const base = `${device.id} ${lowerFirst(device.label)}`;
    if (device.feeds) names.set(device.feeds.toUpperCase(), `${base}${colourOf(device)}${device.contact ? ` ${device.contact}` : ''}`);
    if (device.drivenBy) names.set(device.drivenBy.toUpperCase(), `${base}${colourOf(device)}${device.kind === 'contactor' ? ' coil' : ''}`);
  }
  return names;
}

/** A coil writes its bit: outputs and memory, never an input or a block's output. */
const writable = (address: string) => /^%[QM]/i.test(address.trim());

/**
 * Tags first, then every address of the panel, then block outputs; for a coil (`forCoil`) only
 * what a coil can write (tags on outputs and memory bits, and those addresses), so the lamp or
 * contactor a student wants is near the top of a short list.
 */
export function operandOptions(doc: Program, panel: Pick<PanelLayout, 'devices'> | null, space: AddressSpace, forCoil = false): OperandOption[] {
  const names = addressNames(panel);
  const tags = doc.tags
    .filter((t) => !forCoil || writable(t.address))
    .map((t) => {
      const device = names.get(t.address.trim().toUpperCase());
      return { value: t.name, label: `${t.name} — ${t.address}${device ? ` · ${device}` : ''}` };
    });
  const addresses = allAddresses(space)
    .filter((a) => !forCoil || writable(a))
    .map((a) => {
      const device = names.get(a);
      return { value: a, label: device ? `${a} — ${device}` : a };
    });
  const members: OperandOption[] = [];
  if (forCoil) return [...tags, ...addresses];
  for (const rung of doc.rungs) {
    visitNodes(rung.network, (node) => {
      if (node.kind === 'block' && node.instance) for (const out of BLOCK_SPECS[node.type].outputs) members.push({ value: `${node.instance}.${out.name}`, label: `${node.instance}.${out.name} — ${node.type} output` });
    });
  }
  return [...tags, ...addresses, ...members];
}

/**
 * The options whose value or description holds the typed text (any case), at most `limit`: the
 * one spelled exactly as typed first, then values that start with it, then the rest (so typing
 * "%QX1" keeps "%QX1" above the tag on that address, and "green" still finds S2).
 */
export function filterOptions(options: readonly OperandOption[], text: string, limit = 30): OperandOption[] {
  const needle = text.trim().toUpperCase();
  if (needle === '') return options.slice(0, limit);
  const rank = (o: OperandOption): number => {
    const value = o.value.toUpperCase();
    if (value === needle) return 0;
    if (value.startsWith(needle)) return 1;
    if (value.includes(needle)) return 2;
    return o.label.toUpperCase().includes(needle) ? 3 : 4;
  };
  return options
    .map((o, i) => ({ o, i, r: rank(o) }))
    .filter((x) => x.r < 4)
    .sort((a, b) => a.r - b.r || a.i - b.i)
    .slice(0, limit)
    .map((x) => x.o);
}
