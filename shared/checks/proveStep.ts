/**
 * The `prove` check step: the property decided over every behaviour of the program on the panel
 * from power-up (shared/proof), independent of where the script's other steps have taken the
 * panel. It passes when the property holds (`proved`, or `reached` for `reachable`); the report
 * carries the verdict and, when it fails, the counterexample as a check script. The caller (the
 * runner) gives the replay, since the proof's own `prove` imports the runner.
 */
import type { PanelLayout } from '../field/layout';
import type { Program } from '../ladder/schema';
import { decideProperties, type Replay } from '../proof/decide';
import { PropertySchema, propertyLabel, type Condition, type Property } from '../proof/property';
import type { CheckResult } from './report';
import type { ProveStep } from './script';

/**
 * A grading run must end: a proof step simulates at most this many scans (some seconds of CPU at
 * the rates `npm run bench -- proof` prints), then says "undecided" and fails.
 */
export const PROVE_STEP_MAX_SCANS = 1_000_000;

/** The property's main condition, shown as the check's `expected`. */
export function proveCondition(step: ProveStep): Condition {
  const p = step.prove as unknown as Property;
  if ('never' in p) return p.never;
  if ('always' in p) return p.always;
  if ('after' in p) return p.expect;
  return p.reachable;
}

export function proveLabel(step: ProveStep): string {
  return propertyLabel(step.prove as unknown as Property);
}

/** Run the proof of a `prove` step. `base` is the result's fields every check has. */
export function runProveStep(step: ProveStep, base: Omit<CheckResult, 'passed' | 'actual'>, program: Program, panel: PanelLayout, scanMs: number, replay: Replay): CheckResult {
  const property = PropertySchema.safeParse(step.prove);
  if (!property.success) return { ...base, passed: false, actual: {}, note: 'the property is not valid (docs/proof.md)' };
  const decided = decideProperties({ program, panel, properties: [property.data], scanMs, maxScans: PROVE_STEP_MAX_SCANS }, replay);
  if (!decided.ok) return { ...base, passed: false, actual: {}, note: `the proof cannot run: ${decided.errors.join('; ')}` };
  const r = decided.results[0]!;
  const passed = 'reachable' in property.data ? r.verdict === 'reached' : r.verdict === 'proved';
  return {
    ...base,
    passed,
    actual: {},
    ...(!passed && { note: r.verdict === 'unknown' ? `undecided: ${r.reason ?? ''}` : `${r.verdict}: the counterexample is in "proof"` }),
    proof: { verdict: r.verdict, states: r.states, ...(r.reason !== undefined && { reason: r.reason }), ...(r.counterexample && { counterexample: r.counterexample }) },
  };
}
