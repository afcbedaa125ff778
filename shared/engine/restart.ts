/**
 * Power loss and warm restart of the controller (IEC 61131-3, variable attribute RETAIN and the
 * restart rules [memory for the clause]; docs/published-values.md). While the controller has no
 * power it runs no scan and every output is open. A warm restart gives each variable marked
 * *retain* in the tag table the value it had when power was lost; every other bit, every edge
 * memory and every block instance starts from its initial value. The first scan then reads the
 * inputs as they are, so an edge contact on an input already TRUE sees a rising edge (common
 * practice). Forces are the programming tool's, not the program's: they stay in effect.
 */
import { addressInRange } from '../ladder/addresses';
import { symbolKey } from '../ladder/operands';
import { BLOCK_BEHAVIOURS } from './blocks/behaviours';
import { bitIndex } from './lower';
import { writeRecord, type Machine } from './machine';
import type { Plan } from './plan';

const retainedByPlan = new WeakMap<Plan, readonly number[]>();

/**
 * The bits the program's tags mark `retain`: outputs and memory bits (an input is read afresh on
 * the first scan, so retaining one means nothing). A tag names a bit by address.
 */
export function retainedBits(plan: Plan): readonly number[] {
  let bits = retainedByPlan.get(plan);
  if (bits !== undefined) return bits;
  const found = new Set<number>();
  for (const tag of plan.program.tags) {
    if (tag.retain !== true) continue;
    const address = plan.symbols.tags.get(symbolKey(tag.name));
    if (address === undefined || address.area === 'I' || addressInRange(address, plan.space) !== null) continue;
    found.add(bitIndex({ kind: 'bit', address }, plan.layout));
  }
  bits = [...found].sort((a, b) => a - b);
  retainedByPlan.set(plan, bits);
  return bits;
}

/** What the controller keeps through a power loss: the retained bits' values, in `retainedBits` order. */
export type RetainedValues = Int32Array;

/** Power lost: keep the retained values, open every output (the output image goes to 0). */
export function losePower(machine: Machine): RetainedValues {
  const { plan, cells } = machine;
  const bits = retainedBits(plan);
  const kept = Int32Array.from(bits, (bit) => cells[bit]!);
  cells.fill(0, plan.layout.outputs, plan.layout.memory);
  return kept;
}

/** Warm restart: retained bits as kept, everything else initial; forced bits keep their forced value. */
export function warmRestart(machine: Machine, kept: RetainedValues): void {
  const { plan, cells, layout } = machine;
  cells.fill(0, 0, plan.layout.size);
  retainedBits(plan).forEach((bit, i) => {
    cells[bit] = kept[i]!;
  });
  for (let bit = 0; bit < plan.layout.size; bit += 1) {
    if (cells[layout.keep / 4 + bit] === 0) cells[bit] = cells[layout.forced / 4 + bit]!;
  }
  cells.fill(0, layout.edges / 4, layout.edges / 4 + plan.edges.length);
  plan.instances.forEach((instance, i) => writeRecord(machine, i, BLOCK_BEHAVIOURS[instance.type].initial));
}
