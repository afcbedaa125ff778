/** Small statistics helpers shared by the benchmark cases. */
export function percentile(samples: readonly number[], p: number): number {
  if (samples.length === 0) return Number.NaN;
  const sorted = [...samples].sort((a, b) => a - b);
  const rank = Math.min(sorted.length - 1, Math.max(0, Math.ceil((p / 100) * sorted.length) - 1));
  return sorted[rank];
}

export const median = (samples: readonly number[]): number => percentile(samples, 50);

/** Rounds a figure for a JSON line: enough digits to compare runs, no noise. */
export function round(value: number, digits = 3): number {
  const f = 10 ** digits;
  return Math.round(value * f) / f;
}
