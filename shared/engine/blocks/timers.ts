/**
 * IEC 61131-3 timers (clause 6.6.3.5.5, Table 46, timing diagrams in Figure 15): TON, TOF, TP.
 *
 * Each is a pure step `(state, inputs, dtMs) -> state`. Time is virtual: a call is charged the scan
 * period `dtMs` it belongs to, so ET equals the virtual time elapsed since the edge that started it,
 * counted to the end of the current scan (ET = runtime.timeMs − the time IN changed). A second call
 * of the same instance within one scan is given `dtMs = 0` by the compiler, so time is never counted
 * twice. All times are whole milliseconds; a negative preset counts as 0. A step returns the very
 * same state object when nothing changed, so an idle timer allocates nothing. Beside each step, its
 * WebAssembly (`emitTON`…), which the engine runs; the steps are the reference it is tested against.
 */
import { OP } from '../wasm/opcodes';
import type { BlockEmit } from './blockEmit';

/** State of a TON or TOF instance. Q and ET are the standard's outputs. */
export interface DelayTimerState {
  readonly Q: boolean;
  /** Elapsed time, ms. */
  readonly ET: number;
}

/** State of a TP instance. */
export interface PulseTimerState {
  readonly Q: boolean;
  /** Elapsed time of the current or last pulse, ms. */
  readonly ET: number;
  /** IN as seen by the previous call: a pulse starts on a rising edge only. */
  readonly lastIN: boolean;
}

/** Inputs of every timer: IN is the power-flow input; PT the preset, ms. */
export interface TimerInputs {
  readonly IN: boolean;
  readonly PT: number;
}

export const DELAY_TIMER_INITIAL: DelayTimerState = Object.freeze({ Q: false, ET: 0 });
export const PULSE_TIMER_INITIAL: PulseTimerState = Object.freeze({ Q: false, ET: 0, lastIN: false });

const preset = (pt: number): number => (pt > 0 ? pt : 0);

/**
 * On-delay: ET runs while IN is TRUE and stops at PT; Q is TRUE while IN is TRUE and ET = PT; when
 * IN falls, Q is FALSE and ET 0 at once. ET is 0 whenever IN was FALSE, so a rising edge restarts
 * from 0 without an edge memory.
 */
export function stepTON(state: DelayTimerState, inputs: TimerInputs, dtMs: number): DelayTimerState {
  if (!inputs.IN) return state.Q || state.ET !== 0 ? DELAY_TIMER_INITIAL : state;
  const pt = preset(inputs.PT);
  const et = Math.min(state.ET + dtMs, pt);
  const q = et >= pt;
  return et === state.ET && q === state.Q ? state : { Q: q, ET: et };
}

/**
 * Off-delay: while IN is TRUE, Q is TRUE and ET 0. From IN's falling edge ET runs; Q falls when ET
 * reaches PT and ET then holds PT until IN rises again. If IN rises before PT, ET goes to 0 and Q
 * stays TRUE. `Q` doubles as "timing": with IN FALSE, ET only runs while Q is still TRUE.
 */
export function stepTOF(state: DelayTimerState, inputs: TimerInputs, dtMs: number): DelayTimerState {
  if (inputs.IN) return state.Q && state.ET === 0 ? state : { Q: true, ET: 0 };
  if (!state.Q) return state;
  const pt = preset(inputs.PT);
  const et = Math.min(state.ET + dtMs, pt);
  const q = et < pt;
  return et === state.ET && q === state.Q ? state : { Q: q, ET: et };
}

/**
 * Pulse: a rising edge of IN while Q is FALSE starts a pulse of PT; further edges during the pulse
 * are ignored (not retriggerable). After the pulse ET holds PT while IN is still TRUE and goes to 0
 * on a call with IN FALSE. A pulse that starts is shown for at least the scan that starts it, so a
 * pulse shorter than the scan period still reaches the output image once (common practice); a
 * preset of 0 or less gives no pulse.
 */
export function stepTP(state: PulseTimerState, inputs: TimerInputs, dtMs: number): PulseTimerState {
  const pt = preset(inputs.PT);
  const rising = inputs.IN && !state.lastIN;
  if (!state.Q && rising && pt > 0) {
    return { Q: true, ET: Math.min(dtMs, pt), lastIN: true };
  }
  if (state.Q) {
    const et = Math.min(state.ET + dtMs, pt);
    return et >= pt ? { Q: false, ET: pt, lastIN: inputs.IN } : { Q: true, ET: et, lastIN: inputs.IN };
  }
  const et = inputs.IN ? state.ET : 0;
  return et === state.ET && inputs.IN === state.lastIN ? state : { Q: false, ET: et, lastIN: inputs.IN };
}

/** Push PT as the steps read it: `preset(PT)`, a negative preset counting as 0. */
function pushPreset(b: BlockEmit): void {
  const { code } = b;
  const pt = b.f64(0);
  b.number('PT');
  code.tee(pt);
  code.f64(0);
  code.get(pt);
  code.f64(0);
  code.op(OP.f64Gt);
  code.op(OP.select);
}

/** Push `min(<ET> + dt, pt)` with the preset in scratch f64 0. */
function pushRunningEt(b: BlockEmit): void {
  const { code } = b;
  code.loadF64(b.field('ET'));
  b.dt();
  code.op(OP.f64Add);
  code.get(b.f64(0));
  code.op(OP.f64Min);
}

/** `stepTON` in WebAssembly. */
export function emitTON(b: BlockEmit): void {
  const { code } = b;
  const et = b.f64(1);
  code.when(
    () => b.bool('IN'),
    () => {
      pushPreset(b);
      code.set(b.f64(0));
      pushRunningEt(b);
      code.set(et);
      code.storeF64(b.field('ET'), () => code.get(et));
      code.storeCell(b.field('Q'), () => {
        code.get(et);
        code.get(b.f64(0));
        code.op(OP.f64Ge);
      });
    },
    () => {
      code.storeF64(b.field('ET'), () => code.f64(0));
      code.storeCell(b.field('Q'), () => code.i32(0));
    },
  );
}

/** `stepTOF` in WebAssembly. */
export function emitTOF(b: BlockEmit): void {
  const { code } = b;
  const et = b.f64(1);
  code.when(
    () => b.bool('IN'),
    () => {
      code.storeF64(b.field('ET'), () => code.f64(0));
      code.storeCell(b.field('Q'), () => code.i32(1));
    },
    () =>
      code.when(
        () => code.loadCell(b.field('Q')),
        () => {
          pushPreset(b);
          code.set(b.f64(0));
          pushRunningEt(b);
          code.set(et);
          code.storeF64(b.field('ET'), () => code.get(et));
          code.storeCell(b.field('Q'), () => {
            code.get(et);
            code.get(b.f64(0));
            code.op(OP.f64Lt);
          });
        },
      ),
  );
}

/** `stepTP` in WebAssembly. */
export function emitTP(b: BlockEmit): void {
  const { code } = b;
  const pt = b.f64(0);
  const et = b.f64(1);
  pushPreset(b);
  code.set(pt);
  const lastIn = (): void => code.storeCell(b.field('lastIN'), () => b.bool('IN'));
  code.when(
    // A pulse starts: not in a pulse, IN rising, and a positive preset.
    () => {
      code.loadCell(b.field('Q'));
      code.op(OP.i32Eqz);
      b.bool('IN');
      code.op(OP.i32And);
      code.loadCell(b.field('lastIN'));
      code.op(OP.i32Eqz);
      code.op(OP.i32And);
      code.get(pt);
      code.f64(0);
      code.op(OP.f64Gt);
      code.op(OP.i32And);
    },
    () => {
      code.storeCell(b.field('Q'), () => code.i32(1));
      code.storeF64(b.field('ET'), () => {
        b.dt();
        code.get(pt);
        code.op(OP.f64Min);
      });
      code.storeCell(b.field('lastIN'), () => code.i32(1));
    },
    () =>
      code.when(
        () => code.loadCell(b.field('Q')),
        () => {
          pushRunningEt(b);
          code.set(et);
          code.storeF64(b.field('ET'), () => code.get(et));
          code.storeCell(b.field('Q'), () => {
            code.get(et);
            code.get(pt);
            code.op(OP.f64Lt);
          });
          lastIn();
        },
        () => {
          code.when(
            () => {
              b.bool('IN');
              code.op(OP.i32Eqz);
            },
            () => code.storeF64(b.field('ET'), () => code.f64(0)),
          );
          lastIn();
        },
      ),
  );
}
