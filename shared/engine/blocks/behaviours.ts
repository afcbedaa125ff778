/**
 * The behaviour of every standard function block, in one table keyed by block type: its initial
 * state, its pure step function (the reference semantics) and its WebAssembly emitter (what the
 * engine runs; tested against the step). The kernel, the state layout and the snapshot code go
 * through this table only, so a block type that is not described here fails to compile.
 */
import type { BlockType } from '../../ladder/schema';
import type { BlockEmit } from './blockEmit';
import { BISTABLE_INITIAL, EDGE_INITIAL, emitFTrig, emitRS, emitRTrig, emitSR, stepFTrig, stepRS, stepRTrig, stepSR } from './bistables';
import type { BistableState, EdgeInputs, EdgeState, ResetDominantInputs, SetDominantInputs } from './bistables';
import { DOWN_COUNTER_INITIAL, UP_COUNTER_INITIAL, UP_DOWN_COUNTER_INITIAL, emitCTD, emitCTU, emitCTUD, stepCTD, stepCTU, stepCTUD } from './counters';
import type {
  DownCounterInputs,
  DownCounterState,
  UpCounterInputs,
  UpCounterState,
  UpDownCounterInputs,
  UpDownCounterState,
} from './counters';
import { DELAY_TIMER_INITIAL, PULSE_TIMER_INITIAL, emitTOF, emitTON, emitTP, stepTOF, stepTON, stepTP } from './timers';
import type { DelayTimerState, PulseTimerState, TimerInputs } from './timers';

/** The state type of each block type. Output members (Q, ET, CV…) are fields with the standard's names. */
export interface BlockStateByType {
  TON: DelayTimerState;
  TOF: DelayTimerState;
  TP: PulseTimerState;
  CTU: UpCounterState;
  CTD: DownCounterState;
  CTUD: UpDownCounterState;
  R_TRIG: EdgeState;
  F_TRIG: EdgeState;
  SR: BistableState;
  RS: BistableState;
}

/** The input values of each block type, by formal parameter name (BOOL as boolean, TIME in ms, INT). */
export interface BlockInputsByType {
  TON: TimerInputs;
  TOF: TimerInputs;
  TP: TimerInputs;
  CTU: UpCounterInputs;
  CTD: DownCounterInputs;
  CTUD: UpDownCounterInputs;
  R_TRIG: EdgeInputs;
  F_TRIG: EdgeInputs;
  SR: SetDominantInputs;
  RS: ResetDominantInputs;
}

/** Any block's state: plain, serialisable data. */
export type BlockState = BlockStateByType[BlockType];

/** One block type's behaviour. */
export interface BlockBehaviour<S, I> {
  /** The state of a fresh instance (frozen; steps never mutate a state, they return a new one). */
  readonly initial: S;
  /** One call of the block: pure. `dtMs` is the virtual time this call is charged, in ms. */
  readonly step: (state: S, inputs: I, dtMs: number) => S;
  /** The same call in WebAssembly, over the instance's state record (see `BlockEmit`). */
  readonly emit: (b: BlockEmit) => void;
}

export const BLOCK_BEHAVIOURS = {
  TON: { initial: DELAY_TIMER_INITIAL, step: stepTON, emit: emitTON },
  TOF: { initial: DELAY_TIMER_INITIAL, step: stepTOF, emit: emitTOF },
  TP: { initial: PULSE_TIMER_INITIAL, step: stepTP, emit: emitTP },
  CTU: { initial: UP_COUNTER_INITIAL, step: stepCTU, emit: emitCTU },
  CTD: { initial: DOWN_COUNTER_INITIAL, step: stepCTD, emit: emitCTD },
  CTUD: { initial: UP_DOWN_COUNTER_INITIAL, step: stepCTUD, emit: emitCTUD },
  R_TRIG: { initial: EDGE_INITIAL, step: stepRTrig, emit: emitRTrig },
  F_TRIG: { initial: EDGE_INITIAL, step: stepFTrig, emit: emitFTrig },
  SR: { initial: BISTABLE_INITIAL, step: stepSR, emit: emitSR },
  RS: { initial: BISTABLE_INITIAL, step: stepRS, emit: emitRS },
} as const satisfies { [K in BlockType]: BlockBehaviour<BlockStateByType[K], BlockInputsByType[K]> };

/** Read an output member (`Q`, `ET`, `CV`, `QU`, `QD`, `Q1`) of a state. */
export function readMember(state: BlockState, member: string): boolean | number | undefined {
  const value = (state as unknown as Record<string, boolean | number | undefined>)[member];
  return typeof value === 'boolean' || typeof value === 'number' ? value : undefined;
}

/**
 * True when `value` has exactly the fields of the type's state, each of the same kind (for
 * restoring a snapshot that came from outside).
 */
export function isStateOf(type: BlockType, value: unknown): value is BlockState {
  if (typeof value !== 'object' || value === null) return false;
  const initial = BLOCK_BEHAVIOURS[type].initial as unknown as Record<string, unknown>;
  const given = value as Record<string, unknown>;
  const keys = Object.keys(initial);
  if (Object.keys(given).length !== keys.length) return false;
  return keys.every((key) => {
    const v = given[key];
    if (typeof initial[key] === 'number') return typeof v === 'number' && Number.isFinite(v);
    return typeof v === typeof initial[key];
  });
}
