/**
 * Wall-clock pacing of the simulation: virtual time advances only in whole scans, and the browser
 * decides how many to run on each animation frame. Pure: the frame's elapsed wall time, the speed
 * and the scan period go in; the number of scans and what is carried to the next frame come out.
 */

/** The speeds offered: slow motion, real time, fast. */
export type SimulationSpeed = 'slow' | 'real' | 'fast';

/** Virtual ms per wall ms for each speed. */
export const SPEED_FACTORS = { slow: 0.1, real: 1, fast: 10 } as const satisfies Record<SimulationSpeed, number>;

/** How each speed is labelled in the toolbar. */
export const SPEED_LABELS = { slow: '×0.1', real: '×1', fast: '×10' } as const satisfies Record<SimulationSpeed, string>;

/**
 * A frame's wall time is counted at most this long (ms): after a hidden tab or a breakpoint the
 * simulation resumes where it was instead of racing through minutes of scans.
 */
export const MAX_FRAME_GAP_MS = 250;

/** At most this many scans run in one frame, so a 1 ms scan at ×10 cannot freeze the page. */
export const DEFAULT_MAX_SCANS_PER_FRAME = 200;

export interface PaceInput {
  /** Virtual ms owed from earlier frames (less than one scan unless a frame was capped). */
  carryMs: number;
  /** Wall ms since the previous frame (from the `requestAnimationFrame` timestamps). */
  elapsedMs: number;
  speed: SimulationSpeed;
  /** Scan period, ms. */
  scanMs: number;
  /** Cap per frame; `DEFAULT_MAX_SCANS_PER_FRAME` if absent. */
  maxScans?: number;
}

export interface PaceResult {
  /** Whole scans to run this frame. */
  scans: number;
  /** Virtual ms to carry into the next frame (always less than one scan period). */
  carryMs: number;
  /** Virtual ms given up this frame because of the cap or the gap limit: the run is slower than asked. */
  behindMs: number;
}

/**
 * How many whole scans this frame runs. Virtual time owed = carry + wall time × speed; whole scans
 * of it run now and the remainder (less than one scan) carries over, so over many frames the
 * number of scans matches the wall time exactly. When the cap bites, the excess is dropped and
 * reported in `behindMs` rather than piling up.
 */
export function paceFrame(input: PaceInput): PaceResult {
  const { scanMs, speed } = input;
  const cap = input.maxScans ?? DEFAULT_MAX_SCANS_PER_FRAME;
  const elapsed = Number.isFinite(input.elapsedMs) && input.elapsedMs > 0 ? input.elapsedMs : 0;
  const counted = Math.min(elapsed, MAX_FRAME_GAP_MS);
  const carry = Number.isFinite(input.carryMs) && input.carryMs > 0 ? input.carryMs : 0;
  const owed = carry + counted * SPEED_FACTORS[speed];
  // A tiny epsilon so 0.1 × 16.67 ms frames add up to whole scans despite floating point.
  const whole = Math.floor(owed / scanMs + 1e-9);
  const gapLoss = (elapsed - counted) * SPEED_FACTORS[speed];
  if (whole <= cap) {
    return { scans: whole, carryMs: Math.max(0, owed - whole * scanMs), behindMs: gapLoss };
  }
  const remainder = Math.max(0, owed - whole * scanMs);
  return { scans: cap, carryMs: remainder, behindMs: gapLoss + (whole - cap) * scanMs };
}
