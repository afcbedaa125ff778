/**
 * The words of the event log: what a change of a device's state means, and why it happened.
 * One table keyed by device kind.
 */
import type { ContactorState } from './devices/contactor';
import type { DeviceAction, DeviceKind, ActionArgs } from './devices/model';
import type { MotorState } from './devices/motor';
import type { OverloadState } from './devices/overload';
import type { FieldEventKind } from './events';
import type { DeviceSpec } from './layout';

/** What the simulation knows when a device's state has just changed in a field step. */
export interface ChangeContext {
  device: DeviceSpec;
  before: unknown;
  after: unknown;
  wordBefore: string;
  word: string;
  /** Why the device's load circuit has no power ('' if it has, or if it is not a load). */
  cutReason(): string;
  /** The other contactor of the interlock holding this one open. */
  holder(): string;
}

export interface ChangeMessage {
  kind: FieldEventKind;
  text: string;
}

type Describe = (ctx: ChangeContext) => ChangeMessage | null;

const withReason = (text: string, reason: string): string => (reason ? `${text}: ${reason}` : text);

const describeContactor: Describe = (ctx) => {
  const id = ctx.device.id;
  if (ctx.word !== ctx.wordBefore) {
    if (ctx.word === 'closed') return { kind: 'contactor', text: `${id} picked up` };
    return { kind: 'contactor', text: withReason(`${id} dropped out`, ctx.cutReason()) };
  }
  const wasHeld = (ctx.before as ContactorState).held;
  const held = (ctx.after as ContactorState).held;
  if (held && !wasHeld) {
    const other = ctx.holder();
    return { kind: 'contactor', text: `${id} held open by the mechanical interlock${other ? `: ${other} is engaged` : ''}` };
  }
  return null;
};

const describeInterlock: Describe = (ctx) => {
  if (ctx.device.kind !== 'interlock') return null;
  const [a, b] = ctx.device.params.contactors;
  if (ctx.word === 'conflict') {
    return {
      kind: 'interlock',
      text: `${a} and ${b} energised in the same scan while both open: the mechanical interlock lets neither close (interlock conflict)`,
    };
  }
  return { kind: 'interlock', text: `${ctx.device.id} interlock conflict cleared` };
};

const describeOverload: Describe = (ctx) => {
  if (ctx.device.kind !== 'overload') return null;
  const before = ctx.before as OverloadState;
  const after = ctx.after as OverloadState;
  if (after.tripped && !before.tripped && after.cause === 'thermal') {
    const multiple = after.currentA / ctx.device.params.settingA;
    return {
      kind: 'overload',
      text: `${ctx.device.id} tripped at ${multiple.toFixed(1)} × setting after ${(after.overMs / 1000).toFixed(1)} s`,
    };
  }
  return null;
};

const describeMotor: Describe = (ctx) => {
  if (ctx.device.kind !== 'motor') return null;
  const id = ctx.device.id;
  const before = ctx.before as MotorState;
  const after = ctx.after as MotorState;
  const fla = ctx.device.params.flaA;
  const drawing = `drawing ${(after.currentA / fla).toFixed(1)} × FLA (${after.currentA.toFixed(1)} A)`;
  if (after.supply !== before.supply) {
    if (after.supply === 'none') {
      return before.speed !== 0 ? { kind: 'motor', text: `${id} supply removed: coasting to rest` } : null;
    }
    if (before.speed === 0) return { kind: 'motor', text: `${id} starting ${after.supply}, ${drawing} until at speed` };
    const turning = before.speed > 0 ? 'forward' : 'reverse';
    if (turning !== after.supply) {
      return { kind: 'motor', text: `${id} plugging: switched to ${after.supply} while turning ${turning}, ${drawing}` };
    }
  }
  if (ctx.word !== ctx.wordBefore) {
    return { kind: 'motor', text: ctx.word === 'stopped' ? `${id} stopped` : `${id} turning ${ctx.word}` };
  }
  return null;
};

const describeLoad =
  (kind: FieldEventKind, on: string): Describe =>
  (ctx) => {
    if (ctx.word === ctx.wordBefore) return null;
    const text = `${ctx.device.id} ${ctx.word}`;
    return { kind, text: ctx.word === on ? text : withReason(text, ctx.cutReason()) };
  };

const nothing: Describe = () => null;

export const CHANGE_MESSAGES = {
  pushbutton: nothing,
  estop: nothing,
  selector: nothing,
  photoeye: nothing,
  limit: nothing,
  contactor: describeContactor,
  interlock: describeInterlock,
  overload: describeOverload,
  motor: describeMotor,
  lamp: describeLoad('lamp', 'lit'),
  horn: describeLoad('horn', 'sounding'),
} as const satisfies Record<DeviceKind, Describe>;

/** The event message for a device whose state changed in a field step, or null when not worth a line. */
export function describeChange(ctx: ChangeContext): ChangeMessage | null {
  return CHANGE_MESSAGES[ctx.device.kind](ctx);
}

/** What an action did, in the past tense: "pressed", "turned to RUN". */
export const ACTION_WORDS: Readonly<Record<DeviceAction, (args: ActionArgs, word: string) => string>> = {
  press: () => 'pressed',
  release: () => 'released',
  set: (args) => `turned to ${args.to ?? '?'}`,
  trip: () => 'tripped by hand (test button)',
  reset: () => 'reset',
  load: (args) => `load set to ${String(args.factor)} × FLA`,
  block: () => 'blocked',
  unblock: () => 'clear again',
};

/** How the commons changed, e.g. "input and output commons de-energised"; '' if they did not. */
export function describeCommons(before: readonly [boolean, boolean], after: readonly [boolean, boolean]): string {
  const changed = [before[0] !== after[0], before[1] !== after[1]];
  if (!changed[0] && !changed[1]) return '';
  const state = (live: boolean): string => (live ? 'live again' : 'de-energised');
  if (changed[0] && changed[1] && after[0] === after[1]) return `input and output commons ${state(after[0])}`;
  const parts: string[] = [];
  if (changed[0]) parts.push(`input common ${state(after[0])}`);
  if (changed[1]) parts.push(`output common ${state(after[1])}`);
  return parts.join(', ');
}
