import { describe, expect, it } from 'vitest';
import { DEFAULT_MAX_SCANS_PER_FRAME, MAX_FRAME_GAP_MS, paceFrame, type SimulationSpeed } from '@/simulation/pacing';

/** Run `frames` frames of `frameMs` wall time each and count the scans. */
function scansOver(frames: number, frameMs: number, speed: SimulationSpeed, scanMs: number): number {
  let carryMs = 0;
  let total = 0;
  for (let i = 0; i < frames; i += 1) {
    const r = paceFrame({ carryMs, elapsedMs: frameMs, speed, scanMs });
    expect(r.carryMs).toBeGreaterThanOrEqual(0);
    expect(r.carryMs).toBeLessThan(scanMs);
    carryMs = r.carryMs;
    total += r.scans;
  }
  return total;
}

describe('pacing the scans to the animation frames', () => {
  it('runs 100 scans of 10 ms in one second of 60 fps frames at real time', () => {
    // 60 frames of 1000/60 ms = 1000 ms wall = 1000 ms virtual = 100 scans of 10 ms.
    expect(scansOver(60, 1000 / 60, 'real', 10)).toBe(100);
  });

  it('runs ten times fewer scans in slow motion and ten times more at ×10', () => {
    expect(scansOver(600, 1000 / 60, 'slow', 10)).toBe(100); // 10 s wall → 1 s virtual
    expect(scansOver(60, 1000 / 60, 'fast', 10)).toBe(1000); // 1 s wall → 10 s virtual
  });

  it('carries the fraction of a scan over, so a 1000 ms scan runs once a second', () => {
    let carryMs = 0;
    const perFrame: number[] = [];
    for (let i = 0; i < 120; i += 1) {
      const r = paceFrame({ carryMs, elapsedMs: 1000 / 60, speed: 'real', scanMs: 1000 });
      carryMs = r.carryMs;
      perFrame.push(r.scans);
    }
    expect(perFrame.reduce((a, b) => a + b, 0)).toBe(2);
    expect(perFrame.slice(0, 59).every((n) => n === 0)).toBe(true);
  });

  it('caps the scans of one frame and reports the virtual time given up', () => {
    const r = paceFrame({ carryMs: 0, elapsedMs: 100, speed: 'fast', scanMs: 1 });
    expect(r.scans).toBe(DEFAULT_MAX_SCANS_PER_FRAME);
    expect(r.behindMs).toBe(1000 - DEFAULT_MAX_SCANS_PER_FRAME);
    expect(r.carryMs).toBeLessThan(1);
  });

  it('counts a long gap (hidden tab) as at most the gap limit', () => {
    const r = paceFrame({ carryMs: 0, elapsedMs: 5000, speed: 'real', scanMs: 10 });
    expect(r.scans).toBe(MAX_FRAME_GAP_MS / 10);
    expect(r.behindMs).toBe(5000 - MAX_FRAME_GAP_MS);
  });

  it('runs nothing for a zero, negative or missing elapsed time', () => {
    for (const elapsedMs of [0, -5, Number.NaN]) {
      expect(paceFrame({ carryMs: 0, elapsedMs, speed: 'real', scanMs: 10 }).scans).toBe(0);
    }
  });
});
