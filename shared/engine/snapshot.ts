/**
 * Snapshots: the whole state of a runtime as plain, serialisable data (JSON-safe), and putting one
 * back, also into a runtime of another plan (recompiling while running). Parts are matched by name,
 * never by position in a plan: block instances by name and type, edge contacts by element id and
 * the operand they examine, bits by address.
 */
import { addressInRange, formatAddress, parseAddress, type AddressSpace } from '../ladder/addresses';
import { symbolKey } from '../ladder/operands';
import type { BlockType } from '../ladder/schema';
import { BLOCK_BEHAVIOURS, isStateOf, type BlockState } from './blocks/behaviours';
import type { RuntimeCore } from './core';
import { bitIndex } from './lower';
import { readField, readRecord, writeField, writeRecord } from './machine';
import type { Plan } from './plan';

export const SNAPSHOT_FORMAT = 'rungwright.runtime-snapshot';

/** The state of a runtime. Bits are 0/1 per address, index 0 = address 1. */
export interface RuntimeSnapshot {
  format: typeof SNAPSHOT_FORMAT;
  version: 1;
  scanMs: number;
  scanCount: number;
  /** Virtual time, ms. */
  timeMs: number;
  space: AddressSpace;
  /** Field value of each input, as last given to `setInput`. */
  field: number[];
  /** The bit image, by area. */
  bits: { inputs: number[]; outputs: number[]; memory: number[] };
  /** The output image after the last scan (the output bits; read back from `bits.outputs` on restore). */
  outputImage: number[];
  /** Each edge contact's memory: element id, canonical operand, last value seen. */
  edges: Array<{ elementId: string; operand: string; value: number }>;
  /** Each block instance's state. */
  instances: Array<{ name: string; type: BlockType; state: BlockState }>;
  /** Forces by canonical address. */
  forces: Array<{ address: string; value: boolean }>;
}

/** What a restore carried over and what it had to leave behind (instance names and addresses). */
export interface RestoreReport {
  kept: string[];
  dropped: string[];
}

/** Copy the state out (plain arrays and objects). */
export function takeSnapshot(core: RuntimeCore): RuntimeSnapshot {
  const { plan, machine } = core;
  const { layout } = plan;
  const { cells } = machine;
  const at = machine.layout;
  /** Cells `[from, to)` counted from byte address `base`. */
  const area = (from: number, to: number, base = 0): number[] => Array.from(cells.subarray(base / 4 + from, base / 4 + to));
  return {
    format: SNAPSHOT_FORMAT,
    version: 1,
    scanMs: core.scanMs,
    scanCount: core.scanCount,
    timeMs: core.timeMs,
    space: { ...plan.space },
    field: Array.from({ length: plan.space.inputs }, (_, i) => readField(machine, i)),
    bits: {
      inputs: area(layout.inputs, layout.outputs),
      outputs: area(layout.outputs, layout.memory),
      memory: area(layout.memory, layout.size),
    },
    outputImage: area(layout.outputs, layout.memory),
    edges: plan.edges.map((edge, i) => ({ elementId: edge.elementId, operand: edge.operand, value: cells[at.edges / 4 + i]! })),
    instances: plan.instances.map((instance, i) => ({ name: instance.name, type: instance.type, state: readRecord(machine, i) })),
    forces: [...core.forcedBits].map(([address, { value }]) => ({ address, value })),
  };
}

/**
 * Put a snapshot into a runtime's core. `forceBit` applies a force the way the runtime does.
 * Throws a TypeError only when the value is not a Rungwright runtime snapshot at all.
 */
export function applySnapshot(
  core: RuntimeCore,
  snapshot: RuntimeSnapshot,
  forceBit: (bit: number, value: boolean) => void,
): RestoreReport {
  if (typeof snapshot !== 'object' || snapshot === null || snapshot.format !== SNAPSHOT_FORMAT || snapshot.version !== 1) {
    throw new TypeError(`restore: expected a ${SNAPSHOT_FORMAT} version 1 object`);
  }
  const { plan, machine } = core;
  const { layout } = plan;
  const { cells } = machine;
  const at = machine.layout;
  const kept: string[] = [];
  const dropped: string[] = [];

  const copyBits = (values: readonly number[] | undefined, size: number, write: (i: number, v: number) => void, prefix: string) => {
    (values ?? []).forEach((value, i) => {
      const v = value === 1 ? 1 : 0;
      if (i < size) write(i, v);
      else if (v === 1) dropped.push(`${prefix}${i + 1}`);
    });
  };
  cells.fill(0, 0, layout.size);
  cells.fill(0, at.field / 4, at.field / 4 + at.fieldWords);
  copyBits(snapshot.field, plan.space.inputs, (i, v) => writeField(machine, i, v === 1), '%IX');
  copyBits(snapshot.bits?.inputs, plan.space.inputs, (i, v) => (cells[layout.inputs + i] = v), '%IX');
  copyBits(snapshot.bits?.outputs, plan.space.outputs, (i, v) => (cells[layout.outputs + i] = v), '%QX');
  copyBits(snapshot.bits?.memory, plan.space.memory, (i, v) => (cells[layout.memory + i] = v), '%MX');

  const edges = new Map((snapshot.edges ?? []).map((edge) => [`${edge.elementId}\u0000${edge.operand}`, edge.value]));
  plan.edges.forEach((edge, i) => {
    cells[at.edges / 4 + i] = edges.get(`${edge.elementId}\u0000${edge.operand}`) === 1 ? 1 : 0;
  });

  const saved = new Map((snapshot.instances ?? []).map((instance) => [symbolKey(instance.name), instance]));
  plan.instances.forEach((instance, i) => {
    const old = saved.get(instance.key);
    saved.delete(instance.key);
    if (old !== undefined && old.type === instance.type && isStateOf(instance.type, old.state)) {
      writeRecord(machine, i, old.state);
      kept.push(instance.name);
    } else {
      writeRecord(machine, i, BLOCK_BEHAVIOURS[instance.type].initial);
      if (old !== undefined) dropped.push(old.name);
    }
  });
  for (const old of saved.values()) dropped.push(old.name);

  cells.fill(1, at.keep / 4, at.keep / 4 + layout.size);
  cells.fill(0, at.forced / 4, at.forced / 4 + layout.size);
  core.forcedBits = new Map();
  for (const { address, value } of snapshot.forces ?? []) {
    const bit = bitOfAddress(address, plan);
    if (bit === null) {
      dropped.push(`force ${address}`);
      continue;
    }
    core.forcedBits.set(address, { bit, value: value === true });
    forceBit(bit, value === true);
  }

  core.scanCount = Number.isSafeInteger(snapshot.scanCount) && snapshot.scanCount >= 0 ? snapshot.scanCount : 0;
  core.timeMs = Number.isFinite(snapshot.timeMs) && snapshot.timeMs >= 0 ? snapshot.timeMs : core.scanCount * core.scanMs;
  return { kept, dropped };
}

/** The bit index of a canonical address on this plan's panel, or `null`. */
function bitOfAddress(address: string, plan: Plan): number | null {
  const parsed = parseAddress(address);
  if (!parsed.ok || formatAddress(parsed.value) !== address) return null;
  if (addressInRange(parsed.value, plan.space) !== null) return null;
  return bitIndex({ kind: 'bit', address: parsed.value }, plan.layout);
}
