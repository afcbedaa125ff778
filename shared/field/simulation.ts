/**
 * `createSimulation`: a compiled program running against a field panel, scan by scan, as docs/names-and-rules.md
 * describes the scan cycle:
 *  1. each input bit = its device contact AND the input common (every contact in `inputCommon`);
 *  2. the engine solves the rungs;
 *  3. a load is energised only if its output is ON AND the output common AND its series contacts
 *     (`through`, e.g. F1 95-96) are closed;
 *  4. the field advances by one scan period: interlocks decide, contactors move after their delay,
 *     lamps and horns follow their circuits, the motor ramps, the overload's thermal image evolves.
 * Deterministic: virtual time only, no clock, no randomness.
 */
import { checkScanMs, compile, createRuntime, DEFAULT_SCAN_MS, type Runtime } from '../engine';
import type { DeviceInputs, DeviceAction, ActionArgs } from './devices/model';
import type { ActionResult, Simulation, SimulationOptions, SimulationResult } from './simulationApi';
import { isEngaged, type ContactorState } from './devices/contactor';
import { interlockRule } from './devices/interlock';
import { preheatedState, type OverloadState } from './devices/overload';
import { createEventLog, type FieldEventKind } from './events';
import { describeChange, describeCommons, ACTION_WORDS, type ChangeContext } from './messages';
import { deviceView, type DeviceView } from './views';

export type { ActionResult, FieldSnapshot, Simulation, SimulationOptions, SimulationResult } from './simulationApi';
import { wirePanel, type LoadCircuit, type WiredContact, type Wiring } from './wiring';
import { explainIO } from './explain';

/** Compile the program for the panel's address space and wire it to a fresh field. */
export function createSimulation(options: SimulationOptions): SimulationResult {
  const panel = options.panel;
  const scanMs = checkScanMs(options.scanMs ?? DEFAULT_SCAN_MS);
  if (!scanMs.ok) return { ok: false, diagnostics: [], error: scanMs.error };
  const compiled = compile(options.program, { space: { inputs: panel.inputs, outputs: panel.outputs, memory: 64 } });
  if (!compiled.ok) {
    const errors = compiled.diagnostics.filter((d) => d.severity === 'error');
    const first = errors[0]?.message ?? 'the program does not compile';
    const more = errors.length > 1 ? ` (and ${errors.length - 1} more)` : '';
    return { ok: false, diagnostics: compiled.diagnostics, error: `the program does not compile: ${first}${more}` };
  }
  const runtime = createRuntime(compiled.plan, { scanMs: scanMs.value, recordPowerFlow: options.recordPowerFlow === true });
  return { ok: true, simulation: buildSimulation(wirePanel(panel), runtime, options.maxEvents), warnings: compiled.diagnostics };
}

const freshInputs = (): DeviceInputs => ({ energised: false, blocked: false, conflict: false, supply: 'none', currentA: 0 });

function buildSimulation(wiring: Wiring, runtime: Runtime, maxEvents = 10_000): Simulation {
  const { devices, models } = wiring;
  const params = devices.map((d) => d.params as unknown);
  const states: unknown[] = devices.map((_, i) => models[i]!.initial(params[i]));
  const words: string[] = devices.map((_, i) => models[i]!.word(states[i], params[i]));
  const inputs: DeviceInputs[] = devices.map(freshInputs);
  const log = createEventLog(maxEvents);
  const dtMs = runtime.scanMs;
  let shortCircuit = false;

  // Each wired contact's state, refreshed when its device changes: the scan reads bits, not models.
  const closedBits = new Uint8Array(wiring.contacts.length);
  const refresh = (i: number): void => {
    const slots = wiring.slotsOf[i]!;
    for (let n = 0; n < slots.length; n += 1) {
      const c = wiring.contacts[slots[n]!]!;
      closedBits[c.slot] = models[i]!.isClosed(states[i], params[i], c.contact) ? 1 : 0;
    }
  };
  devices.forEach((_, i) => refresh(i));
  const closed = (c: WiredContact): boolean => closedBits[c.slot] === 1;
  /** What the layout asks each steppable device to gather before its step. */
  const isMotor = models.map((m) => m.gathers === 'supply');
  // The step functions taken out of the models once: one indirect call per device in the loop
  // instead of a property look-up on many differently shaped model objects.
  const stepFns = models.map((m) => m.step ?? ((state: unknown) => state));
  const isOverload = models.map((m) => m.gathers === 'current');
  const allClosed = (list: readonly WiredContact[]): boolean => {
    for (let i = 0; i < list.length; i += 1) if (!closed(list[i]!)) return false;
    return true;
  };
  const firstOpen = (list: readonly WiredContact[]): WiredContact | undefined => list.find((c) => !closed(c));

  const emit = (device: string | null, kind: FieldEventKind, message: string): void => {
    log.push({ atMs: runtime.timeMs, scan: runtime.scanCount, device, kind, message });
  };

  /** Why a load's circuit has no power, in words, or '' if it has. */
  const cutReason = (load: LoadCircuit): string => {
    const common = firstOpen(wiring.outputCommon);
    if (common) return `output common de-energised (${common.label} open)`;
    const series = firstOpen(load.through);
    if (series) return `${series.label} opened`;
    if (!runtime.powered) return 'the controller has no power';
    if (!runtime.getOutput(load.output)) return `${load.address} turned OFF`;
    return '';
  };

  const readInputs = (): void => {
    const live = allClosed(wiring.inputCommon);
    const wires = wiring.inputs;
    for (let n = 0; n < wires.length; n += 1) runtime.setInput(wires[n]!.index, live && closed(wires[n]!));
  };

  const writeOutputs = (): void => {
    const live = allClosed(wiring.outputCommon);
    const loads = wiring.loads;
    for (let n = 0; n < loads.length; n += 1) {
      const load = loads[n]!;
      inputs[load.device]!.energised = live && runtime.getOutput(load.output) && allClosed(load.through);
    }
  };

  const applyInterlocks = (): void => {
    for (const link of wiring.interlocks) {
      const a = states[link.a] as ContactorState;
      const b = states[link.b] as ContactorState;
      const verdict = interlockRule(inputs[link.a]!.energised, isEngaged(a), inputs[link.b]!.energised, isEngaged(b));
      inputs[link.a]!.blocked = verdict.blockA;
      inputs[link.b]!.blocked = verdict.blockB;
      inputs[link.device]!.conflict = verdict.conflict;
    }
  };

  const gatherSupply = (i: number): void => {
    const feed = wiring.motorFeeds[i]!;
    let forward = false;
    let reverse = false;
    for (const f of feed.feeders) {
      if (!(states[f.contactor] as ContactorState).closed) continue;
      if (f.direction === 'forward') forward = true;
      else reverse = true;
    }
    if (forward && reverse) {
      // Only possible on a layout without a mechanical interlock: both sets of main contacts
      // closed swap two phases onto each other. The short-circuit protection would clear it.
      if (!shortCircuit) {
        emit(devices[i]!.id, 'fault', `${devices[i]!.id} fed forward and reverse at once: phase-to-phase short circuit; supply removed`);
      }
      shortCircuit = true;
    } else {
      shortCircuit = false;
    }
    inputs[i]!.supply = forward && !reverse ? 'forward' : reverse && !forward ? 'reverse' : 'none';
  };

  /**
   * One reusable change context per device, built once: creating closures in the scan loop would
   * cost more than the whole engine scan.
   */
  const changes: ChangeContext[] = devices.map((device, i) => ({
    device,
    before: null,
    after: null,
    wordBefore: '',
    word: '',
    cutReason: () => (wiring.loadOf[i]! >= 0 ? cutReason(wiring.loads[wiring.loadOf[i]!]!) : ''),
    holder: () => holderOf(i),
  }));

  const advanceField = (): void => {
    applyInterlocks();
    const order = wiring.stepOrder;
    for (let n = 0; n < order.length; n += 1) {
      const i = order[n]!;
      if (isMotor[i]) gatherSupply(i);
      else if (isOverload[i]) {
        const m = wiring.measures[i]!;
        inputs[i]!.currentA = m >= 0 ? (states[m] as { currentA: number }).currentA : 0;
      }
      const before = states[i];
      const after = stepFns[i]!(before, params[i], inputs[i]!, dtMs);
      if (after === before) continue;
      states[i] = after;
      const device = devices[i]!;
      const word = models[i]!.word(after, params[i]);
      // Every kind's contacts are a function of its state word (closed/open, tripped/ok, the
      // selector position…), so a step that keeps the word keeps the contacts.
      if (word !== words[i]) refresh(i);
      const ctx = changes[i]!;
      ctx.before = before;
      ctx.after = after;
      ctx.wordBefore = words[i]!;
      ctx.word = word;
      const message = describeChange(ctx);
      words[i] = word;
      if (message) emit(device.id, message.kind, message.text);
    }
  };

  /** The contactor an interlock holds `i` open for. */
  const holderOf = (i: number): string => {
    const link = wiring.interlocks.find((l) => l.a === i || l.b === i);
    if (!link) return '';
    return devices[link.a === i ? link.b : link.a]!.id;
  };

  /** The devices that changed in the scan `quietScans` last looked at: the ones a leap moves on. */
  const moving: number[] = [];

  const scan = (): void => {
    readInputs();
    runtime.scan();
    writeOutputs();
    advanceField();
  };

  const act = (deviceId: string, action: DeviceAction, args: ActionArgs = {}): ActionResult => {
    const i = wiring.indexOf.get(deviceId);
    if (i === undefined) return { ok: false, error: `no device "${deviceId}" on this panel` };
    const model = models[i]!;
    const perform = model.actions[action];
    if (!perform) return { ok: false, error: `${deviceId} is ${model.noun}: it cannot be given "${action}"` };
    const outcome = perform.call(model.actions, states[i], params[i], args);
    if (!outcome.ok) {
      emit(deviceId, 'refused', `${deviceId} ${action} refused: ${outcome.error}`);
      return { ok: false, error: outcome.error };
    }
    if (outcome.state === states[i]) return { ok: true };
    const commonsBefore = [allClosed(wiring.inputCommon), allClosed(wiring.outputCommon)] as const;
    states[i] = outcome.state;
    refresh(i);
    words[i] = model.word(outcome.state, params[i]);
    const commonsAfter = [allClosed(wiring.inputCommon), allClosed(wiring.outputCommon)] as const;
    const what = ACTION_WORDS[action](args, words[i]!);
    const commons = describeCommons(commonsBefore, commonsAfter);
    emit(deviceId, 'action', `${deviceId} ${what}${commons ? `: ${commons}` : ''}`);
    return { ok: true };
  };

  const viewOf = (i: number): DeviceView =>
    deviceView(devices[i]!, models[i]!, states[i], params[i], words[i]!, wiring.loadOf[i]! >= 0 ? inputs[i]!.energised : null);

  return {
    panel: wiring.panel,
    runtime,
    scanMs: dtMs,
    get timeMs() {
      return runtime.timeMs;
    },
    get scanCount() {
      return runtime.scanCount;
    },
    scan,
    run(ms) {
      const scans = Math.ceil(ms / dtMs);
      for (let n = 0; n < scans; n += 1) scan();
    },
    act,
    press: (id) => act(id, 'press'),
    release: (id) => act(id, 'release'),
    set: (id, position) => act(id, 'set', { to: position }),
    trip: (id) => act(id, 'trip'),
    reset: (id) => act(id, 'reset'),
    load: (id, factor) => act(id, 'load', { factor }),
    block: (id) => act(id, 'block'),
    unblock: (id) => act(id, 'unblock'),
    word: (id) => {
      const i = wiring.indexOf.get(id);
      return i === undefined ? undefined : words[i];
    },
    device: (id) => {
      const i = wiring.indexOf.get(id);
      return i === undefined ? undefined : viewOf(i);
    },
    devices: () => devices.map((_, i) => viewOf(i)),
    inputCommonLive: () => allClosed(wiring.inputCommon),
    outputCommonLive: () => allClosed(wiring.outputCommon),
    energised: (id) => {
      const i = wiring.indexOf.get(id);
      return i !== undefined && wiring.loadOf[i]! >= 0 && inputs[i]!.energised;
    },
    events: () => log.list(),
    eventsSince: (seq) => log.since(seq),
    eventLog: log,
    explain: () => explainIO({ wiring, runtime, states, params, words, energised: (i) => inputs[i]!.energised, closed, cutReason }),
    fieldSnapshot: () => ({
      panelId: wiring.panel.id,
      deviceIds: devices.map((d) => d.id),
      states: [...states],
      inputs: inputs.map((x) => ({ ...x })),
    }),
    fieldStates(into = new Array<unknown>(states.length)) {
      for (let i = 0; i < states.length; i += 1) into[i] = states[i];
      return into;
    },
    loadFieldStates(next) {
      for (let i = 0; i < states.length; i += 1) {
        if (states[i] === next[i]) continue;
        states[i] = next[i];
        words[i] = models[i]!.word(states[i], params[i]);
        refresh(i);
      }
    },
    preheat(deviceId, factor) {
      const i = wiring.indexOf.get(deviceId);
      if (i === undefined || models[i]!.gathers !== 'current') return { ok: false, error: `${deviceId} is not an overload relay on this panel` };
      states[i] = preheatedState(states[i] as OverloadState, factor);
      return { ok: true };
    },
    powerOff() {
      if (!runtime.powered) return;
      runtime.powerOff();
      emit(null, 'action', 'controller power off: no scan, every output open');
    },
    powerOn() {
      if (runtime.powered) return;
      runtime.powerOn();
      emit(null, 'action', 'controller power on: warm restart, retained variables kept, all others at their initial values');
    },
    probe(into) {
      const probe = into ?? { engine: runtime.saveState(), states: [], words: [] };
      if (into) runtime.saveState(into.engine);
      probe.states.length = 0;
      probe.words.length = 0;
      for (let i = 0; i < states.length; i += 1) {
        probe.states.push(states[i]);
        probe.words.push(words[i]!);
      }
      return probe;
    },
    quietScans(probe, timers = true) {
      // Words first: a word that moved may move contacts, and the next scan reads those.
      for (let i = 0; i < states.length; i += 1) if (words[i] !== probe.words[i]) return 0;
      let quiet = Number.POSITIVE_INFINITY;
      moving.length = 0;
      for (let i = 0; i < states.length && quiet > 0; i += 1) {
        const before = probe.states[i];
        if (states[i] === before) continue;
        moving.push(i);
        const model = models[i]!;
        quiet = Math.min(quiet, model.quietSteps && model.leap ? model.quietSteps(before, states[i], params[i], inputs[i]!, dtMs) : 0);
      }
      if (quiet === 0) return 0;
      return Math.min(quiet, runtime.quietScans(probe.engine, timers));
    },
    leap(scans) {
      if (scans <= 0) return;
      // Every device that changed in the probed scan has a closed form (quietScans said so).
      runtime.leap(scans);
      for (const i of moving) states[i] = models[i]!.leap!(states[i], params[i], inputs[i]!, dtMs, scans);
    },
    restoreField(snapshot) {
      const fits =
        snapshot.panelId === wiring.panel.id &&
        snapshot.deviceIds.length === devices.length &&
        devices.every((d, i) => snapshot.deviceIds[i] === d.id);
      if (!fits) return false;
      devices.forEach((_, i) => {
        states[i] = snapshot.states[i];
        words[i] = models[i]!.word(states[i], params[i]);
        Object.assign(inputs[i]!, snapshot.inputs[i]);
        refresh(i);
      });
      return true;
    },
  };
}
