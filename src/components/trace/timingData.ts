/**
 * Turns a trace window into what the timing diagram plots: each signal in its own lane, stacked
 * top to bottom like a logic analyser. Bits step between the bottom and the top of their lane;
 * numbers (ET in ms, CV) are scaled into their lane by the largest value in the window. The raw
 * values are kept for the cursor readout, so the plot never shows a scaled value as a reading.
 */
import type { TraceWindow } from '@/simulation/traceBuffer';

/** The height of one lane and the gap under it, in plot units. */
export const LANE_HEIGHT = 1;
export const LANE_GAP = 0.5;

export interface Lane {
  signal: string;
  kind: 'bit' | 'number';
  /** Plot value of the lane's bottom. */
  offset: number;
  /** Plot units per raw unit (1 for bits). */
  scale: number;
}

export interface TimingData {
  /** x in seconds of virtual time, then one plotted series per lane (null where nothing was recorded). */
  data: [number[], ...(number | null)[][]];
  lanes: Lane[];
  /** Raw values per lane, aligned with x. */
  raw: number[][];
  /** The y range that shows every lane. */
  yMax: number;
}

/** Is every recorded value of a column 0 or 1 (or missing)? Then it is drawn as a bit. */
function isBitColumn(values: readonly number[], signal: string): boolean {
  if (/\.(ET|CV|PV|PT)$/i.test(signal)) return false;
  return values.every((v) => Number.isNaN(v) || v === 0 || v === 1);
}

/** Lanes top to bottom in the order given: the first signal is drawn at the top. */
export function buildTimingData(window: TraceWindow, signals: readonly string[]): TimingData {
  const n = signals.length;
  const lanes: Lane[] = signals.map((signal, i) => {
    const values = window.columns[i] ?? [];
    const offset = (n - 1 - i) * (LANE_HEIGHT + LANE_GAP);
    if (isBitColumn(values, signal)) return { signal, kind: 'bit', offset, scale: LANE_HEIGHT };
    const max = values.reduce((m, v) => (Number.isNaN(v) ? m : Math.max(m, Math.abs(v))), 0);
    return { signal, kind: 'number', offset, scale: max > 0 ? LANE_HEIGHT / max : 0 };
  });
  const x = window.times.map((t) => t / 1000);
  const series = lanes.map((lane, i) =>
    (window.columns[i] ?? []).map((v) => (Number.isNaN(v) ? null : lane.offset + v * lane.scale)),
  );
  return {
    data: [x, ...series],
    lanes,
    raw: window.columns.map((c) => [...c]),
    yMax: Math.max(LANE_HEIGHT, n * (LANE_HEIGHT + LANE_GAP) - LANE_GAP),
  };
}

/** A raw value for the cursor readout: bits as TRUE/FALSE, ET in s, counts as they are. */
export function formatReading(lane: Lane, value: number | undefined): string {
  if (value === undefined || Number.isNaN(value)) return '—';
  if (lane.kind === 'bit') return value === 1 ? 'TRUE' : 'FALSE';
  if (/\.ET$/i.test(lane.signal) || /\.PT$/i.test(lane.signal)) return `${(value / 1000).toFixed(3)} s`;
  return String(value);
}
