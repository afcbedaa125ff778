/**
 * Quiet scans: how many scans from now are certain to change nothing in the machine but the
 * elapsed time of running timers, so a caller can leap over them (`Runtime.leap`) instead of
 * running them, with exactly the state running them would give.
 *
 * The kernel is a pure function of the machine state and the scan period: the field values,
 * forces and edge memories are all in the state. So if one scan left the state as it was, every
 * later scan does too (a fixed point) until someone changes the field or the forces. If the only
 * change was in the `ET` of clock blocks (TON, TOF, TP: see `clock` in `blocks/behaviours.ts`),
 * each up by exactly the scan period, the next scans repeat that until the first timer's ET
 * reaches its preset — provided nothing reads that ET but the timer itself (no block input takes
 * it) and the preset is a constant. Anything else (a counter counted, a bit moved, a preset read
 * from another block) gives 0: the caller simply runs the scan.
 */
import { clockOf } from './blocks/behaviours';
import type { Machine } from './machine';
import type { Plan } from './plan';

/** A clock block of the plan whose elapsed time may run during a leap. */
interface ClockField {
  readonly instance: number;
  /** Index of its ET in `machine.numbers`. */
  readonly et: number;
  /** Its preset in ms when every call gives the same constant PT and nothing else reads its ET; null otherwise. */
  readonly presetMs: number | null;
}

/** What a leap needs to know about a plan, worked out once per plan. */
interface LeapPlan {
  readonly clocks: readonly ClockField[];
}

const leapPlans = new WeakMap<Plan, LeapPlan>();

function leapPlanOf(machine: Machine): LeapPlan {
  const { plan } = machine;
  let known = leapPlans.get(plan);
  if (known !== undefined) return known;
  /** Each instance's preset: a constant seen at every call, or NaN when not provably constant. */
  const presets = new Map<number, number>();
  const etRead = new Set<number>();
  for (const node of plan.blocks) {
    const clock = clockOf(node.type);
    for (const input of node.inputs) {
      if (input.source.kind === 'member' && input.source.member === 'ET') etRead.add(input.source.instance);
      if (clock === undefined || input.name !== clock.preset) continue;
      const value = input.source.kind === 'constant' ? input.source.value : Number.NaN;
      const seen = presets.get(node.instance);
      presets.set(node.instance, seen === undefined || seen === value ? value : Number.NaN);
    }
  }
  const clocks: ClockField[] = [];
  plan.instances.forEach((instance, i) => {
    const clock = clockOf(instance.type);
    if (clock === undefined) return;
    const field = machine.layout.recordLayouts[i]!.byName.get(clock.elapsed)!;
    const preset = presets.get(i);
    const usable = preset !== undefined && Number.isFinite(preset) && !etRead.has(i);
    clocks.push({ instance: i, et: (machine.layout.records[i]! + field.offset) / 8, presetMs: usable ? Math.max(preset, 0) : null });
  });
  known = { clocks };
  leapPlans.set(plan, known);
  return known;
}

/** The outcome of comparing two states one scan apart: how many more scans are quiet, and the timers that run. */
export interface Quiet {
  /** Scans after this one certain to change only running timers' ET; Infinity at a fixed point. */
  scans: number;
  /** Indexes in `machine.numbers` of the ET of each running timer (each gains the scan period per scan). */
  running: number[];
}

const NONE: Quiet = Object.freeze({ scans: 0, running: [] });

/** Are the i32 cells `[from, to)` (byte addresses, multiples of 4) the same in both? */
function sameCells(now: Int32Array, before: Int32Array, from: number, to: number): boolean {
  for (let i = from / 4; i < to / 4; i += 1) if (now[i] !== before[i]) return false;
  return true;
}

/**
 * Compare the machine with `before`, the state one scan earlier (`saveState` bytes), and say how
 * many further scans are quiet. `timers` false admits only a fixed point (a caller watching an ET).
 */
export function quietScans(machine: Machine, before: Uint8Array, dtMs: number, timers: boolean): Quiet {
  const { clocks } = leapPlanOf(machine);
  const end = machine.layout.stateBytes;
  const beforeCells = new Int32Array(before.buffer, before.byteOffset, end / 4);
  const beforeNumbers = new Float64Array(before.buffer, before.byteOffset, end / 8);
  const { cells, numbers } = machine;
  let from = 0;
  let scans = Number.POSITIVE_INFINITY;
  const running: number[] = [];
  // Records are laid out in instance order, so the ET fields come in ascending address order.
  for (const clock of clocks) {
    const at = clock.et * 8;
    if (!sameCells(cells, beforeCells, from, at)) return NONE;
    from = at + 8;
    const et = numbers[clock.et]!;
    const was = beforeNumbers[clock.et]!;
    if (et === was) continue;
    if (!timers || clock.presetMs === null || et - was !== dtMs || !Number.isInteger(et)) return NONE;
    // ET runs by dt a scan and the timer's output moves in the scan that brings it to the preset.
    const left = Math.ceil((clock.presetMs - et) / dtMs) - 1;
    if (left <= 0) return NONE;
    scans = Math.min(scans, left);
    running.push(clock.et);
  }
  if (!sameCells(cells, beforeCells, from, end)) return NONE;
  return { scans, running };
}

/** Leap `scans` quiet scans: each running timer's ET gains what those scans would have given it. */
export function leapTimers(machine: Machine, running: readonly number[], scans: number, dtMs: number): void {
  for (const et of running) machine.numbers[et] = machine.numbers[et]! + scans * dtMs;
}
