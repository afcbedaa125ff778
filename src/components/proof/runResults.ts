/**
 * What a run of the prover leaves on screen, per property: the verdict with its figures, or, for a
 * run the user stopped, `unknown` saying so (never `proved`). Results are keyed by the property's
 * content (its label aside), so relabelling a property keeps its result and editing it does not.
 */
import { stepSpanMs, type CheckScript } from '@shared/checks';
import type { Property, PropertyResult, Verdict } from '@shared/proof';
import type { ProverOutcome } from '@/proof/proverClient';

/** A property's content without its label: the key of its result. */
export function propertyKey(p: Property): string {
  const { label: _label, ...rest } = p;
  return JSON.stringify(rest);
}

export interface ShownResult {
  result: PropertyResult;
  /** The document and panel the run was on (a later edit makes it stale). */
  doc: unknown;
  panel: unknown;
}

export type RunSummary =
  | { kind: 'done'; results: Map<string, PropertyResult>; abstractions: readonly string[]; ignoredDevices: readonly string[]; ms: number }
  /** The prover refused the inputs: what and where (a key not on the panel, a program that does not compile). */
  | { kind: 'refused'; errors: string[]; /** When only some properties were refused: which (0-based); the rest may run alone. */ only?: readonly number[] }
  | { kind: 'failed'; message: string };

/** Turn a worker outcome into results per property key. */
export function summarise(properties: readonly Property[], outcome: ProverOutcome): RunSummary {
  if (outcome.kind === 'failed') return { kind: 'failed', message: `The prover failed (a fault of the prover, not of your program): ${outcome.message}` };
  if (outcome.kind === 'stopped') {
    const p = outcome.progress;
    const reason = p ? `stopped by you after ${p.states} states; every behaviour up to ${p.depth} scans from power-up was explored` : 'stopped by you before the first progress report';
    const results = new Map<string, PropertyResult>();
    for (const property of properties) {
      results.set(propertyKey(property), { label: property.label ?? '', verdict: 'unknown', states: p?.states ?? 0, transitions: 0, depth: p?.depth ?? 0, reason });
    }
    return { kind: 'done', results, abstractions: [], ignoredDevices: [], ms: 0 };
  }
  const { result, ms } = outcome.answer;
  if (!result.ok) {
    const only = result.refusedProperties;
    return only !== undefined && only.length < properties.length ? { kind: 'refused', errors: result.errors, only } : { kind: 'refused', errors: result.errors };
  }
  const results = new Map<string, PropertyResult>();
  properties.forEach((property, i) => {
    const r = result.results[i];
    if (r) results.set(propertyKey(property), r);
  });
  return { kind: 'done', results, abstractions: result.abstractions, ignoredDevices: result.ignoredDevices, ms };
}

/** How a verdict reads in the list; a defect is the prover's fault, whatever its verdict field. */
export function verdictText(r: PropertyResult): string {
  if (r.defect) return 'Prover fault';
  const words: Record<Verdict, string> = { proved: 'Proved', refuted: 'Refuted', reached: 'Reached', unreachable: 'Unreachable', unknown: 'Unknown' };
  return words[r.verdict];
}

/** Good, bad or undecided, for the badge's colour (and its words, never the colour alone). */
export function verdictTone(r: PropertyResult, property: Property): 'holds' | 'fails' | 'undecided' | 'fault' {
  if (r.defect) return 'fault';
  if (r.verdict === 'unknown') return 'undecided';
  const reachable = 'reachable' in property;
  if (r.verdict === 'proved' || (reachable && r.verdict === 'reached')) return 'holds';
  return 'fails';
}

/** "1,204 states · 38 ms". */
export function figures(r: PropertyResult): string {
  const parts = [`${r.states.toLocaleString('en-US')} states`];
  if (r.ms !== undefined) parts.push(`${r.ms} ms`);
  return parts.join(' · ');
}

/** "4 steps, 10 ms": how long a counterexample or witness is, in steps and virtual time. */
export function scriptLength(script: CheckScript): string {
  const ms = script.steps.reduce((sum, step) => sum + stepSpanMs(step), 0);
  return `${script.steps.length} steps, ${ms} ms`;
}

/** A counterexample or witness that may be played and kept: never one from a defect. */
export function playable(r: PropertyResult): boolean {
  return r.counterexample !== undefined && !r.defect && (r.verdict === 'refuted' || r.verdict === 'reached');
}
