/**
 * IEC 61131-3 bistables (clause 6.6.3.5.2, Table 43) and edge detectors (clause 6.6.3.5.3,
 * Table 44), each a pure step `(state, inputs) -> state`, and beside it its WebAssembly
 * (`emitSR`…), which the engine runs; the steps are the reference it is tested against.
 */
import { OP } from '../wasm/opcodes';
import type { BlockEmit } from './blockEmit';

export interface EdgeState {
  readonly Q: boolean;
  /** CLK as seen by the previous call (the standard's M, for R_TRIG; NOT M for F_TRIG). */
  readonly lastCLK: boolean;
}

export interface BistableState {
  readonly Q1: boolean;
}

export interface EdgeInputs {
  readonly CLK: boolean;
}

export interface SetDominantInputs {
  readonly S1: boolean;
  readonly R: boolean;
}

export interface ResetDominantInputs {
  readonly S: boolean;
  readonly R1: boolean;
}

/**
 * Both detectors start as if CLK had been FALSE: a first call with CLK TRUE is a rising edge, and a
 * first call with CLK FALSE is no falling edge (F_TRIG's M starts so that Q is FALSE).
 */
export const EDGE_INITIAL: EdgeState = Object.freeze({ Q: false, lastCLK: false });
export const BISTABLE_INITIAL: BistableState = Object.freeze({ Q1: false });

/** R_TRIG: `Q := CLK AND NOT M; M := CLK`. */
export function stepRTrig(state: EdgeState, inputs: EdgeInputs): EdgeState {
  const q = inputs.CLK && !state.lastCLK;
  return q === state.Q && inputs.CLK === state.lastCLK ? state : { Q: q, lastCLK: inputs.CLK };
}

/** F_TRIG: `Q := NOT CLK AND NOT M; M := NOT CLK`, kept here as the previous CLK. */
export function stepFTrig(state: EdgeState, inputs: EdgeInputs): EdgeState {
  const q = !inputs.CLK && state.lastCLK;
  return q === state.Q && inputs.CLK === state.lastCLK ? state : { Q: q, lastCLK: inputs.CLK };
}

/** SR, set-dominant: `Q1 := S1 OR (NOT R AND Q1)`. */
export function stepSR(state: BistableState, inputs: SetDominantInputs): BistableState {
  const q1 = inputs.S1 || (!inputs.R && state.Q1);
  return q1 === state.Q1 ? state : { Q1: q1 };
}

/** RS, reset-dominant: `Q1 := NOT R1 AND (S OR Q1)`. */
export function stepRS(state: BistableState, inputs: ResetDominantInputs): BistableState {
  const q1 = !inputs.R1 && (inputs.S || state.Q1);
  return q1 === state.Q1 ? state : { Q1: q1 };
}

/** `stepRTrig` in WebAssembly. */
export function emitRTrig(b: BlockEmit): void {
  const { code } = b;
  code.storeCell(b.field('Q'), () => {
    b.bool('CLK');
    code.loadCell(b.field('lastCLK'));
    code.op(OP.i32Eqz);
    code.op(OP.i32And);
  });
  code.storeCell(b.field('lastCLK'), () => b.bool('CLK'));
}

/** `stepFTrig` in WebAssembly. */
export function emitFTrig(b: BlockEmit): void {
  const { code } = b;
  code.storeCell(b.field('Q'), () => {
    b.bool('CLK');
    code.op(OP.i32Eqz);
    code.loadCell(b.field('lastCLK'));
    code.op(OP.i32And);
  });
  code.storeCell(b.field('lastCLK'), () => b.bool('CLK'));
}

/** `stepSR` in WebAssembly. */
export function emitSR(b: BlockEmit): void {
  const { code } = b;
  code.storeCell(b.field('Q1'), () => {
    b.bool('S1');
    b.bool('R');
    code.op(OP.i32Eqz);
    code.loadCell(b.field('Q1'));
    code.op(OP.i32And);
    code.op(OP.i32Or);
  });
}

/** `stepRS` in WebAssembly. */
export function emitRS(b: BlockEmit): void {
  const { code } = b;
  code.storeCell(b.field('Q1'), () => {
    b.bool('R1');
    code.op(OP.i32Eqz);
    b.bool('S');
    code.loadCell(b.field('Q1'));
    code.op(OP.i32Or);
    code.op(OP.i32And);
  });
}
