/**
 * The animation-frame loop that drives a running simulation: on each frame it asks the pacing how
 * many scans are due and hands them to `onFrame`. The scheduler is passed in (the browser's
 * `requestAnimationFrame`, or a fake in tests), so nothing here reads a clock of its own.
 */
import { paceFrame, type SimulationSpeed } from './pacing';

export interface FrameScheduler {
  request(callback: (timestampMs: number) => void): number;
  cancel(handle: number): void;
}

export interface FrameLoopOptions {
  scheduler: FrameScheduler;
  /** The current speed and scan period, read on every frame (they may change while running). */
  speed(): SimulationSpeed;
  scanMs(): number;
  /** Run this many scans now; `behindMs` > 0 when the cap or a long gap dropped virtual time. */
  onFrame(scans: number, behindMs: number): void;
}

export interface FrameLoop {
  readonly running: boolean;
  start(): void;
  stop(): void;
}

/** A loop that is stopped until `start()`. The first frame after a start only sets the time base. */
export function createFrameLoop(options: FrameLoopOptions): FrameLoop {
  let handle: number | null = null;
  let lastMs: number | null = null;
  let carryMs = 0;

  const frame = (now: number): void => {
    if (handle === null) return;
    const elapsed = lastMs === null ? 0 : now - lastMs;
    lastMs = now;
    const paced = paceFrame({ carryMs, elapsedMs: elapsed, speed: options.speed(), scanMs: options.scanMs() });
    carryMs = paced.carryMs;
    handle = options.scheduler.request(frame);
    if (paced.scans > 0 || paced.behindMs > 0) options.onFrame(paced.scans, paced.behindMs);
  };

  return {
    get running() {
      return handle !== null;
    },
    start() {
      if (handle !== null) return;
      lastMs = null;
      carryMs = 0;
      handle = options.scheduler.request(frame);
    },
    stop() {
      if (handle === null) return;
      options.scheduler.cancel(handle);
      handle = null;
    },
  };
}

/** The browser's animation-frame scheduler, or a 16 ms timer where there is none (tests in Node). */
export function browserScheduler(): FrameScheduler {
  const raf = globalThis.requestAnimationFrame?.bind(globalThis);
  const caf = globalThis.cancelAnimationFrame?.bind(globalThis);
  if (raf && caf) return { request: raf, cancel: caf };
  return {
    request: (cb) => setTimeout(() => cb(globalThis.performance.now()), 16) as unknown as number,
    cancel: (h) => clearTimeout(h),
  };
}
