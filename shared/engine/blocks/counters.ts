/**
 * IEC 61131-3 counters (clause 6.6.3.5.4, Table 45): CTU, CTD, CTUD.
 *
 * Each is a pure step `(state, inputs) -> state`, returning the very same state object when
 * nothing changed (a scan then allocates nothing for an idle counter). A counter counts rising edges of its count inputs,
 * so it keeps the value each count input had at the previous call; the edge memory follows the input
 * on every call, also while R or LD holds the counter. CV is an INT: the standard bounds it by
 * PVmax/PVmin, which Rungwright takes as the 16-bit INT range (IEC 61131-3 Table 10 [memory]).
 * Beside each step, its WebAssembly (`emitCTU`…), which the engine runs; the steps are the
 * reference it is tested against. CV is kept as a double there, so it compares with PV exactly as
 * the steps do.
 */
import { OP } from '../wasm/opcodes';
import type { BlockEmit } from './blockEmit';

/** Largest and smallest INT (16-bit), the bounds of CV. */
export const INT_MAX = 32767;
export const INT_MIN = -32768;

export interface UpCounterState {
  readonly Q: boolean;
  /** Current value. */
  readonly CV: number;
  readonly lastCU: boolean;
}

export interface DownCounterState {
  readonly Q: boolean;
  readonly CV: number;
  readonly lastCD: boolean;
}

export interface UpDownCounterState {
  readonly QU: boolean;
  readonly QD: boolean;
  readonly CV: number;
  readonly lastCU: boolean;
  readonly lastCD: boolean;
}

export interface UpCounterInputs {
  readonly CU: boolean;
  readonly R: boolean;
  readonly PV: number;
}

export interface DownCounterInputs {
  readonly CD: boolean;
  readonly LD: boolean;
  readonly PV: number;
}

export interface UpDownCounterInputs {
  readonly CU: boolean;
  readonly CD: boolean;
  readonly R: boolean;
  readonly LD: boolean;
  readonly PV: number;
}

export const UP_COUNTER_INITIAL: UpCounterState = Object.freeze({ Q: false, CV: 0, lastCU: false });
export const DOWN_COUNTER_INITIAL: DownCounterState = Object.freeze({ Q: false, CV: 0, lastCD: false });
export const UP_DOWN_COUNTER_INITIAL: UpDownCounterState = Object.freeze({
  QU: false,
  QD: false,
  CV: 0,
  lastCU: false,
  lastCD: false,
});

/**
 * A loaded value is an INT: whole and within range. (PV itself is always an INT here — a validated
 * constant or another counter's CV — so comparisons use it as given.)
 */
const intValue = (value: number): number => Math.max(INT_MIN, Math.min(INT_MAX, Math.trunc(value)));

/** Up counter: R has priority (CV := 0); each rising edge of CU adds 1 up to PVmax; Q := CV >= PV. */
export function stepCTU(state: UpCounterState, inputs: UpCounterInputs): UpCounterState {
  const edge = inputs.CU && !state.lastCU;
  let cv = state.CV;
  if (inputs.R) cv = 0;
  else if (edge && cv < INT_MAX) cv += 1;
  const q = cv >= inputs.PV;
  if (q === state.Q && cv === state.CV && inputs.CU === state.lastCU) return state;
  return { Q: q, CV: cv, lastCU: inputs.CU };
}

/** Down counter: LD has priority (CV := PV); each rising edge of CD subtracts 1 down to PVmin; Q := CV <= 0. */
export function stepCTD(state: DownCounterState, inputs: DownCounterInputs): DownCounterState {
  const edge = inputs.CD && !state.lastCD;
  let cv = state.CV;
  if (inputs.LD) cv = intValue(inputs.PV);
  else if (edge && cv > INT_MIN) cv -= 1;
  const q = cv <= 0;
  if (q === state.Q && cv === state.CV && inputs.CD === state.lastCD) return state;
  return { Q: q, CV: cv, lastCD: inputs.CD };
}

/**
 * Up/down counter: R over LD; otherwise a CU edge adds 1 and a CD edge subtracts 1, and both in the
 * same call leave CV as it was. QU := CV >= PV, QD := CV <= 0.
 */
export function stepCTUD(state: UpDownCounterState, inputs: UpDownCounterInputs): UpDownCounterState {
  const up = inputs.CU && !state.lastCU;
  const down = inputs.CD && !state.lastCD;
  const pv = inputs.PV;
  let cv = state.CV;
  if (inputs.R) cv = 0;
  else if (inputs.LD) cv = intValue(pv);
  else if (up && !down && cv < INT_MAX) cv += 1;
  else if (down && !up && cv > INT_MIN) cv -= 1;
  const qu = cv >= pv;
  const qd = cv <= 0;
  const same = qu === state.QU && qd === state.QD && cv === state.CV && inputs.CU === state.lastCU && inputs.CD === state.lastCD;
  return same ? state : { QU: qu, QD: qd, CV: cv, lastCU: inputs.CU, lastCD: inputs.CD };
}

/** Push `intValue(PV)`: PV truncated and clamped to the INT range (the value LD loads). */
function pushLoadedValue(b: BlockEmit): void {
  const { code } = b;
  b.number('PV');
  code.op(OP.f64Trunc);
  code.f64(INT_MAX);
  code.op(OP.f64Min);
  code.f64(INT_MIN);
  code.op(OP.f64Max);
}

/** Push "a rising edge of `input` since the last call": input AND NOT the remembered value. */
function pushEdge(b: BlockEmit, input: string, memory: string): void {
  b.bool(input);
  b.code.loadCell(b.field(memory));
  b.code.op(OP.i32Eqz);
  b.code.op(OP.i32And);
}

/** CV += `delta` when the condition pushed by `when` holds and CV stays within `limit`. */
function countIf(b: BlockEmit, cv: number, when: () => void, delta: 1 | -1): void {
  const { code } = b;
  code.when(
    () => {
      when();
      code.get(cv);
      code.f64(delta > 0 ? INT_MAX : INT_MIN);
      code.op(delta > 0 ? OP.f64Lt : OP.f64Gt);
      code.op(OP.i32And);
    },
    () => {
      code.get(cv);
      code.f64(1);
      code.op(delta > 0 ? OP.f64Add : OP.f64Sub);
      code.set(cv);
    },
  );
}

function storeCv(b: BlockEmit, cv: number): void {
  b.code.storeF64(b.field('CV'), () => b.code.get(cv));
}

/** `stepCTU` in WebAssembly. */
export function emitCTU(b: BlockEmit): void {
  const { code } = b;
  const cv = b.f64(0);
  const edge = b.i32(0);
  pushEdge(b, 'CU', 'lastCU');
  code.set(edge);
  code.loadF64(b.field('CV'));
  code.set(cv);
  code.when(
    () => b.bool('R'),
    () => {
      code.f64(0);
      code.set(cv);
    },
    () => countIf(b, cv, () => code.get(edge), 1),
  );
  storeCv(b, cv);
  code.storeCell(b.field('Q'), () => {
    code.get(cv);
    b.number('PV');
    code.op(OP.f64Ge);
  });
  code.storeCell(b.field('lastCU'), () => b.bool('CU'));
}

/** `stepCTD` in WebAssembly. */
export function emitCTD(b: BlockEmit): void {
  const { code } = b;
  const cv = b.f64(0);
  const edge = b.i32(0);
  pushEdge(b, 'CD', 'lastCD');
  code.set(edge);
  code.loadF64(b.field('CV'));
  code.set(cv);
  code.when(
    () => b.bool('LD'),
    () => {
      pushLoadedValue(b);
      code.set(cv);
    },
    () => countIf(b, cv, () => code.get(edge), -1),
  );
  storeCv(b, cv);
  code.storeCell(b.field('Q'), () => {
    code.get(cv);
    code.f64(0);
    code.op(OP.f64Le);
  });
  code.storeCell(b.field('lastCD'), () => b.bool('CD'));
}

/** `stepCTUD` in WebAssembly. */
export function emitCTUD(b: BlockEmit): void {
  const { code } = b;
  const cv = b.f64(0);
  const up = b.i32(0);
  const down = b.i32(1);
  pushEdge(b, 'CU', 'lastCU');
  code.set(up);
  pushEdge(b, 'CD', 'lastCD');
  code.set(down);
  code.loadF64(b.field('CV'));
  code.set(cv);
  const only = (a: number, other: number) => () => {
    code.get(a);
    code.get(other);
    code.op(OP.i32Eqz);
    code.op(OP.i32And);
  };
  code.when(
    () => b.bool('R'),
    () => {
      code.f64(0);
      code.set(cv);
    },
    () =>
      code.when(
        () => b.bool('LD'),
        () => {
          pushLoadedValue(b);
          code.set(cv);
        },
        // An up edge alone counts up; otherwise a down edge alone counts down (never both at once).
        () => {
          code.when(
            only(up, down),
            () => countIf(b, cv, () => code.i32(1), 1),
            () => countIf(b, cv, only(down, up), -1),
          );
        },
      ),
  );
  storeCv(b, cv);
  code.storeCell(b.field('QU'), () => {
    code.get(cv);
    b.number('PV');
    code.op(OP.f64Ge);
  });
  code.storeCell(b.field('QD'), () => {
    code.get(cv);
    code.f64(0);
    code.op(OP.f64Le);
  });
  code.storeCell(b.field('lastCU'), () => b.bool('CU'));
  code.storeCell(b.field('lastCD'), () => b.bool('CD'));
}
