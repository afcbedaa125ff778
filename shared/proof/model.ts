/**
 * The system the proof explores: the program compiled for the panel and run by the ordinary
 * simulation (engine and field), seen as a transition system. A state is the engine's memory (one
 * byte copy, `saveState`), the field's device states (reduced, see `abstraction.ts`) and the
 * property monitors; a transition is "the environment makes any set of moves, then one scan".
 *
 * Reductions, all sound for the properties asked:
 *  - devices nobody reads are left alone: a device whose contacts feed no input the program or a
 *    property reads, sit in no common and in no load's series circuit, and that no property names,
 *    cannot change anything observable, so its moves are not explored;
 *  - an up counter (CTU) whose preset is one constant, whose CV no rung and no property reads,
 *    is kept at most at its preset: from there on every count gives the same Q (CV ≥ PV) until R.
 * Timers are exact: ET counts whole scans up to PT, so every value of ET is a state of its own.
 */
import type { Program } from '../ladder/schema';
import type { PanelLayout } from '../field/layout';
import { createSimulation, type Simulation } from '../field/simulation';
import { wirePanel, type Wiring } from '../field/wiring';
import { resolveBit } from '../engine/operandAccess';
import { stateLayout, type StateLayout } from '../engine/stateLayout';
import type { Plan, PlanNode, PlanSource } from '../engine/plan';
import type { Diagnostic } from '../engine';
import { KIND_ABSTRACTIONS, type EnvMove, type KindAbstraction } from './abstraction';
import type { Condition } from './property';

/** One device's possible move, with the state it leads to. */
export interface DeviceMove {
  device: number;
  move: EnvMove;
}

export interface ProofModel {
  sim: Simulation;
  wiring: Wiring;
  plan: Plan;
  layout: StateLayout;
  /** Device indices whose moves are explored. */
  active: readonly number[];
  /** Device indices left alone (nothing observable reads them). */
  ignored: readonly string[];
  abstractions: readonly KindAbstraction[];
  initialStates: readonly unknown[];
  /** Put the simulation in a state: engine bytes and field states. */
  load(bytes: Uint8Array, field: readonly unknown[]): void;
  /** The simulation's state after a scan, reduced, in scratch space the next `take` overwrites. */
  take(): { bytes: Uint8Array; field: unknown[] };
  /** A key of engine bytes (without forces and field cells, which the proof never changes). */
  engineKey(bytes: Uint8Array): string;
  fieldKey(field: readonly unknown[]): string;
  /** The moves a device can make from its state. */
  movesOf(device: number, state: unknown): readonly EnvMove[];
  /** The state a move leads to, or null when the model refuses it. */
  apply(device: number, state: unknown, move: EnvMove): unknown;
}

export type ModelResult = { ok: true; model: ProofModel; warnings: Diagnostic[] } | { ok: false; error: string; diagnostics: Diagnostic[] };

function* planNodes(node: PlanNode): Generator<PlanNode> {
  yield node;
  if (node.op === 'series') for (const item of node.items) yield* planNodes(item);
  else if (node.op === 'parallel') for (const branch of node.branches) yield* planNodes(branch);
}

function* planSources(plan: Plan): Generator<PlanSource> {
  for (const rung of plan.rungs) {
    for (const node of planNodes(rung.network)) {
      if (node.op === 'contact') yield node.source;
      else if (node.op === 'block') for (const input of node.inputs) yield input.source;
    }
  }
}

/** CTU instances that may be capped at their preset, with the byte offset of CV and the preset. */
function cappableCounters(plan: Plan, layout: StateLayout, readKeys: readonly string[]): { at: number; pv: number }[] {
  const result: { at: number; pv: number }[] = [];
  const sources = [...planSources(plan)];
  plan.instances.forEach((instance, i) => {
    if (instance.type !== 'CTU') return;
    if (sources.some((s) => s.kind === 'member' && s.instance === i && s.member === 'CV')) return;
    const named = readKeys.some((k) => k.toUpperCase() === `${instance.key}.CV`);
    if (named) return;
    const presets = new Set<number>();
    let constant = true;
    for (const rung of plan.rungs) {
      for (const node of planNodes(rung.network)) {
        if (node.op !== 'block' || node.instance !== i) continue;
        const pv = node.inputs.find((x) => x.name === 'PV');
        if (pv?.source.kind === 'constant') presets.add(pv.source.value);
        else constant = false;
      }
    }
    const [pv] = [...presets];
    if (!constant || presets.size !== 1 || pv === undefined || pv < 0) return;
    const field = layout.recordLayouts[i]!.byName.get('CV')!;
    result.push({ at: layout.records[i]! + field.offset, pv });
  });
  return result;
}

/** Build the model, or say why the program cannot be explored (it does not compile). */
export function buildModel(program: Program, panel: PanelLayout, scanMs: number, readKeys: readonly string[]): ModelResult {
  const created = createSimulation({ program, panel, scanMs, maxEvents: 1 });
  if (!created.ok) return { ok: false, error: created.error, diagnostics: created.diagnostics };
  const sim = created.simulation;
  const wiring = wirePanel(panel);
  const plan = sim.runtime.plan;
  const layout = stateLayout(plan);
  const abstractions = wiring.devices.map((d) => KIND_ABSTRACTIONS[d.kind] as KindAbstraction);
  const initialStates = sim.fieldStates();
  const params = wiring.devices.map((d) => d.params as unknown);

  // Which devices can influence what is observed.
  const readBits = new Set<number>();
  for (const s of planSources(plan)) if (s.kind === 'bit') readBits.add(s.bit);
  for (const key of readKeys) {
    const bit = resolveBit(plan, key);
    if (bit.ok) readBits.add(bit.value.bit);
  }
  const relevant = new Set<number>();
  for (const c of [...wiring.inputCommon, ...wiring.outputCommon, ...wiring.loads.flatMap((l) => l.through)]) relevant.add(c.device);
  for (const w of wiring.inputs) if (readBits.has(plan.layout.inputs + w.index - 1)) relevant.add(w.device);
  for (const key of readKeys) {
    const i = wiring.indexOf.get(key);
    if (i !== undefined) relevant.add(i);
  }
  const movable = wiring.devices.map((_, i) => abstractions[i]!.moves(initialStates[i], params[i]).length > 0);
  const active = wiring.devices.map((_, i) => i).filter((i) => movable[i] && relevant.has(i));
  const ignored = wiring.devices.filter((_, i) => movable[i] && !relevant.has(i)).map((d) => d.id);

  const counters = cappableCounters(plan, layout, readKeys);
  // Scratch space: a state is copied out of it only when it is new.
  const scratch = sim.runtime.saveState();
  const scratchField = sim.fieldStates();
  const loading = { ...scratch };
  // The key leaves out the field cells (the inputs as last given, equal to the input bits) and
  // the force masks (a proof forces nothing).
  const cellRanges: [number, number][] = [
    [0, plan.layout.size],
    [layout.edges >> 2, layout.keep >> 2],
  ];
  const recordWords: [number, number] = [(layout.records[0] ?? layout.stateBytes) >> 1, layout.stateBytes >> 1];

  const model: ProofModel = {
    sim,
    wiring,
    plan,
    layout,
    active,
    ignored,
    abstractions,
    initialStates,
    load(bytes, field) {
      loading.bytes = bytes;
      sim.runtime.loadState(loading);
      sim.loadFieldStates(field);
    },
    take() {
      const bytes = sim.runtime.saveState(scratch).bytes;
      if (counters.length > 0) {
        const view = new DataView(bytes.buffer, bytes.byteOffset, bytes.byteLength);
        for (const c of counters) if (view.getFloat64(c.at, true) > c.pv) view.setFloat64(c.at, c.pv, true);
      }
      const field = sim.fieldStates(scratchField);
      for (let i = 0; i < field.length; i += 1) field[i] = abstractions[i]!.reduce(field[i], params[i], initialStates[i]);
      return { bytes, field };
    },
    engineKey(bytes) {
      // Bits and edge memories are 0/1 cells: sixteen to a character. Block records as they are.
      const cells = new Int32Array(bytes.buffer, bytes.byteOffset, bytes.byteLength >> 2);
      let key = '';
      let packed = 0;
      let n = 0;
      for (const [from, to] of cellRanges) {
        for (let c = from; c < to; c += 1) {
          packed |= (cells[c]! & 1) << n;
          n += 1;
          if (n === 16) {
            key += String.fromCharCode(packed);
            packed = 0;
            n = 0;
          }
        }
      }
      if (n > 0) key += String.fromCharCode(packed);
      if (recordWords[1] > recordWords[0]) {
        const words = new Uint16Array(bytes.buffer, bytes.byteOffset, bytes.byteLength >> 1);
        for (let at = recordWords[0]; at < recordWords[1]; at += 512) {
          key += String.fromCharCode.apply(null, words.subarray(at, Math.min(recordWords[1], at + 512)) as unknown as number[]);
        }
      }
      return key;
    },
    fieldKey(field) {
      let key = '';
      for (let i = 0; i < field.length; i += 1) key += `${abstractions[i]!.code(field[i], params[i])},`;
      return key;
    },
    movesOf: (device, state) => abstractions[device]!.moves(state, params[device]),
    apply(device, state, move) {
      const model = wiring.models[device]!;
      const perform = model.actions[move.action];
      if (!perform) return null;
      const outcome = perform.call(model.actions, state, params[device], { to: move.to });
      return outcome.ok ? outcome.state : null;
    },
  };
  return { ok: true, model, warnings: created.warnings };
}

/** Does `condition` name something the model cannot observe? Checked by the caller before. */
export type { Condition };
