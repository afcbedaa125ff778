/**
 * A simulator session: one program running against one panel, with the controls a student uses —
 * step, run a number of scans, cold restart, scan period, edits while running — the event log and
 * the trace. Plain TypeScript (no Vue): the Pinia store is a thin adapter over it and tests drive it
 * directly. The wall clock never enters here; `advance(n)` runs whole scans of virtual time.
 */
import { checkScanMs, DEFAULT_SCAN_MS, transferMemory, type Diagnostic } from '@shared/engine';
import {
  createSimulation,
  type ActionArgs,
  type ActionResult,
  type DeviceAction,
  type FieldEventKind,
  type PanelLayout,
  type Simulation,
} from '@shared/field';
import type { Program } from '@shared/ladder/schema';
import { createTraceBuffer, type TraceBuffer } from './traceBuffer';

/** A line of the event log: a field event, or something the session itself did. */
export interface LogEntry {
  /** Unique within the session, increasing. */
  id: number;
  /** Virtual time, ms. */
  atMs: number;
  scan: number;
  device: string | null;
  kind: FieldEventKind | 'session';
  message: string;
}

/** A message for the messages drawer: what happened to the student's edit or command. */
export interface SessionMessage {
  id: number;
  severity: 'info' | 'warning' | 'error';
  text: string;
}

export interface SessionOptions {
  program: Program;
  panel: PanelLayout;
  scanMs?: number;
  /** Log lines kept (latest); 1 000 if absent. */
  maxLog?: number;
}

export interface SimulatorSession {
  readonly panel: PanelLayout;
  /** The program running (the last one that compiled). */
  readonly program: Program;
  /** The running simulation, or null when no version of the program has compiled yet. */
  readonly simulation: Simulation | null;
  readonly scanMs: number;
  /** Errors of the latest program given, if it does not compile (then the previous one keeps running). */
  readonly diagnostics: readonly Diagnostic[];
  readonly log: readonly LogEntry[];
  readonly messages: readonly SessionMessage[];
  readonly trace: TraceBuffer;
  /** Signals recorded in the trace besides every input and output (e.g. `T1.ET`, `%MX3`). */
  readonly extraSignals: readonly string[];
  /** Run `count` whole scans (recording the trace after each). */
  advance(count: number): void;
  /** Cold restart: memory, timers, counters and forces cleared, panel back to rest, time 0. */
  reset(): void;
  /** Change the scan period (1..1000 ms), keeping the state. */
  setScanMs(ms: number): { ok: true } | { ok: false; error: string };
  /** Recompile an edited program, keeping memory where the document still has the same variables. */
  setProgram(program: Program): void;
  act(deviceId: string, action: DeviceAction, args?: ActionArgs): ActionResult;
  /**
   * Press a momentary device (pushbutton, limit switch) by hand; `release` lets it go. A press is
   * seen by at least one scan: a release before any scan has run is applied after the next one,
   * so a quick tap (or a press while stepping) is never lost between two scans.
   */
  press(deviceId: string): ActionResult;
  release(deviceId: string): ActionResult;
  force(operand: string, value: boolean): { ok: true } | { ok: false; error: string };
  unforce(operand: string): void;
  clearForces(): void;
  /** Record these signals too (members, memory bits); the I/O is always recorded. */
  setExtraSignals(signals: readonly string[]): void;
  dismissMessage(id: number): void;
}

/** Every `%IX`/`%QX` of a panel, the signals the trace always records. */
export function ioSignals(panel: PanelLayout): string[] {
  const out: string[] = [];
  for (let i = 1; i <= panel.inputs; i += 1) out.push(`%IX${i}`);
  for (let i = 1; i <= panel.outputs; i += 1) out.push(`%QX${i}`);
  return out;
}

/** Start a session; a program that does not compile leaves `simulation` null with its diagnostics. */
export function createSimulatorSession(options: SessionOptions): SimulatorSession {
  const panel = options.panel;
  const maxLog = options.maxLog ?? 1000;
  let program = options.program;
  let scanMs = options.scanMs ?? DEFAULT_SCAN_MS;
  let simulation: Simulation | null = null;
  let diagnostics: Diagnostic[] = [];
  let log: LogEntry[] = [];
  let messages: SessionMessage[] = [];
  let nextId = 1;
  let seenSeq = 0;
  let extras: string[] = [];
  /** Momentary devices pressed by hand: the scan count at the press. */
  const pressedAt = new Map<string, number>();
  /** Releases waiting for the first scan after their press. */
  const pendingReleases = new Set<string>();
  const trace = createTraceBuffer();
  trace.setSignals(ioSignals(panel));

  const note = (severity: SessionMessage['severity'], text: string): void => {
    messages = [...messages.slice(-19), { id: nextId++, severity, text }];
  };
  const logSession = (message: string): void => {
    push({ atMs: simulation?.timeMs ?? 0, scan: simulation?.scanCount ?? 0, device: null, kind: 'session', message });
  };
  const push = (entry: Omit<LogEntry, 'id'>): void => {
    log.push({ id: nextId++, ...entry });
    if (log.length > maxLog + 100) log = log.slice(log.length - maxLog);
  };
  /** Move new field events into the session log. */
  const pullEvents = (): void => {
    if (simulation === null) return;
    for (const e of simulation.eventsSince(seenSeq)) {
      push({ atMs: e.atMs, scan: e.scan, device: e.device, kind: e.kind, message: e.message });
      seenSeq = e.seq + 1;
    }
  };
  const record = (): void => {
    const sim = simulation;
    if (sim === null) return;
    trace.record(sim.timeMs, (signal) => sim.runtime.read(signal));
  };

  /** A fresh simulation of `prog`, or the compile failure as diagnostics. */
  const build = (prog: Program, ms: number) => {
    // The live view reads power flow after every scan: only the recording kernel is compiled.
    return createSimulation({ program: prog, panel, scanMs: ms, maxEvents: 2000, recordPowerFlow: true });
  };

  const start = (): void => {
    const built = build(program, scanMs);
    if (built.ok) {
      simulation = built.simulation;
      diagnostics = [];
    } else {
      simulation = null;
      diagnostics = built.diagnostics;
      note('error', `Cannot run: ${built.error}`);
    }
    seenSeq = 0;
  };

  /**
   * Replace the running simulation by one of `prog` at `ms`, carrying over memory (transferMemory)
   * and the field. Returns false, changing nothing, when `prog` does not compile.
   */
  const rebuild = (prog: Program, ms: number, why: 'edit' | 'scan'): boolean => {
    const built = build(prog, ms);
    if (!built.ok) {
      diagnostics = built.diagnostics;
      if (why === 'edit') {
        note('error', simulation ? `The edit does not compile; still running the previous version. ${built.error}` : `Cannot run: ${built.error}`);
      } else note('error', built.error);
      return false;
    }
    diagnostics = [];
    const old = simulation;
    const next = built.simulation;
    if (old !== null) {
      const report = transferMemory(old.runtime, next.runtime);
      next.restoreField(old.fieldSnapshot());
      if (why === 'edit') {
        const lost = report.dropped;
        if (lost.length > 0) {
          note('warning', `Recompiled while running; could not keep ${lost.join(', ')} (removed, renamed or of another type now): those start fresh.`);
        } else {
          note('info', `Recompiled while running; memory kept${report.kept.length > 0 ? ` (${report.kept.join(', ')})` : ''}.`);
        }
        logSession(`program recompiled${lost.length > 0 ? `; started fresh: ${lost.join(', ')}` : '; memory kept'}`);
      } else {
        logSession(`scan period set to ${ms} ms`);
      }
    }
    simulation = next;
    program = prog;
    scanMs = ms;
    // The new simulation's own event log starts empty.
    seenSeq = 0;
    return true;
  };

  const actOn = (deviceId: string, action: DeviceAction, args?: ActionArgs): ActionResult => {
    if (simulation === null) return { ok: false, error: 'the program does not compile yet, so the panel is not powered' };
    const result = simulation.act(deviceId, action, args);
    pullEvents();
    return result;
  };

  start();

  return {
    panel,
    get program() {
      return program;
    },
    get simulation() {
      return simulation;
    },
    get scanMs() {
      return scanMs;
    },
    get diagnostics() {
      return diagnostics;
    },
    get log() {
      return log;
    },
    get messages() {
      return messages;
    },
    trace,
    get extraSignals() {
      return extras;
    },
    advance(count) {
      const sim = simulation;
      if (sim === null) return;
      for (let i = 0; i < count; i += 1) {
        sim.scan();
        record();
        if (i === 0 && pendingReleases.size > 0) {
          for (const id of pendingReleases) sim.release(id);
          pendingReleases.clear();
        }
      }
      pullEvents();
    },
    reset() {
      pressedAt.clear();
      pendingReleases.clear();
      const forced = simulation?.runtime.forces().size ?? 0;
      start();
      trace.clear();
      logSession(`cold restart: memory, timers and counters cleared${forced > 0 ? ', forces removed' : ''}, panel at rest`);
    },
    setScanMs(ms) {
      const checked = checkScanMs(ms);
      if (!checked.ok) return { ok: false, error: checked.error };
      if (ms === scanMs) return { ok: true };
      if (simulation === null) {
        scanMs = ms;
        return { ok: true };
      }
      return rebuild(program, ms, 'scan') ? { ok: true } : { ok: false, error: 'the program does not compile' };
    },
    setProgram(next) {
      if (next === program && simulation !== null) return;
      if (simulation === null) {
        program = next;
        start();
        if (simulation !== null) logSession('program compiled: ready to run');
        return;
      }
      rebuild(next, scanMs, 'edit');
    },
    act: actOn,
    press(deviceId) {
      if (simulation === null) return actOn(deviceId, 'press');
      pendingReleases.delete(deviceId);
      pressedAt.set(deviceId, simulation.scanCount);
      return actOn(deviceId, 'press');
    },
    release(deviceId) {
      const at = pressedAt.get(deviceId);
      pressedAt.delete(deviceId);
      if (simulation !== null && at !== undefined && at === simulation.scanCount) {
        pendingReleases.add(deviceId);
        return { ok: true };
      }
      return actOn(deviceId, 'release');
    },
    force(operand, value) {
      if (simulation === null) return { ok: false, error: 'nothing is running' };
      const result = simulation.runtime.force(operand, value);
      if (!result.ok) return { ok: false, error: result.error };
      logSession(`${operand} forced ${value ? 'ON' : 'OFF'}`);
      return { ok: true };
    },
    unforce(operand) {
      if (simulation === null) return;
      simulation.runtime.unforce(operand);
      logSession(`${operand} force removed`);
    },
    clearForces() {
      if (simulation === null || simulation.runtime.forces().size === 0) return;
      simulation.runtime.clearForces();
      logSession('all forces removed');
    },
    setExtraSignals(signals) {
      extras = [...new Set(signals)];
      trace.setSignals([...ioSignals(panel), ...extras]);
    },
    dismissMessage(id) {
      messages = messages.filter((m) => m.id !== id);
    },
  };
}
