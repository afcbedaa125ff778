/**
 * The thermal image of an overload relay (IEC 60255-8 style; Sheldrake, Handbook of Electrical
 * Engineering, §12.7.1). With I the current per unit of the setting and θ the image in the same
 * units squared, dθ/dt = (I² − θ)/τ; the relay trips when θ reaches k².
 *
 * Closed forms: from cold t = τ·ln(I² / (I² − k²)); from a steady load Ip,
 * t = τ·ln((I² − Ip²) / (I² − k²)). τ per trip class is chosen so that the trip at 7.2 × the setting
 * from cold falls inside the IEC 60947-4-1 Table 3 band ([derived] in docs/published-values.md): 8 / 16 / 24 s
 * for classes 10 / 20 / 30 (0.8 × the class number) and 6 s, the middle of 2–10 s, for class 10A
 * (our choice). With k = 1.125 that gives τ = 323.7 / 647.3 / 971.0 s and 242.7 s for 10A.
 */

/** IEC 60947-4-1 trip classes. */
export type TripClass = '10A' | '10' | '20' | '30';

export const TRIP_CLASSES: readonly TripClass[] = ['10A', '10', '20', '30'];

/** Trip threshold factor k: the image trips at θ = k². Above 1.05 so 1.05 × never trips (Table 2). */
export const DEFAULT_TRIP_FACTOR = 1.125;

/** The multiple of the setting at which Table 3 sets the class limits. */
export const CLASS_TEST_MULTIPLE = 7.2;

/** Our target trip time at 7.2 × from cold, in s, inside each IEC 60947-4-1 Table 3 band. */
export const TARGET_TRIP_S_AT_7_2 = { '10A': 6, '10': 8, '20': 16, '30': 24 } as const satisfies Record<TripClass, number>;

/** τ in s for a class, so that 7.2 × from cold trips at the target time. */
export function timeConstantS(tripClass: TripClass, k = DEFAULT_TRIP_FACTOR): number {
  const i2 = CLASS_TEST_MULTIPLE * CLASS_TEST_MULTIPLE;
  return TARGET_TRIP_S_AT_7_2[tripClass] / Math.log(i2 / (i2 - k * k));
}

/**
 * The image after `dtMs` at a constant per-unit current: the exact solution of the differential
 * equation over the step, so a stepped simulation reproduces the closed-form trip times.
 */
export function advanceImage(theta: number, perUnitCurrent: number, dtMs: number, tauS: number): number {
  const target = perUnitCurrent * perUnitCurrent;
  return target + (theta - target) * Math.exp(-dtMs / 1000 / tauS);
}

/** Closed-form trip time in s from a steady image `fromPerUnit` (0 = cold); Infinity if it never trips. */
export function tripTimeS(perUnitCurrent: number, tauS: number, k = DEFAULT_TRIP_FACTOR, fromPerUnit = 0): number {
  const i2 = perUnitCurrent * perUnitCurrent;
  const k2 = k * k;
  const p2 = fromPerUnit * fromPerUnit;
  if (i2 <= k2) return Number.POSITIVE_INFINITY;
  if (p2 >= k2) return 0;
  return tauS * Math.log((i2 - p2) / (i2 - k2));
}
