/**
 * Timer vectors V1–V7 of docs/published-values.md against IEC 61131-3:2013 6.6.3.5.5, Table 46 / Figure 15
 * (the semantics as summarised there are [memory], consistent with the clause). Each program is
 * %IX1 → timer T1 → %QX1, run with a 10 ms scan. Rows are stamped at the end of each scan (see
 * `tests/unit/engine/scenario.ts`); where a vector says "just after", the check is the first row
 * after the change, i.e. a tolerance of one scan as docs/published-values.md allows.
 */
import { describe, expect, it } from 'vitest';
import type { BlockType } from '@shared/ladder/schema';
import { programBuilder } from '../unit/engine/build';
import { onIntervals, simulate, type Schedule } from '../unit/engine/scenario';

function timer(type: BlockType, pt: string) {
  const b = programBuilder();
  return b.program([b.rung(b.no('%IX1'), b.block(type, 'T1', { PT: pt }), b.coil('%QX1'))]);
}

const during =
  (...intervals: Array<[number, number]>): Schedule =>
  (t) => ({ 1: intervals.some(([from, to]) => t >= from && t < to) });

describe('TON (IEC 61131-3:2013 6.6.3.5.5, Table 46 / Figure 15)', () => {
  it('V1: PT=5 s, IN TRUE 0–8 s: ET runs to PT, Q at 5 s, both drop just after 8 s', () => {
    const run = simulate(timer('TON', 'T#5s'), during([0, 8000]), 8100, ['T1.Q', 'T1.ET']);
    expect([run.at(4990, 'T1.Q'), run.at(4990, 'T1.ET')]).toEqual([false, 4990]);
    expect([run.at(5000, 'T1.Q'), run.at(5000, 'T1.ET')]).toEqual([true, 5000]);
    expect(run.at(7000, 'T1.ET')).toBe(5000);
    expect([run.at(8000, 'T1.Q'), run.at(8000, 'T1.ET')]).toEqual([true, 5000]);
    expect([run.at(8010, 'T1.Q'), run.at(8010, 'T1.ET')]).toEqual([false, 0]);
  });

  it('V2: PT=5 s, IN TRUE 0–3 s, FALSE 3–4 s, TRUE from 4 s: ET back to 0, Q rises at 9 s', () => {
    const run = simulate(timer('TON', 'T#5s'), during([0, 3000], [4000, 20_000]), 9100, ['T1.Q', 'T1.ET']);
    expect(run.at(3010, 'T1.ET')).toBe(0);
    expect(run.at(8990, 'T1.Q')).toBe(false);
    expect(run.at(9000, 'T1.Q')).toBe(true);
  });
});

describe('TOF (IEC 61131-3:2013 6.6.3.5.5, Table 46 / Figure 15)', () => {
  it('V3: PT=2 s, IN TRUE 0–5 s: Q from 0; ET 1 s at 6 s; Q off with ET 2 s at 7 s; ET holds 2 s', () => {
    const run = simulate(timer('TOF', 'T#2s'), during([0, 5000]), 10_000, ['T1.Q', 'T1.ET']);
    expect(run.at(10, 'T1.Q')).toBe(true);
    expect(run.at(6000, 'T1.ET')).toBe(1000);
    expect(run.at(6990, 'T1.Q')).toBe(true);
    expect([run.at(7000, 'T1.Q'), run.at(7000, 'T1.ET')]).toEqual([false, 2000]);
    expect(run.at(10_000, 'T1.ET')).toBe(2000);
  });

  it('V4: IN TRUE 0–5, FALSE 5–6, TRUE 6–8 s: Q stays on, ET back to 0 at 6 s, Q falls at 10 s', () => {
    const run = simulate(timer('TOF', 'T#2s'), during([0, 5000], [6000, 8000]), 10_100, ['T1.Q', 'T1.ET']);
    const q = run.series('T1.Q');
    expect(onIntervals(q)).toEqual([[10, 10_000]]);
    // ET is 1 s in the row at 6 s (IN was off 5–6 s) and 0 in the next (one scan's tolerance).
    expect(run.at(6010, 'T1.ET')).toBe(0);
    expect(run.at(9990, 'T1.Q')).toBe(true);
    expect(run.at(10_000, 'T1.Q')).toBe(false);
  });
});

describe('TP (IEC 61131-3:2013 6.6.3.5.5, Table 46 / Figure 15)', () => {
  it('V5: PT=3 s, IN TRUE 0–10 s: Q on 0–3 s; ET 3 s from 3 to 10 s, then 0', () => {
    const run = simulate(timer('TP', 'T#3s'), during([0, 10_000]), 10_100, ['T1.Q', 'T1.ET']);
    expect(onIntervals(run.series('T1.Q'))).toEqual([[10, 3000]]);
    expect(run.series('T1.ET').filter(([t]) => t >= 3000 && t <= 10_000).every(([, et]) => et === 3000)).toBe(true);
    expect(run.at(10_010, 'T1.ET')).toBe(0);
  });

  it('V6: PT=3 s, IN TRUE 0–1 s: Q on 0–3 s; ET reaches 3 s at 3 s, then 0', () => {
    const run = simulate(timer('TP', 'T#3s'), during([0, 1000]), 3100, ['T1.Q', 'T1.ET']);
    expect(onIntervals(run.series('T1.Q'))).toEqual([[10, 3000]]);
    expect(run.at(3000, 'T1.ET')).toBe(3000);
    expect(run.at(3010, 'T1.ET')).toBe(0);
  });

  it('V7: 0.5 s pulses on IN at 0, 1, 2 and 4 s: Q pulses 0–3 s and 4–7 s only (not retriggerable)', () => {
    const pulses = during([0, 500], [1000, 1500], [2000, 2500], [4000, 4500]);
    const run = simulate(timer('TP', 'T#3s'), pulses, 8000, ['T1.Q']);
    expect(onIntervals(run.series('T1.Q'))).toEqual([
      [10, 3000],
      [4010, 7000],
    ]);
  });
});
