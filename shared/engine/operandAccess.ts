/**
 * Reading and forcing by operand text at run time (the field panel, the trace, check scripts and
 * the inspector name things by address, tag or member). Resolution goes through the same
 * `resolveOperand` as compilation, against the plan's symbol table.
 */
import { addressInRange, formatAddress, type Address } from '../ladder/addresses';
import { resolveOperand } from '../ladder/operands';
import { fail, ok, type Result } from '../ladder/result';
import { bitIndex } from './lower';
import type { Machine } from './machine';
import type { Plan } from './plan';
import { recordLayoutOf } from './stateLayout';

/** Reads one value from a machine of the plan it was resolved for. */
export type Reader = (machine: Machine) => boolean | number | undefined;

/** A resolved bit: its address and its index in the bit image. */
export interface ResolvedBit {
  address: Address;
  bit: number;
}

/** A bit this plan's panel has, named by address or tag. */
export function resolveBit(plan: Plan, text: string): Result<ResolvedBit> {
  const resolved = resolveOperand(text, plan.symbols);
  if (!resolved.ok) return resolved;
  const operand = resolved.value;
  if (operand.kind !== 'bit') {
    return fail(`only bits (an %IX, %QX or %MX address or a tag) can be forced; "${text.trim()}" is not a bit`);
  }
  const range = addressInRange(operand.address, plan.space);
  if (range !== null) return fail(range);
  return ok({ address: operand.address, bit: bitIndex(operand, plan.layout) });
}

/** A reader for an operand, or `null` when it names nothing in this plan. */
export function resolveReader(plan: Plan, text: string): Reader | null {
  const resolved = resolveOperand(text, plan.symbols);
  if (!resolved.ok) return null;
  const operand = resolved.value;
  switch (operand.kind) {
    case 'bit': {
      if (addressInRange(operand.address, plan.space) !== null) return null;
      const bit = bitIndex(operand, plan.layout);
      return (machine) => machine.cells[bit] === 1;
    }
    case 'member': {
      const instance = plan.instances.findIndex((i) => i.key === operand.instance);
      if (instance < 0) return null;
      // `resolveOperand` names only a block's outputs, never a record's own memories (lastCU…).
      const field = recordLayoutOf(plan.instances[instance]!.type).byName.get(operand.member);
      if (field === undefined) return null;
      const { offset } = field;
      return field.kind === 'number'
        ? (machine) => machine.numbers[(machine.layout.records[instance]! + offset) / 8]
        : (machine) => machine.cells[(machine.layout.records[instance]! + offset) / 4] === 1;
    }
    case 'bool':
      return () => operand.value;
    case 'time':
      return () => operand.ms;
    case 'int':
      return () => operand.value;
  }
}

/** The canonical address of an operand naming a bit, for marking forced signals; `null` otherwise. */
export function addressKeyOf(plan: Plan, text: string): string | null {
  const bit = resolveBit(plan, text);
  return bit.ok ? formatAddress(bit.value.address) : null;
}
