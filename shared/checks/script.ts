/**
 * The check-script format (docs/check-scripts.md): JSON that presses buttons, waits in virtual
 * time and asserts what the panel and the program show. The zod schemas are the contract and give
 * the TypeScript types; `parseCheckScript` reads a script step by step so that every error names
 * the step, the field and what was expected (`step 4: "wait" needs a whole number of ms …`).
 * Steps are counted from 1, as people count them.
 */
import { z } from 'zod';

/** Each action a step can take; a step has exactly one of these keys. */
export type StepAction =
  | 'press'
  | 'release'
  | 'set'
  | 'trip'
  | 'reset'
  | 'load'
  | 'block'
  | 'unblock'
  | 'wait'
  | 'expect'
  | 'during'
  | 'until'
  | 'force'
  | 'unforce'
  | 'preheat'
  | 'prove'
  | 'power';

export const STEP_ACTIONS: readonly StepAction[] = [
  'press',
  'release',
  'set',
  'trip',
  'reset',
  'load',
  'block',
  'unblock',
  'wait',
  'expect',
  'during',
  'until',
  'force',
  'unforce',
  'preheat',
  'prove',
  'power',
];

/** The steps that are checks (they earn points); every script needs at least one. */
export const CHECK_ACTIONS: readonly StepAction[] = ['expect', 'during', 'until', 'prove'];

/** The longest single wait (or `during`, or `until` window), in ms of virtual time: 4 h. */
export const MAX_WAIT_MS = 4 * 3_600_000;
/** The largest load factor, as a multiple of FLA. */
export const MAX_LOAD_FACTOR = 20;
/** The largest preheat factor: the "hot" state is a steady run at up to the setting itself. */
export const MAX_PREHEAT_FACTOR = 1;

/** An expected value range for a number such as `T1.ET` (ms) or `C1.CV`: both ends included. */
export const RangeSchema = z.strictObject({ min: z.number().optional(), max: z.number().optional() });

/** `true`/`false` for a bit, a number for a block value, a state word for a device, or a range. */
export const ExpectationSchema = z.union([z.boolean(), z.number(), z.string().min(1), RangeSchema]);
export type Expectation = z.infer<typeof ExpectationSchema>;

const deviceId = z.string().min(1);

export const PressStepSchema = z.strictObject({ press: deviceId });
export const ReleaseStepSchema = z.strictObject({ release: deviceId });
export const SetStepSchema = z.strictObject({ set: deviceId, to: z.string().min(1) });
export const TripStepSchema = z.strictObject({ trip: deviceId });
export const ResetStepSchema = z.strictObject({ reset: deviceId });
export const LoadStepSchema = z.strictObject({ load: deviceId, factor: z.number().min(0).max(MAX_LOAD_FACTOR) });
export const BlockStepSchema = z.strictObject({ block: deviceId });
export const UnblockStepSchema = z.strictObject({ unblock: deviceId });
export const WaitStepSchema = z.strictObject({ wait: z.number().int().min(0).max(MAX_WAIT_MS) });
export const ExpectStepSchema = z.strictObject({
  expect: z.record(z.string().min(1), ExpectationSchema),
  label: z.string().max(200).optional(),
  /** Points the check is worth; 1 if omitted. */
  points: z.number().int().min(0).max(100).optional(),
  /** A hidden check counts toward the grade but a student sees only pass/fail. */
  hidden: z.boolean().optional(),
});

/** What every check step may carry besides its condition. */
const checkFields = {
  label: z.string().max(200).optional(),
  points: z.number().int().min(0).max(100).optional(),
  hidden: z.boolean().optional(),
};
const conditionSchema = z.record(z.string().min(1), ExpectationSchema);

/**
 * A check over an interval: `never` fails if any scan of the interval matches all of its
 * entries; `always` fails if any scan breaks one. Exactly one of the two.
 */
export const DuringStepSchema = z
  .strictObject({
    during: z.number().int().min(1).max(MAX_WAIT_MS),
    never: conditionSchema.optional(),
    always: conditionSchema.optional(),
    ...checkFields,
  })
  .refine((s) => (s.never === undefined) !== (s.always === undefined), { message: 'a "during" step has exactly one of "never" and "always"' });

/**
 * Waits for a condition and passes if it first holds between `within[0]` and `within[1]` ms from
 * the step's start. The step always lasts until `within[1]`, so the steps after it start at a time
 * that does not depend on the program (and a hidden one reads as a wait in a student's script).
 */
export const UntilStepSchema = z
  .strictObject({
    until: conditionSchema,
    within: z.tuple([z.number().int().min(0).max(MAX_WAIT_MS), z.number().int().min(0).max(MAX_WAIT_MS)]),
    ...checkFields,
  })
  .refine((s) => s.within[0] <= s.within[1], { message: '"within" is [earliest, latest] with earliest ≤ latest', path: ['within'] });

/** Force a bit (an address or a tag) as the runtime does; `unforce` one, or "all". */
export const ForceStepSchema = z.strictObject({ force: z.string().min(1), to: z.boolean() });
export const UnforceStepSchema = z.strictObject({ unforce: z.string().min(1) });
/** Start an overload relay "hot": its image at the steady state of running at `factor` × its setting. */
export const PreheatStepSchema = z.strictObject({ preheat: deviceId, factor: z.number().min(0).max(MAX_PREHEAT_FACTOR) });

/**
 * A proof as a check (docs/proof.md): passes when the property holds for every behaviour from
 * power-up, whatever the script's other steps do. The property's shape is checked by
 * `parseCheckScript` with `PropertySchema` (shared/proof/property.ts, which builds on this file).
 */
export const ProveStepSchema = z.strictObject({ prove: z.record(z.string(), z.unknown()), ...checkFields });

/**
 * The controller loses power ("off": no scan, every output open, the field goes on) or gets it
 * back ("on": a warm restart, IEC 61131-3: retained variables keep their values, all others start
 * at their initial values, and the first scan reads the inputs as they are).
 */
export const PowerStepSchema = z.strictObject({ power: z.enum(['off', 'on']) });

export const StepSchema = z.union([
  PressStepSchema,
  ReleaseStepSchema,
  SetStepSchema,
  TripStepSchema,
  ResetStepSchema,
  LoadStepSchema,
  BlockStepSchema,
  UnblockStepSchema,
  WaitStepSchema,
  ExpectStepSchema,
  DuringStepSchema,
  UntilStepSchema,
  ForceStepSchema,
  UnforceStepSchema,
  PreheatStepSchema,
  ProveStepSchema,
  PowerStepSchema,
]);
export type Step = z.infer<typeof StepSchema>;

/** Each action's own step schema, for parsing a step whose action is known. */
export const STEP_SCHEMAS = {
  press: PressStepSchema,
  release: ReleaseStepSchema,
  set: SetStepSchema,
  trip: TripStepSchema,
  reset: ResetStepSchema,
  load: LoadStepSchema,
  block: BlockStepSchema,
  unblock: UnblockStepSchema,
  wait: WaitStepSchema,
  expect: ExpectStepSchema,
  during: DuringStepSchema,
  until: UntilStepSchema,
  force: ForceStepSchema,
  unforce: UnforceStepSchema,
  preheat: PreheatStepSchema,
  prove: ProveStepSchema,
  power: PowerStepSchema,
} as const satisfies Record<StepAction, z.ZodType<Step>>;
export type ExpectStep = z.infer<typeof ExpectStepSchema>;
export type DuringStep = z.infer<typeof DuringStepSchema>;
export type UntilStep = z.infer<typeof UntilStepSchema>;
export type ProveStep = z.infer<typeof ProveStepSchema>;
/** A step that is a check: it has a label, points and may be hidden. */
export type CheckStep = ExpectStep | DuringStep | UntilStep | ProveStep;

/** Is the step a check (`expect`, `during` or `until`)? */
export function isCheckStep(step: Step): step is CheckStep {
  return 'expect' in step || 'during' in step || 'until' in step || 'prove' in step;
}

/** The virtual time a step spans by itself, in ms as written: a wait's, a during's, an until's window end. */
export function stepSpanMs(step: Step): number {
  if ('wait' in step) return step.wait;
  if ('during' in step) return step.during;
  if ('until' in step) return step.within[1];
  return 0;
}

export const CheckScriptSchema = z.strictObject({
  /** The panel layout id the script is written for. */
  panel: z.string().min(1).default('reversing-conveyor'),
  /** Scan period in ms. */
  scanMs: z.number().int().min(1).max(1000).default(10),
  /** Virtual time run before the first step, in ms, so the panel is at rest when the steps start. */
  settleMs: z.number().int().min(0).max(60_000).default(100),
  title: z.string().max(200).optional(),
  steps: z.array(StepSchema).min(1).max(2000),
});
export type CheckScript = z.infer<typeof CheckScriptSchema>;
export type CheckScriptInput = z.input<typeof CheckScriptSchema>;

/** The action key of a parsed step. */
export function stepAction(step: Step): StepAction {
  for (const action of STEP_ACTIONS) if (action in step) return action;
  // The schema admits no other step; reaching here means the type and the list disagree.
  throw new Error('step without an action');
}
