/**
 * The simulation in the workbench: run, pause, step one scan, cold restart, scan period, speed,
 * device actions, forces, the trace's picked signals. A thin Pinia adapter (STYLE.md point 9) over
 * `src/simulation/session.ts` (the state) and `frameLoop.ts` (the pacing); components read the
 * computed views and call the actions. `tick` changes after every change of the simulation, so the
 * views recompute exactly then.
 */
import { defineStore } from 'pinia';
import { computed, ref, shallowRef } from 'vue';
import { DEFAULT_SCAN_MS } from '@shared/engine';
import {
  builtInPanel,
  DEFAULT_PANEL_ID,
  type ActionArgs,
  type ActionResult,
  type DeviceAction,
  type DeviceView,
  type IoExplanation,
  type PanelLayout,
} from '@shared/field';
import { sameData, shareByKey } from '@/simulation/sharing';
import type { Program } from '@shared/ladder/schema';
import { browserScheduler, createFrameLoop, type FrameScheduler } from '@/simulation/frameLoop';
import { createLiveView, elementIndex, type LiveView } from '@/simulation/liveView';
import type { SimulationSpeed } from '@/simulation/pacing';
import { createSimulatorSession, type LogEntry, type SimulatorSession } from '@/simulation/session';

/** Where the simulation is: never run since the last (re)start, running, or paused. */
export type SimulationMode = 'stopped' | 'running' | 'paused';

/**
 * Views refresh on every VIEW_EVERY-th animation frame while running: 20 Hz at 60 fps, quick enough
 * to follow a pushbutton by eye, and every page change then falls on one frame in three (in a
 * software-painted browser each changed frame costs a few ms of painting, whatever changed).
 */
export const VIEW_EVERY = 3;

export const useSimulationStore = defineStore('simulation', () => {
  const session = shallowRef<SimulatorSession | null>(null);
  const tick = ref(0);
  const mode = ref<SimulationMode>('stopped');
  const speed = ref<SimulationSpeed>('real');
  /** Virtual ms dropped in the latest frame (the page could not keep up); 0 when on time. */
  const behindMs = ref(0);
  /** Signals shown in the timing diagram, in order. */
  const traced = ref<string[]>(['%IX1', '%IX2', '%QX1', '%IX7']);
  let scheduler: FrameScheduler = browserScheduler();

  /**
   * Virtual time and scans, updated with the other views: a change to the page on the frames in
   * between would make the browser paint twice as many frames for a figure nobody can read at 60 Hz.
   */
  const clock = ref({ timeMs: 0, scanCount: 0 });
  let framesSinceView = 0;

  const changed = (): void => {
    tick.value += 1;
    framesSinceView = 0;
    const sim = session.value?.simulation;
    clock.value = { timeMs: sim?.timeMs ?? 0, scanCount: sim?.scanCount ?? 0 };
  };

  const loop = createFrameLoop({
    scheduler: {
      request: (cb) => scheduler.request(cb),
      cancel: (h) => scheduler.cancel(h),
    },
    speed: () => speed.value,
    scanMs: () => session.value?.scanMs ?? DEFAULT_SCAN_MS,
    onFrame(scans, behind) {
      behindMs.value = behind;
      session.value?.advance(scans);
      // The panel, table, clock and rungs redraw at most every VIEW_EVERY frames (20 Hz at 60 fps):
      // the scans themselves still run on every frame, and every change is shown within 50 ms.
      framesSinceView += 1;
      if (framesSinceView >= VIEW_EVERY) changed();
    },
  });

  /**
   * The running simulation, read so that the caller depends on `tick`: the simulation object stays
   * the same while it runs, so a computed holding only it would never tell its readers.
   */
  const current = () => {
    void tick.value;
    return session.value?.simulation ?? null;
  };
  const simulation = computed(current);
  const panel = computed<PanelLayout | null>(() => session.value?.panel ?? null);
  const program = computed<Program | null>(() => {
    void tick.value;
    return session.value?.program ?? null;
  });
  const scanMs = computed(() => {
    void tick.value;
    return session.value?.scanMs ?? DEFAULT_SCAN_MS;
  });
  const timeMs = computed(() => clock.value.timeMs);
  const scanCount = computed(() => clock.value.scanCount);
  // Shared with the previous refresh where unchanged, so only the devices and rows that changed re-render.
  const devices = computed<DeviceView[]>((previous) => shareByKey(previous ?? null, current()?.devices() ?? [], (d) => d.id));
  const io = computed<IoExplanation | null>((previous) => {
    const next = current()?.explain() ?? null;
    if (next === null || previous == null) return next;
    const inputs = shareByKey(previous.inputs, next.inputs, (r) => r.address);
    const outputs = shareByKey(previous.outputs, next.outputs, (r) => r.address);
    const same = inputs === previous.inputs && outputs === previous.outputs && sameData({ ...next, inputs: [], outputs: [] }, { ...previous, inputs: [], outputs: [] });
    return same ? previous : { ...next, inputs, outputs };
  });
  const forces = computed<ReadonlyMap<string, boolean>>((previous) => {
    const next = current()?.runtime.forces() ?? new Map<string, boolean>();
    if (previous && previous.size === next.size && [...next].every(([k, v]) => previous.get(k) === v)) return previous;
    return next;
  });
  // A copy (the session appends to its log in place), kept while no line was added, so the log view
  // re-renders only when something happened.
  const log = computed<readonly LogEntry[]>((previous) => {
    void tick.value;
    const all = session.value?.log ?? [];
    if (previous !== undefined && previous.at(-1)?.id === all.at(-1)?.id && previous.length === Math.min(all.length, 500)) return previous;
    return all.slice(-500);
  });
  const messages = computed(() => {
    void tick.value;
    return session.value?.messages ?? [];
  });
  const diagnostics = computed(() => {
    void tick.value;
    return session.value?.diagnostics ?? [];
  });
  /** The running program's elements by id, built once per program (not per frame). */
  const elements = computed(() => (program.value ? elementIndex(program.value) : null));
  /** Power flow and values per element id for the rung canvas; null before the first scan. */
  const liveView = computed<LiveView | null>(() => {
    const sim = current();
    const index = elements.value;
    if (sim === null || index === null || sim.scanCount === 0) return null;
    return createLiveView(sim.runtime, index);
  });

  /** Open a program on a panel (the default panel if none): a fresh, stopped simulation. */
  function load(next: Program, options: { panel?: PanelLayout; scanMs?: number } = {}): void {
    loop.stop();
    const layout = options.panel ?? builtInPanel(DEFAULT_PANEL_ID)!;
    session.value = createSimulatorSession({ program: next, panel: layout, scanMs: options.scanMs ?? scanMs.value });
    session.value.setExtraSignals(traced.value.filter((s) => !/^%[IQ]X\d+$/i.test(s)));
    mode.value = 'stopped';
    behindMs.value = 0;
    changed();
  }

  function run(): void {
    if (session.value?.simulation == null) return;
    mode.value = 'running';
    loop.start();
  }

  function pause(): void {
    loop.stop();
    if (mode.value === 'running') mode.value = 'paused';
    behindMs.value = 0;
    changed();
  }

  /** One scan, then paused. */
  function step(): void {
    if (session.value?.simulation == null) return;
    loop.stop();
    session.value.advance(1);
    mode.value = 'paused';
    changed();
  }

  /** Cold restart, stopped. */
  function reset(): void {
    loop.stop();
    session.value?.reset();
    mode.value = 'stopped';
    behindMs.value = 0;
    changed();
  }

  function setSpeed(next: SimulationSpeed): void {
    speed.value = next;
  }

  function setScanMs(ms: number): { ok: true } | { ok: false; error: string } {
    const result = session.value?.setScanMs(ms) ?? { ok: false as const, error: 'nothing is loaded' };
    changed();
    return result;
  }

  /** An edited program: recompiled at once, memory kept where it can be (see the session). */
  function setProgram(next: Program): void {
    const lastNote = session.value?.messages.at(-1)?.id ?? 0;
    session.value?.setProgram(next);
    // Stopped means nothing has run since the last (re)start: the edit is simply the program Run
    // will start, and the session's notes on recompiling "while running" and on the memory kept
    // would claim otherwise. (Device settings made while stopped are kept either way.)
    if (mode.value === 'stopped') {
      for (const m of session.value?.messages ?? []) if (m.id > lastNote && m.severity !== 'error') session.value?.dismissMessage(m.id);
    }
    if (session.value?.simulation == null) {
      loop.stop();
      if (mode.value === 'running') mode.value = 'paused';
    }
    changed();
  }

  function act(deviceId: string, action: DeviceAction, args?: ActionArgs): ActionResult {
    const result = session.value?.act(deviceId, action, args) ?? { ok: false as const, error: 'nothing is loaded' };
    changed();
    return result;
  }

  /** Hold a momentary device by hand (see the session: a press is seen by at least one scan). */
  function press(deviceId: string): ActionResult {
    const result = session.value?.press(deviceId) ?? { ok: false as const, error: 'nothing is loaded' };
    changed();
    return result;
  }

  function release(deviceId: string): ActionResult {
    const result = session.value?.release(deviceId) ?? { ok: false as const, error: 'nothing is loaded' };
    changed();
    return result;
  }

  function force(operand: string, value: boolean): { ok: true } | { ok: false; error: string } {
    const result = session.value?.force(operand, value) ?? { ok: false as const, error: 'nothing is loaded' };
    changed();
    return result;
  }

  function unforce(operand: string): void {
    session.value?.unforce(operand);
    changed();
  }

  function clearForces(): void {
    session.value?.clearForces();
    changed();
  }

  /** Show or hide a signal in the timing diagram. */
  function toggleTraced(signal: string): void {
    const list = traced.value.includes(signal) ? traced.value.filter((s) => s !== signal) : [...traced.value, signal];
    traced.value = list;
    session.value?.setExtraSignals(list.filter((s) => !/^%[IQ]X\d+$/i.test(s)));
    changed();
  }

  function dismissMessage(id: number): void {
    session.value?.dismissMessage(id);
    changed();
  }

  /** For tests: drive frames by hand. */
  function useScheduler(next: FrameScheduler): void {
    scheduler = next;
  }

  return {
    session,
    tick,
    mode,
    speed,
    behindMs,
    traced,
    simulation,
    panel,
    program,
    scanMs,
    timeMs,
    scanCount,
    devices,
    io,
    forces,
    log,
    messages,
    diagnostics,
    liveView,
    load,
    run,
    pause,
    step,
    reset,
    setSpeed,
    setScanMs,
    setProgram,
    act,
    press,
    release,
    force,
    unforce,
    clearForces,
    toggleTraced,
    dismissMessage,
    useScheduler,
  };
});
