/**
 * The overload relay's thermal image against the closed forms of Sheldrake, Handbook of Electrical
 * Engineering, §12.7.1 (IEC 60255-8 style): dθ/dt = (I² − θ)/τ, trip at θ = k²;
 * from cold t = τ·ln(I²/(I² − k²)); from a steady load Ip t = τ·ln((I² − Ip²)/(I² − k²)).
 * The closed forms are evaluated from their text by mathjs (an independent evaluator), and the
 * derived values of docs/published-values.md ([derived], k = 1.125) are checked to their printed precision.
 */
import { evaluate } from 'mathjs';
import { describe, expect, it } from 'vitest';
import { advanceImage, DEFAULT_TRIP_FACTOR, DEVICE_MODELS, timeConstantS, tripTimeS, type TripClass } from '@shared/field';

const K = DEFAULT_TRIP_FACTOR;
const fromCold = (tau: number, i: number): number => evaluate('tau * log(I^2 / (I^2 - k^2))', { tau, I: i, k: K }) as number;
const fromLoad = (tau: number, i: number, ip: number): number =>
  evaluate('tau * log((I^2 - Ip^2) / (I^2 - k^2))', { tau, I: i, Ip: ip, k: K }) as number;

// docs/published-values.md [derived]: τ per class for k = 1.125 and the resulting trip times in s.
const DERIVED = {
  '10': { tau: 323.7, cold72: 8.0, cold6: 11.6, hot15: 77, after105at12: 214 },
  '20': { tau: 647.3, cold72: 16.0, cold6: 23.2, hot15: 155, after105at12: 427 },
  '30': { tau: 971.0, cold72: 24.0, cold6: 34.8, hot15: 232, after105at12: 641 },
} as const satisfies Partial<Record<TripClass, Record<string, number>>>;

const CLASSES = Object.keys(DERIVED) as (keyof typeof DERIVED)[];

describe('Sheldrake §12.7.1: τ per trip class (docs/published-values.md, derived)', () => {
  it.each(CLASSES)('class %s has τ as derived', (c) => {
    expect(timeConstantS(c)).toBeCloseTo(DERIVED[c].tau, 0);
    expect(Math.abs(timeConstantS(c) - DERIVED[c].tau)).toBeLessThan(0.05);
  });
  it('class 10A: τ chosen for 6 s at 7.2 × (our choice inside IEC 60947-4-1 Table 3, 2-10 s)', () => {
    expect(fromCold(timeConstantS('10A'), 7.2)).toBeCloseTo(6, 9);
  });
});

describe('Sheldrake §12.7.1: closed-form trip times (docs/published-values.md, derived)', () => {
  it.each(CLASSES)('class %s: 7.2 × and 6 × from cold', (c) => {
    const tau = timeConstantS(c);
    expect(tripTimeS(7.2, tau)).toBeCloseTo(fromCold(tau, 7.2), 9);
    expect(tripTimeS(7.2, tau)).toBeCloseTo(DERIVED[c].cold72, 1);
    expect(tripTimeS(6, tau)).toBeCloseTo(DERIVED[c].cold6, 1);
  });
  it.each(CLASSES)('class %s: 1.5 × from hot (1.0) and 1.2 × after 1.05 ×', (c) => {
    const tau = timeConstantS(c);
    expect(tripTimeS(1.5, tau, K, 1.0)).toBeCloseTo(fromLoad(tau, 1.5, 1.0), 9);
    expect(Math.round(tripTimeS(1.5, tau, K, 1.0))).toBe(DERIVED[c].hot15);
    expect(Math.round(tripTimeS(1.2, tau, K, 1.05))).toBe(DERIVED[c].after105at12);
  });
  it('never trips at or below k × setting', () => {
    expect(tripTimeS(1.05, 323.7)).toBe(Number.POSITIVE_INFINITY);
    expect(tripTimeS(K, 323.7)).toBe(Number.POSITIVE_INFINITY);
  });
});

describe('the stepped image reproduces the closed forms', () => {
  it('advanceImage is the exact solution over a step, whatever the step size', () => {
    const tau = 323.7;
    const oneStep = advanceImage(0, 6, 10_000, tau);
    let many = 0;
    for (let i = 0; i < 1000; i += 1) many = advanceImage(many, 6, 10, tau);
    expect(many).toBeCloseTo(oneStep, 9);
    expect(oneStep).toBeCloseTo(evaluate('I^2 * (1 - exp(-t / tau))', { I: 6, t: 10, tau }) as number, 9);
  });
  it.each(CLASSES)('class %s: the relay model trips at 7.2 × within one 10 ms scan of the closed form', (c) => {
    const model = DEVICE_MODELS.overload;
    const p = model.params.parse({ settingA: 2.4, tripClass: c });
    let state = model.initial(p);
    let t = 0;
    while (!state.tripped) {
      state = model.step!(state, p, { energised: false, blocked: false, conflict: false, supply: 'none', currentA: 7.2 * 2.4 }, 10);
      t += 10;
    }
    const expected = fromCold(timeConstantS(c), 7.2) * 1000;
    expect(t).toBeGreaterThanOrEqual(expected);
    // Trips are seen at scan ends: at most one 10 ms scan late (floating rounding can cost that scan at an exact boundary).
    expect(t - expected).toBeLessThanOrEqual(10);
  });
});
