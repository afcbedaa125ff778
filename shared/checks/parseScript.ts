/**
 * Reads a check script (already parsed JSON) with messages that name the step, the field and
 * what was expected. Returns every problem found, never throws.
 */
import { PropertySchema } from '../proof/property';
import { CHECK_ACTIONS, CheckScriptSchema, MAX_LOAD_FACTOR, MAX_PREHEAT_FACTOR, MAX_WAIT_MS, STEP_ACTIONS, STEP_SCHEMAS, type CheckScript, type Step, type StepAction } from './script';

export type ScriptResult = { ok: true; value: CheckScript } | { ok: false; errors: string[] };

/** The script's fields other than its steps (built once: deriving a schema is slow). */
const HeaderSchema = CheckScriptSchema.omit({ steps: true });

const show = (value: unknown): string => (value === undefined ? 'nothing' : JSON.stringify(value));

/** The fields each action's step may have, besides its own key. */
const EXTRA_FIELDS = {
  press: [],
  release: [],
  set: ['to'],
  trip: [],
  reset: [],
  load: ['factor'],
  block: [],
  unblock: [],
  wait: [],
  expect: ['label', 'points', 'hidden'],
  during: ['never', 'always', 'label', 'points', 'hidden'],
  until: ['within', 'label', 'points', 'hidden'],
  force: ['to'],
  unforce: [],
  preheat: ['factor'],
  prove: ['label', 'points', 'hidden'],
  power: [],
} as const satisfies Record<StepAction, readonly string[]>;

type StepChecker = (step: Record<string, unknown>, at: string) => string[];

const needsDevice = (action: StepAction, example: string): StepChecker => (step, at) =>
  typeof step[action] === 'string' && step[action] !== ''
    ? []
    : [`${at}: "${action}" needs a device id such as "${example}", got ${show(step[action])}`];

const isFiniteNumber = (v: unknown): v is number => typeof v === 'number' && Number.isFinite(v);

function checkExpectation(key: string, value: unknown, at: string): string | null {
  if (typeof value === 'boolean' || isFiniteNumber(value)) return null;
  if (typeof value === 'string' && value !== '') return null;
  if (typeof value === 'object' && value !== null && !Array.isArray(value)) {
    const keys = Object.keys(value);
    const range = value as Record<string, unknown>;
    const bad = keys.filter((k) => k !== 'min' && k !== 'max');
    if (keys.length > 0 && bad.length === 0 && keys.every((k) => isFiniteNumber(range[k]))) return null;
  }
  return `${at}: expect "${key}" takes true/false, a number, a state word such as "closed", or { "min": …, "max": … }; got ${show(value)}`;
}

/** `label`, `points`, `hidden` of a check step. */
function checkFieldsOf(step: Record<string, unknown>, at: string): string[] {
  const errors: string[] = [];
  if (step.label !== undefined && (typeof step.label !== 'string' || step.label.length > 200)) {
    errors.push(`${at}: "label" is text of at most 200 characters, got ${show(step.label)}`);
  }
  if (step.points !== undefined && !(Number.isInteger(step.points) && (step.points as number) >= 0 && (step.points as number) <= 100)) {
    errors.push(`${at}: "points" is a whole number from 0 to 100, got ${show(step.points)}`);
  }
  if (step.hidden !== undefined && typeof step.hidden !== 'boolean') {
    errors.push(`${at}: "hidden" is true or false, got ${show(step.hidden)}`);
  }
  return errors;
}

/** A condition object (`expect`, `never`, `always`, `until`): one or more names with what they should read. */
function conditionOf(field: string, value: unknown, at: string): string[] {
  if (typeof value !== 'object' || value === null || Array.isArray(value) || Object.keys(value).length === 0) {
    return [`${at}: "${field}" needs an object of what to check, e.g. { "K1": "closed", "%QX1": true }; got ${show(value)}`];
  }
  return Object.entries(value).flatMap(([key, v]) => {
    const problem = checkExpectation(key, v, at);
    return problem ? [problem.replace(': expect "', `: ${field} "`)] : [];
  });
}

const isWholeMs = (v: unknown): v is number => Number.isInteger(v) && (v as number) >= 0 && (v as number) <= MAX_WAIT_MS;

const STEP_CHECKS = {
  press: needsDevice('press', 'S2'),
  release: needsDevice('release', 'S2'),
  set: (step, at) => [
    ...needsDevice('set', 'S4')(step, at),
    ...(typeof step.to === 'string' && step.to !== '' ? [] : [`${at}: "set" needs "to": the position name, e.g. "RUN"; got ${show(step.to)}`]),
  ],
  trip: needsDevice('trip', 'F1'),
  reset: needsDevice('reset', 'F1'),
  load: (step, at) => [
    ...needsDevice('load', 'M1')(step, at),
    ...(isFiniteNumber(step.factor) && step.factor >= 0 && step.factor <= MAX_LOAD_FACTOR
      ? []
      : [`${at}: "load" needs "factor": the load as a multiple of FLA from 0 to ${MAX_LOAD_FACTOR} (6 ≈ jammed); got ${show(step.factor)}`]),
  ],
  block: needsDevice('block', 'B1'),
  unblock: needsDevice('unblock', 'B1'),
  wait: (step, at) =>
    Number.isInteger(step.wait) && (step.wait as number) >= 0 && (step.wait as number) <= MAX_WAIT_MS
      ? []
      : [`${at}: "wait" needs a whole number of ms from 0 to ${MAX_WAIT_MS}, got ${show(step.wait)}`],
  expect: (step, at) => [...conditionOf('expect', step.expect, at), ...checkFieldsOf(step, at)],
  during: (step, at) => {
    const errors: string[] = [];
    if (!(isWholeMs(step.during) && step.during >= 1)) errors.push(`${at}: "during" needs a whole number of ms from 1 to ${MAX_WAIT_MS}, got ${show(step.during)}`);
    const has = (['never', 'always'] as const).filter((k) => step[k] !== undefined);
    if (has.length !== 1) errors.push(`${at}: a "during" step needs exactly one of "never" and "always", got ${has.length === 0 ? 'neither' : 'both'}`);
    for (const k of has) errors.push(...conditionOf(k, step[k], at));
    return [...errors, ...checkFieldsOf(step, at)];
  },
  until: (step, at) => {
    const errors = conditionOf('until', step.until, at);
    const w = step.within;
    if (!(Array.isArray(w) && w.length === 2 && isWholeMs(w[0]) && isWholeMs(w[1]) && w[0] <= w[1])) {
      errors.push(`${at}: "until" needs "within": [earliest, latest] in whole ms from 0 to ${MAX_WAIT_MS}, earliest ≤ latest, e.g. [4000, 10000]; got ${show(w)}`);
    }
    return [...errors, ...checkFieldsOf(step, at)];
  },
  force: (step, at) => [
    ...(typeof step.force === 'string' && step.force !== '' ? [] : [`${at}: "force" needs a bit: an address such as "%IX2" or a tag, got ${show(step.force)}`]),
    ...(typeof step.to === 'boolean' ? [] : [`${at}: "force" needs "to": true or false, got ${show(step.to)}`]),
  ],
  unforce: (step, at) =>
    typeof step.unforce === 'string' && step.unforce !== '' ? [] : [`${at}: "unforce" needs a bit such as "%IX2", or "all", got ${show(step.unforce)}`],
  preheat: (step, at) => [
    ...needsDevice('preheat', 'F1')(step, at),
    ...(isFiniteNumber(step.factor) && step.factor >= 0 && step.factor <= MAX_PREHEAT_FACTOR
      ? []
      : [`${at}: "preheat" needs "factor": the steady current before the test as a multiple of the setting, from 0 (cold) to ${MAX_PREHEAT_FACTOR} (hot); got ${show(step.factor)}`]),
  ],
  prove: (step, at) => {
    const property = PropertySchema.safeParse(step.prove);
    const errors = property.success
      ? []
      : [`${at}: "prove" needs a property such as { "never": { "%QX1": true, "%QX2": true } } (docs/proof.md); ${property.error.issues.map((i) => `${['prove', ...i.path].join('.')}: ${i.message}`).join('; ')}`];
    return [...errors, ...checkFieldsOf(step, at)];
  },
  power: (step, at) => (step.power === 'off' || step.power === 'on' ? [] : [`${at}: "power" is "off" (the controller loses power) or "on" (a warm restart), got ${show(step.power)}`]),
} as const satisfies Record<StepAction, StepChecker>;

function checkStep(raw: unknown, number: number): string[] {
  const at = `step ${number}`;
  if (typeof raw !== 'object' || raw === null || Array.isArray(raw)) return [`${at}: a step is an object such as { "press": "S2" }, got ${show(raw)}`];
  const step = raw as Record<string, unknown>;
  const actions = STEP_ACTIONS.filter((a) => Object.hasOwn(step, a));
  if (actions.length === 0) return [`${at}: no action; a step has one of ${STEP_ACTIONS.join(', ')}`];
  if (actions.length > 1) return [`${at}: one action per step, got ${actions.map((a) => `"${a}"`).join(' and ')}`];
  const action = actions[0]!;
  const allowed = new Set<string>([action, ...EXTRA_FIELDS[action]]);
  const unknown = Object.keys(step).filter((k) => !allowed.has(k));
  const errors = unknown.map((k) => {
    const article = /^[aeiou]/.test(action) ? 'an' : 'a';
    const takes = EXTRA_FIELDS[action].length > 0 ? ` (${article} "${action}" step also takes ${EXTRA_FIELDS[action].join(', ')})` : '';
    return `${at}: unknown field "${k}"${takes}`;
  });
  return [...errors, ...STEP_CHECKS[action](step, at)];
}

/** Read a check script, checking its shape step by step. */
export function parseCheckScript(json: unknown): ScriptResult {
  if (typeof json !== 'object' || json === null || Array.isArray(json)) {
    return { ok: false, errors: ['a check script is a JSON object with "steps"'] };
  }
  const script = json as Record<string, unknown>;
  const errors: string[] = [];
  const known = new Set(['panel', 'scanMs', 'settleMs', 'title', 'steps']);
  for (const key of Object.keys(script)) if (!known.has(key)) errors.push(`unknown field "${key}" (a script has panel, scanMs, settleMs, title, steps)`);
  if (script.panel !== undefined && (typeof script.panel !== 'string' || script.panel === '')) errors.push(`"panel" is a panel id, got ${show(script.panel)}`);
  if (script.scanMs !== undefined && !(Number.isInteger(script.scanMs) && (script.scanMs as number) >= 1 && (script.scanMs as number) <= 1000)) {
    errors.push(`"scanMs" is a whole number of ms from 1 to 1000, got ${show(script.scanMs)}`);
  }
  if (script.settleMs !== undefined && !(Number.isInteger(script.settleMs) && (script.settleMs as number) >= 0 && (script.settleMs as number) <= 60_000)) {
    errors.push(`"settleMs" is a whole number of ms from 0 to 60000, got ${show(script.settleMs)}`);
  }
  if (script.title !== undefined && (typeof script.title !== 'string' || script.title.length > 200)) errors.push(`"title" is text of at most 200 characters`);
  const steps = script.steps;
  if (!Array.isArray(steps) || steps.length === 0) {
    errors.push(`"steps" needs a list of at least one step, got ${show(steps)}`);
  } else if (steps.length > 2000) {
    errors.push(`"steps" has ${steps.length} steps; a script has at most 2000`);
  } else {
    steps.forEach((step, i) => errors.push(...checkStep(step, i + 1)));
  }
  if (errors.length === 0 && !(steps as Record<string, unknown>[]).some((step) => CHECK_ACTIONS.some((a) => Object.hasOwn(step, a)))) {
    // A script that checks nothing would pass any program, even one that does not run.
    errors.push(`"steps" has no check: a script needs at least one ${CHECK_ACTIONS.map((a) => `"${a}"`).join(', ')} step`);
  }
  if (errors.length > 0) return { ok: false, errors };
  // The hand checks above mirror the schema; the schema has the last word and fills in defaults.
  // Each step is parsed with its own action's schema: trying the whole union step by step costs
  // milliseconds per script, more than grading it.
  const parsedSteps: Step[] = [];
  for (const [i, raw] of (steps as unknown[]).entries()) {
    const action = STEP_ACTIONS.find((a) => Object.hasOwn(raw as object, a))!;
    const step = STEP_SCHEMAS[action].safeParse(raw);
    if (!step.success) return { ok: false, errors: step.error.issues.map((issue) => `step ${i + 1}: ${[action, ...issue.path].join('.')}: ${issue.message}`) };
    parsedSteps.push(step.data);
  }
  const { steps: _steps, ...rest } = script;
  const header = HeaderSchema.safeParse(rest);
  if (!header.success) return { ok: false, errors: header.error.issues.map((i) => `${i.path.join('.')}: ${i.message}`) };
  return { ok: true, value: { ...header.data, steps: parsedSteps } };
}
