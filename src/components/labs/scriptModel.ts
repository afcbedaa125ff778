/**
 * The check-script editor's model: a script as a list of steps that the step-list editor changes
 * with pure edits, the raw JSON view of the same script, and live validation with the shared
 * parser and the panel fit check. The JSON is the source of truth on save; the step list and the
 * JSON convert both ways without loss (`scriptToJson` ∘ `parseScriptJson` is the identity on any
 * script the schema accepts).
 */
import { checkScriptAgainstPanel, kindsFor, parseCheckScript, STEP_ACTIONS, type CheckScriptInput, type Expectation, type StepAction } from '@shared/checks';
import { modelOf, type DeviceAction, type PanelLayout } from '@shared/field';

/** A step as the editor holds it: any step the schema admits (defaults not filled in). */
export type DraftStep = CheckScriptInput['steps'][number];

/** The script the editor holds: what a lab stores, as the author wrote it. */
export type DraftScript = CheckScriptInput;

/** What the live validation found: every message, and the messages of each step (1-based). */
export interface ScriptValidation {
  ok: boolean;
  errors: string[];
  /** Messages by step number (counting from 1, as the messages do); header problems under 0. */
  byStep: Map<number, string[]>;
}

/** Steps that name no device: time, checks, forces (a bit, not a device). */
const NO_DEVICE: ReadonlySet<StepAction> = new Set<StepAction>(['wait', 'expect', 'during', 'until', 'force', 'unforce', 'prove', 'power']);

/** The device actions of the runtime's device models (`preheat` names a device but is the runner's own). */
const DEVICE_ACTIONS_OF_STEPS = STEP_ACTIONS.filter((a): a is StepAction & DeviceAction => !NO_DEVICE.has(a) && a !== 'preheat');

/** Steps the step list shows as text only: their conditions are edited in the JSON view. */
export const JSON_ONLY_ACTIONS: ReadonlySet<StepAction> = new Set<StepAction>(['during', 'until', 'prove']);

/** Is this draft step a check (it earns points)? */
export function isDraftCheck(step: DraftStep): boolean {
  return 'expect' in step || 'during' in step || 'until' in step || 'prove' in step;
}

/** Words for each action in the step picker. */
export const ACTION_LABELS = {
  press: 'Press',
  release: 'Release',
  set: 'Set selector',
  trip: 'Trip overload',
  reset: 'Reset overload',
  load: 'Motor load',
  block: 'Block photo-eye',
  unblock: 'Clear photo-eye',
  wait: 'Wait',
  expect: 'Check',
  during: 'Check over a time',
  until: 'Check when it happens',
  force: 'Force a bit',
  unforce: 'Remove a force',
  preheat: 'Preheat overload',
  prove: 'Prove for every sequence',
  power: 'Controller power',
} as const satisfies Record<StepAction, string>;

/** The action a draft step takes (the first action key it has). */
export function draftAction(step: DraftStep): StepAction {
  return STEP_ACTIONS.find((a) => Object.hasOwn(step, a)) ?? 'wait';
}

/** Devices of `panel` that can take `action`, as `{ id, label }` for a picker. */
export function devicesFor(action: StepAction, panel: PanelLayout): { id: string; label: string }[] {
  if (NO_DEVICE.has(action)) return [];
  const kinds = new Set<string>(action === 'preheat' ? ['overload'] : kindsFor(action as DeviceAction));
  return panel.devices.filter((d) => kinds.has(d.kind)).map((d) => ({ id: d.id, label: `${d.id} ${d.label}` }));
}

/** One thing an `expect` can name, with the values it may take. */
export interface ExpectTarget {
  key: string;
  label: string;
  /** State words for a device; `[true, false]` for an address. */
  values: readonly (string | boolean)[];
}

/** Everything on `panel` an expectation can name: each device's state words, then every input and output bit. */
export function expectTargets(panel: PanelLayout): ExpectTarget[] {
  const devices: ExpectTarget[] = panel.devices
    .map((d) => ({ key: d.id, label: `${d.id} ${d.label}`, values: modelOf(d.kind).words(d.params) }))
    .filter((t) => t.values.length > 0);
  const fed = new Map(panel.devices.flatMap((d) => [d.feeds, d.drivenBy].filter((a): a is string => a !== undefined).map((a) => [a.toUpperCase(), d.id] as const)));
  const bits = (prefix: string, count: number): ExpectTarget[] =>
    Array.from({ length: count }, (_, i) => {
      const key = `${prefix}${i + 1}`;
      const device = fed.get(key);
      return { key, label: device ? `${key} (${device})` : key, values: [true, false] as const };
    });
  return [...devices, ...bits('%IX', panel.inputs), ...bits('%QX', panel.outputs)];
}

/** A new step of `action`, filled in with the first device that can take it. */
export function newStep(action: StepAction, panel: PanelLayout): DraftStep {
  const first = devicesFor(action, panel)[0]?.id ?? '';
  switch (action) {
    case 'wait':
      return { wait: 100 };
    case 'expect': {
      const target = expectTargets(panel)[0];
      return { expect: target ? { [target.key]: target.values[0]! } : {}, label: '', points: 1 };
    }
    case 'set': {
      const selector = panel.devices.find((d) => d.id === first && d.kind === 'selector');
      const to = selector?.kind === 'selector' ? (selector.params.positions[0] ?? '') : '';
      return { set: first, to };
    }
    case 'load':
      return { load: first, factor: 1 };
    case 'during':
    case 'until': {
      const target = expectTargets(panel)[0];
      const condition = target ? { [target.key]: target.values[0]! } : {};
      return action === 'during' ? { during: 1000, never: condition, points: 1 } : { until: condition, within: [0, 1000], points: 1 };
    }
    case 'force':
      return { force: '%IX1', to: true };
    case 'unforce':
      return { unforce: 'all' };
    case 'preheat':
      return { preheat: first, factor: 1 };
    case 'prove': {
      const target = expectTargets(panel)[0];
      return { prove: { never: target ? { [target.key]: target.values[0]! } : {} }, points: 1 };
    }
    case 'power':
      return { power: 'off' };
    default:
      return { [action]: first } as DraftStep;
  }
}

/** The steps with `step` inserted after position `after` (0-based; -1 = at the start). */
export function insertStep(steps: readonly DraftStep[], after: number, step: DraftStep): DraftStep[] {
  const at = Math.max(0, Math.min(steps.length, after + 1));
  return [...steps.slice(0, at), step, ...steps.slice(at)];
}

/** The steps without the one at `index`. */
export function removeStep(steps: readonly DraftStep[], index: number): DraftStep[] {
  return steps.filter((_, i) => i !== index);
}

/** The steps with the one at `index` moved by `by` places (clamped to the list). */
export function moveStep(steps: readonly DraftStep[], index: number, by: number): DraftStep[] {
  const to = Math.max(0, Math.min(steps.length - 1, index + by));
  if (to === index || index < 0 || index >= steps.length) return [...steps];
  const next = [...steps];
  const [moved] = next.splice(index, 1);
  next.splice(to, 0, moved!);
  return next;
}

/** The steps with the one at `index` replaced. */
export function replaceStep(steps: readonly DraftStep[], index: number, step: DraftStep): DraftStep[] {
  return steps.map((s, i) => (i === index ? step : s));
}

/** A step changed to another action, keeping its device when the new action can take it. */
export function changeAction(step: DraftStep, action: StepAction, panel: PanelLayout): DraftStep {
  const fresh = newStep(action, panel);
  const oldAction = draftAction(step);
  const oldDevice = (step as Record<string, unknown>)[oldAction];
  if (typeof oldDevice === 'string' && devicesFor(action, panel).some((d) => d.id === oldDevice)) {
    return { ...fresh, [action]: oldDevice } as DraftStep;
  }
  return fresh;
}

/** An `expect` step with one expectation set (or removed when `value` is undefined). */
export function setExpectation(step: DraftStep, key: string, value: Expectation | undefined): DraftStep {
  if (!('expect' in step)) return step;
  const expect = { ...step.expect };
  if (value === undefined) delete expect[key];
  else expect[key] = value;
  return { ...step, expect };
}

/** An `expect` step with its label, points or hidden flag changed; an empty label is dropped. */
export function setCheckField(step: DraftStep, field: 'label' | 'points' | 'hidden', value: string | number | boolean): DraftStep {
  if (!('expect' in step)) return step;
  const next: Record<string, unknown> = { ...step, [field]: value };
  if (field === 'label' && value === '') delete next.label;
  if (field === 'hidden' && value === false) delete next.hidden;
  return next as DraftStep;
}

/** Points of all checks (1 for a check that does not say). */
export function totalPoints(script: DraftScript): number {
  return script.steps.reduce((sum, step) => sum + (isDraftCheck(step) ? ((step as { points?: number }).points ?? 1) : 0), 0);
}

/** The raw JSON view of a script: two-space indent, steps in order. */
export function scriptToJson(script: DraftScript): string {
  return `${JSON.stringify(script, null, 2)}\n`;
}

/** What the raw JSON view holds: a script to show as a step list, or why it cannot be read. */
export type JsonReadResult = { ok: true; script: DraftScript } | { ok: false; error: string };

/** Read the JSON view back. Only the JSON syntax and the overall shape are required here; the
 * rest is the validation's job, so a half-written step still shows in the list with its message. */
export function parseScriptJson(text: string): JsonReadResult {
  let json: unknown;
  try {
    json = JSON.parse(text);
  } catch (error) {
    const detail = error instanceof Error ? error.message : String(error);
    return { ok: false, error: `The JSON cannot be read: ${detail}` };
  }
  if (typeof json !== 'object' || json === null || Array.isArray(json)) return { ok: false, error: 'A check script is a JSON object with "steps".' };
  const steps = (json as { steps?: unknown }).steps;
  if (!Array.isArray(steps)) return { ok: false, error: 'A check script needs "steps": a list of steps.' };
  if (steps.some((s) => typeof s !== 'object' || s === null || Array.isArray(s))) {
    const at = steps.findIndex((s) => typeof s !== 'object' || s === null || Array.isArray(s));
    return { ok: false, error: `Step ${at + 1} is not an object such as { "press": "S2" }.` };
  }
  return { ok: true, script: json as DraftScript };
}

/** Validate the script as the grader will: its shape (shared parser), then its fit to `panel`. */
export function validateScript(script: unknown, panel: PanelLayout): ScriptValidation {
  const parsed = parseCheckScript(script);
  const errors = parsed.ok ? checkScriptAgainstPanel(parsed.value, panel) : parsed.errors;
  const byStep = new Map<number, string[]>();
  for (const error of errors) {
    const match = /^step (\d+)\b/.exec(error);
    const step = match ? Number(match[1]) : 0;
    byStep.set(step, [...(byStep.get(step) ?? []), error]);
  }
  return { ok: errors.length === 0, errors, byStep };
}

/** One line for a step in the list: "press S2", "wait 100 ms", "check: K1 closed, P1 lit (2 pts, hidden)". */
export function describeDraftStep(step: DraftStep): string {
  const s = step as Record<string, unknown>;
  const action = draftAction(step);
  if (action === 'wait') return `wait ${String(s.wait)} ms`;
  if (action === 'set') return `set ${String(s.set)} to ${String(s.to)}`;
  if (action === 'load') return `load ${String(s.load)} at ${String(s.factor)} × FLA`;
  if (action === 'expect' && 'expect' in step) {
    const what = Object.entries(step.expect)
      .map(([k, v]) => `${k} ${typeof v === 'object' ? JSON.stringify(v) : String(v)}`)
      .join(', ');
    const points = step.points ?? 1;
    return `check${step.label ? ` “${step.label}”` : ''}: ${what || 'nothing yet'} (${points} pt${points === 1 ? '' : 's'}${step.hidden ? ', hidden' : ''})`;
  }
  if (action === 'during' && 'during' in step) {
    const kind = step.never ? 'never' : 'always';
    return `check${step.label ? ` “${step.label}”` : ''}: ${kind} ${conditionWords(step.never ?? step.always)} for ${String(step.during)} ms${pointWords(step)}`;
  }
  if (action === 'until' && 'until' in step) {
    const [from, to] = Array.isArray(step.within) ? step.within : [];
    return `check${step.label ? ` “${step.label}”` : ''}: ${conditionWords(step.until)} first between ${String(from)} and ${String(to)} ms${pointWords(step)}`;
  }
  if (action === 'force') return `force ${String(s.force)} to ${String(s.to)}`;
  if (action === 'unforce') return s.unforce === 'all' ? 'remove every force' : `remove the force on ${String(s.unforce)}`;
  if (action === 'preheat') return `preheat ${String(s.preheat)} (steady at ${String(s.factor)} × its setting)`;
  if (action === 'power') return s.power === 'on' ? 'controller power on (warm restart)' : 'controller power off';
  return `${action} ${String(s[action])}`;
}

/** "K1 closed, P1 lit" for a condition (or "nothing yet"). */
function conditionWords(condition: Record<string, Expectation> | undefined): string {
  const words = Object.entries(condition ?? {}).map(([k, v]) => `${k} ${typeof v === 'object' ? JSON.stringify(v) : String(v)}`);
  return words.length > 0 ? words.join(', ') : 'nothing yet';
}

/** " (2 pts, hidden)" for a check step. */
function pointWords(step: { points?: number; hidden?: boolean }): string {
  const points = step.points ?? 1;
  return ` (${points} pt${points === 1 ? '' : 's'}${step.hidden ? ', hidden' : ''})`;
}

/** Device actions a step can take, in the schema's order (for tests and pickers). */
export const DEVICE_STEP_ACTIONS: readonly StepAction[] = DEVICE_ACTIONS_OF_STEPS;
