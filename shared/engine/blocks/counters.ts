/**
 * IEC 61131-3 counters (clause 6.6.3.5.4, Table 45): CTU, CTD, CTUD.
 *
 * Each is a pure step `(state, inputs) -> state`, returning the very same state object when
 * nothing changed (a scan then allocates nothing for an idle counter). A counter counts rising edges of its count inputs,
 * so it keeps the value each count input had at the previous call; the edge memory follows the input
 * on every call, also while R or LD holds the counter. CV is an INT: the standard bounds it by
 * PVmax/PVmin, which Rungwright takes as the 16-bit INT range (IEC 61131-3 Table 10 [memory]).
 */

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
