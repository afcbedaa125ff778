/**
 * Deciding properties of a program on a panel by exploring every behaviour from power-up
 * (`model.ts`, `explore.ts`). Verdicts never claim more than the search saw:
 *  - `proved` / `unreachable` only when the search visited every reachable state;
 *  - `refuted` / `reached` only with a counterexample or witness that the ordinary check runner
 *    has replayed on the simulator and seen pass; one that does not replay is a defect of the
 *    proof, reported as `unknown` with `defect` set, never shown as real;
 *  - `unknown` otherwise, with the reason and how far the search got.
 * Stateless properties (never, always, reachable) share one search; each `after` property has its
 * own, since its monitor is part of the state.
 */
import type { Program } from '../ladder/schema';
import type { PanelLayout } from '../field/layout';
import { checkScanMs, DEFAULT_SCAN_MS, type Diagnostic } from '../engine';
import { checkScriptAgainstPanel } from '../checks/againstPanel';
import type { CheckScript } from '../checks/script';
import { modelOf } from '../field/devices';
import { ABSTRACTIONS, UNOBSERVABLE_KINDS } from './abstraction';
import { counterexampleScript, type ScriptContext } from './counterexample';
import { search, type SearchNode, type SearchProgress, type SearchResult } from './explore';
import { goalOf, readKey } from './goals';
import { buildModel, type ProofModel } from './model';
import { conditionsOf, propertyKind, propertyLabel, type Condition, type Property } from './property';

export type Verdict = 'proved' | 'refuted' | 'reached' | 'unreachable' | 'unknown';

export interface PropertyResult {
  label: string;
  verdict: Verdict;
  /** States visited by the search that decided it. */
  states: number;
  /** Scans simulated by that search (each state is left by one scan per set of moves). */
  transitions: number;
  /** Scans from power-up the search covered completely. */
  depth: number;
  /** Why `unknown`. */
  reason?: string;
  /** A counterexample or witness did not replay: a fault of the proof, not of the program. */
  defect?: boolean;
  /** The path as a check script (refuted: the violation; reached: the witness). */
  counterexample?: CheckScript;
  /** Milliseconds the search took, when the caller gave a clock. */
  ms?: number;
}

/** Runs a counterexample script on the simulator: null when every step passes, else what failed. */
export type Replay = (script: CheckScript) => string | null;

export interface ProveOptions {
  program: Program;
  panel: PanelLayout;
  properties: readonly Property[];
  /** Scan period, ms (10 if omitted). */
  scanMs?: number;
  /** Budget of visited states per search (200 000 if omitted). */
  maxStates?: number;
  /** Budget of simulated scans per search (none if omitted): bounds the time a search can take. */
  maxScans?: number;
  /** Asked now and then; true stops the search (its verdicts become `unknown`). */
  shouldStop?: (progress: SearchProgress) => boolean;
  /** A clock the caller supplies (shared code has none), to stamp each result with `ms`. */
  now?: () => number;
}

export type ProveResult =
  | { ok: true; results: PropertyResult[]; abstractions: readonly string[]; ignoredDevices: readonly string[]; warnings: Diagnostic[] }
  | {
      ok: false;
      errors: string[];
      diagnostics?: Diagnostic[];
      /**
       * When every error is about a property (a key not on the panel, a name the program lacks):
       * which ones (0-based), so a caller may ask the others alone.
       */
      refusedProperties?: number[];
    };

/** An error about one property: its index (0-based) and the message, which names it. */
interface PropertyError {
  readonly index: number;
  readonly message: string;
}

function refusal(errors: readonly PropertyError[]): ProveResult {
  return { ok: false, errors: errors.map((e) => e.message), refusedProperties: [...new Set(errors.map((e) => e.index))] };
}

export const DEFAULT_MAX_STATES = 200_000;

/** Every reason a property cannot be asked of this panel, each naming the property. */
function propertyErrors(properties: readonly Property[], panel: PanelLayout, scanMs: number): PropertyError[] {
  const errors: PropertyError[] = [];
  const byId = new Map(panel.devices.map((d) => [d.id, d] as const));
  properties.forEach((p, i) => {
    const at = `property ${i + 1} (${propertyLabel(p)})`;
    const steps = conditionsOf(p).map((c) => ({ expect: c }));
    const script = { panel: panel.id, scanMs, settleMs: 0, steps };
    for (const e of checkScriptAgainstPanel(script, panel)) errors.push({ index: i, message: e.replace(/^step \d+/, at) });
    for (const c of conditionsOf(p)) {
      for (const key of Object.keys(c)) {
        const device = byId.get(key);
        const why = device ? UNOBSERVABLE_KINDS[device.kind] : undefined;
        if (device && why) errors.push({ index: i, message: `${at}: "${key}" is ${modelOf(device.kind).noun}: ${why}` });
      }
    }
  });
  return errors;
}

/** Keys that are neither devices nor values this program has (a tag it does not define…). */
function unknownKeys(model: ProofModel, properties: readonly Property[]): PropertyError[] {
  const errors: PropertyError[] = [];
  properties.forEach((p, i) => {
    for (const c of conditionsOf(p)) {
      for (const key of Object.keys(c)) {
        if (readKey(model.sim, key) === null) errors.push({ index: i, message: `property ${i + 1} (${propertyLabel(p)}): "${key}" names nothing in this program or on panel ${model.wiring.panel.id}` });
      }
    }
  });
  return errors;
}

/**
 * `prove` with the replay given: the check runner passes its own (it cannot import `prove.ts`,
 * which imports the runner), everyone else calls `prove`.
 */
export function decideProperties(options: ProveOptions, replay: Replay): ProveResult {
  const scan = checkScanMs(options.scanMs ?? DEFAULT_SCAN_MS);
  if (!scan.ok) return { ok: false, errors: [scan.error] };
  const scanMs = scan.value;
  const { program, panel, properties } = options;
  // Every property's errors at once (those the panel refuses are not looked up in the program),
  // so a caller that leaves the refused ones out is answered for the rest.
  const errors = propertyErrors(properties, panel, scanMs);
  const panelRefused = new Set(errors.map((e) => e.index));
  const readKeys = [...new Set(properties.flatMap((p, i) => (panelRefused.has(i) ? [] : conditionsOf(p).flatMap((c) => Object.keys(c)))))];
  const built = buildModel(program, panel, scanMs, readKeys);
  if (!built.ok) return { ok: false, errors: [built.error], diagnostics: built.diagnostics };
  errors.push(...unknownKeys(built.model, properties).filter((e) => !panelRefused.has(e.index)));
  if (errors.length > 0) return refusal(errors.sort((a, b) => a.index - b.index));

  const maxStates = options.maxStates ?? DEFAULT_MAX_STATES;
  const results: PropertyResult[] = new Array<PropertyResult>(properties.length);
  const groups: number[][] = [];
  const stateless = properties.map((_, i) => i).filter((i) => propertyKind(properties[i]!) !== 'after');
  if (stateless.length > 0) groups.push(stateless);
  properties.forEach((p, i) => {
    if (propertyKind(p) === 'after') groups.push([i]);
  });

  for (const group of groups) {
    const start = options.now?.();
    // A fresh model per search: the simulation is at power-up when the search starts.
    const fresh = buildModel(program, panel, scanMs, readKeys);
    if (!fresh.ok) return { ok: false, errors: [fresh.error], diagnostics: fresh.diagnostics };
    const model = fresh.model;
    const goals = group.map((i) => goalOf(model.sim, properties[i]!));
    const found = search(model, goals, { maxStates, maxScans: options.maxScans, shouldStop: options.shouldStop });
    const ms = start !== undefined && options.now ? Math.round(options.now() - start) : undefined;
    group.forEach((i, g) => {
      results[i] = { ...decide(properties[i]!, found, found.hits[g] ?? null, g, model, options, scanMs, replay), ...(ms !== undefined && { ms }) };
    });
  }
  return { ok: true, results, abstractions: ABSTRACTIONS, ignoredDevices: built.model.ignored, warnings: built.warnings };
}

function decide(property: Property, found: SearchResult, hit: SearchNode | null, goal: number, model: ProofModel, options: ProveOptions, scanMs: number, replay: Replay): PropertyResult {
  const label = propertyLabel(property);
  const figures = { states: found.states, transitions: found.transitions, depth: found.depth };
  const reachable = 'reachable' in property;
  if (hit === null) {
    if (found.complete) return { label, verdict: reachable ? 'unreachable' : 'proved', ...figures };
    const why =
      found.cutBy === 'states' ? `state limit of ${options.maxStates ?? DEFAULT_MAX_STATES} reached` : found.cutBy === 'scans' ? `limit of ${options.maxScans ?? 0} simulated scans reached` : 'stopped';
    return { label, verdict: 'unknown', ...figures, reason: `${why} after ${found.states} states; every behaviour up to ${found.depth} scans (${found.depth * scanMs} ms) from power-up was explored without a ${reachable ? 'witness' : 'counterexample'}` };
  }
  const ctx: ScriptContext = {
    panelId: model.wiring.panel.id,
    scanMs,
    deviceIds: model.wiring.devices.map((d) => d.id),
    actual(node, keys) {
      model.load(node.bytes, node.field);
      const values: Condition = {};
      for (const key of keys) {
        const v = readKey(model.sim, key);
        if (v !== null) values[key] = v;
      }
      return values;
    },
  };
  const script = counterexampleScript(property, label, hit, goal, ctx);
  const failed = replay(script);
  if (failed !== null) {
    return { label, verdict: 'unknown', ...figures, defect: true, reason: `defect: the ${reachable ? 'witness' : 'counterexample'} found did not replay in the simulator (${failed})`, counterexample: script };
  }
  return { label, verdict: reachable ? 'reached' : 'refuted', ...figures, counterexample: script };
}
