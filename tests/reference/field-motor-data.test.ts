/** The default panel's motor and overload data against NEC (NFPA 70) Article 430, as docs/published-values.md gives it. */
import { describe, expect, it } from 'vitest';
import { REVERSING_CONVEYOR } from '@shared/field';

const device = (id: string) => REVERSING_CONVEYOR.devices.find((d) => d.id === id)!;

describe('NEC Article 430 for M1 and F1', () => {
  it('M1 1/2 hp at 208 V three-phase has FLA 2.4 A (NEC Table 430.250, NEC 2008 table, value from memory)', () => {
    expect(device('M1').params).toMatchObject({ hp: 0.5, volts: 208, flaA: 2.4 });
  });
  it('F1 is set at or below 115 % of the motor current (NEC 430.32(A)(1), the stricter case)', () => {
    const f1 = device('F1');
    const m1 = device('M1');
    if (f1.kind !== 'overload' || m1.kind !== 'motor') throw new Error('F1 / M1 kinds changed');
    expect(f1.params.settingA).toBeLessThanOrEqual(1.15 * m1.params.flaA);
    expect(f1.params.tripClass).toBe('10');
  });
});
