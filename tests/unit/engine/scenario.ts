/**
 * A harness for time-based checks: inputs as functions of virtual time, values sampled per scan.
 *
 * Convention (stated once, used by the reference vectors): a scan runs over the period
 * [t, t + scanMs) with the inputs the schedule gives at t, and its row is stamped with the time at
 * its end, t + scanMs (= runtime.timeMs after it). So "IN TRUE 0–8 s" holds IN on for the periods
 * starting at 0 … 7990 ms, and the row at 5000 ms shows the timer after 5 s of IN.
 */
import { createRuntime } from '@shared/engine';
import type { Program } from '@shared/ladder/schema';
import { planOf } from './build';

export type Schedule = (tMs: number) => Record<number, boolean>;

export interface Sampled {
  /** The value of a signal in the row stamped `timeMs`. */
  at(timeMs: number, signal: string): boolean | number | undefined;
  /** Every row's value of a signal, by time. */
  series(signal: string): Array<[number, boolean | number | undefined]>;
}

export function simulate(program: Program, schedule: Schedule, untilMs: number, signals: string[], scanMs = 10): Sampled {
  const rt = createRuntime(planOf(program), { scanMs });
  const rows = new Map<number, Map<string, boolean | number | undefined>>();
  while (rt.timeMs < untilMs) {
    for (const [input, value] of Object.entries(schedule(rt.timeMs))) rt.setInput(Number(input), value);
    rt.scan();
    rows.set(rt.timeMs, new Map(signals.map((s) => [s, rt.read(s)])));
  }
  return {
    at(timeMs, signal) {
      const row = rows.get(timeMs);
      if (row === undefined) throw new Error(`no row at ${timeMs} ms`);
      return row.get(signal);
    },
    series: (signal) => [...rows].map(([t, row]) => [t, row.get(signal)]),
  };
}

/** The times in `series` where a boolean signal is TRUE, as [from, to] row intervals. */
export function onIntervals(series: Array<[number, boolean | number | undefined]>): Array<[number, number]> {
  const intervals: Array<[number, number]> = [];
  for (const [t, v] of series) {
    const last = intervals.at(-1);
    if (v === true) {
      if (last !== undefined && last[1] === -1) continue;
      intervals.push([t, -1]);
    } else if (last !== undefined && last[1] === -1) last[1] = t;
  }
  return intervals;
}
