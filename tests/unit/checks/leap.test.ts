/**
 * Leaping over quiet scans changes nothing a grade report says: random programs (every contact,
 * coil and block kind, timers included) and random scripts (every step kind, long waits, loads
 * that trip the overload, forces, preheat) give the very same report with and without leaps,
 * event for event and trace row for trace row.
 */
import fc from 'fast-check';
import { describe, expect, it } from 'vitest';
import { runChecks, type GradeReport } from '@shared/checks';
import { REVERSING_CONVEYOR } from '@shared/field';
import { THREE_WIRE } from '@shared/labs';
import type { Program } from '@shared/ladder/schema';
import { randomProgram } from '../engine/oracle/randomProgram';
import { programBuilder } from '../engine/build';

/**
 * Timer programs that settle: each rung starts a TON, TOF or TP with a constant preset from a
 * button, a selector or another timer's Q, and drives an output or a memory bit, sometimes
 * sealed in. Random programs rarely sit still long enough for a timer to be leapt; these do.
 */
const timerProgram = fc
  .array(
    fc.record({
      type: fc.constantFrom('TON', 'TOF', 'TP'),
      from: fc.constantFrom('%IX2', '%IX3', '%IX4', '%IX5', 'TA.Q', 'TB.Q', 'TC.Q'),
      negated: fc.boolean(),
      presetMs: fc.integer({ min: 0, max: 40_000 }),
      to: fc.constantFrom('%QX1', '%QX2', '%QX4', '%QX6', '%MX1'),
      seal: fc.boolean(),
    }),
    { minLength: 1, maxLength: 3 },
  )
  .map((rungs) => {
    const b = programBuilder();
    const names = ['TA', 'TB', 'TC'];
    const used = new Set(rungs.map((_, i) => names[i]!));
    return b.program(
      rungs.map((r, i) => {
        const from = r.from.includes('.') && !used.has(r.from.slice(0, 2)) ? '%IX2' : r.from;
        const input = r.seal ? b.parallel(b.contact(r.negated ? 'nc' : 'no', from), b.no(r.to)) : b.contact(r.negated ? 'nc' : 'no', from);
        return b.rung(b.no('%IX1'), input, b.block(r.type, names[i]!, { PT: `T#${r.presetMs}ms` }), b.coil(r.to));
      }),
    );
  });

const bit = fc.oneof(
  fc.integer({ min: 1, max: 8 }).map((i) => `%IX${i}`),
  fc.integer({ min: 1, max: 6 }).map((i) => `%QX${i}`),
  fc.integer({ min: 1, max: 8 }).map((i) => `%MX${i}`),
);

/** What a check may look at: device words, bits and elapsed times. */
const condition = fc.oneof(
  fc.record({ K1: fc.constantFrom('open', 'closed') }),
  fc.record({ F1: fc.constantFrom('ok', 'tripped') }),
  fc.record({ M1: fc.constantFrom('stopped', 'forward', 'reverse') }),
  fc.record({ P2: fc.constantFrom('lit', 'dark'), K2: fc.constantFrom('open', 'closed') }),
  bit.chain((b) => fc.boolean().map((v) => ({ [b]: v }))),
  fc.record({ 'TA.ET': fc.record({ max: fc.integer({ min: 0, max: 600 }) }) }),
);

const wait = fc.oneof(
  { weight: 3, arbitrary: fc.integer({ min: 0, max: 500 }) },
  { weight: 2, arbitrary: fc.integer({ min: 1000, max: 60_000 }) },
);

const step = fc.oneof(
  fc.constantFrom('S0', 'S1', 'S2', 'S3').map((d) => ({ press: d })),
  fc.constantFrom('S0', 'S1', 'S2', 'S3').map((d) => ({ release: d })),
  fc.constantFrom('JOG', 'RUN').map((to) => ({ set: 'S4', to })),
  fc.constantFrom({ block: 'B1' }, { unblock: 'B1' }, { trip: 'F1' }, { reset: 'F1' }, { unforce: 'all' }),
  fc.constantFrom(0, 1, 1.05, 1.2, 2, 7.2).map((factor) => ({ load: 'M1', factor })),
  fc.constantFrom(0, 0.5, 1).map((factor) => ({ preheat: 'F1', factor })),
  fc.record({ force: bit, to: fc.boolean() }),
  wait.map((ms) => ({ wait: ms })),
  wait.map((ms) => ({ wait: ms })),
  condition.map((expect) => ({ expect })),
  fc.record({ during: fc.integer({ min: 1, max: 100_000 }), never: condition }),
  fc.record({ during: fc.integer({ min: 1, max: 100_000 }), always: condition }),
  fc.tuple(condition, fc.integer({ min: 0, max: 50_000 }), fc.integer({ min: 0, max: 150_000 })).map(([until, a, b]) => ({ until, within: [a, a + b] })),
);

const script = fc.record({
  scanMs: fc.constantFrom(3, 7, 10),
  steps: fc.array(step, { minLength: 1, maxLength: 14 }).map((steps) => [...steps, { expect: { K1: 'open' } }]),
});

function graded(program: Program, s: unknown, leap: boolean): GradeReport {
  const result = runChecks({ program, panel: REVERSING_CONVEYOR, script: s, leap });
  if (!result.ok) throw new Error(result.errors.join('\n'));
  return result.report;
}

describe('leaping over quiet scans', () => {
  let leapt = 0;
  let total = 0;
  it('gives the same report as running every scan, on random programs and scripts', () => {
    fc.assert(
      fc.property(randomProgram, script, (program, s) => {
        expect(graded(program, s, true)).toEqual(graded(program, s, false));
      }),
      { numRuns: 50 },
    );
  }, 120_000);

  it('gives the same report on programs whose timers run while all else is still', () => {
    fc.assert(
      fc.property(timerProgram, script, (program, s) => {
        const leaping = runChecks({ program, panel: REVERSING_CONVEYOR, script: s });
        const running = runChecks({ program, panel: REVERSING_CONVEYOR, script: s, leap: false });
        if (!leaping.ok || !running.ok) throw new Error('script refused');
        expect(leaping.report).toEqual(running.report);
        leapt += leaping.scans!.leapt;
        total += leaping.report.scans;
      }),
      { numRuns: 80 },
    );
    // The property means something only if leaps happened.
    expect(leapt).toBeGreaterThan(total / 2);
  }, 120_000);

  it('gives the same report on the three-wire solution with long loads that trip the overload', () => {
    fc.assert(
      fc.property(
        fc.array(fc.oneof(step, fc.constantFrom({ press: 'S2' }, { release: 'S2' }, { set: 'S4', to: 'RUN' })), { minLength: 1, maxLength: 16 }),
        (steps) => {
          const s = { steps: [{ set: 'S4', to: 'RUN' }, ...steps, { expect: { F1: 'ok' } }] };
          expect(graded(THREE_WIRE.solution, s, true)).toEqual(graded(THREE_WIRE.solution, s, false));
        },
      ),
      { numRuns: 60 },
    );
  }, 120_000);

  it('leaps over most of two hours at 1.05 × and still trips at 1.2 × on the same scan', () => {
    const s = {
      steps: [
        { set: 'S4', to: 'RUN' }, { load: 'M1', factor: 1.05 }, { press: 'S2' }, { wait: 100 }, { release: 'S2' },
        { wait: 7_200_000 }, { expect: { F1: 'ok', M1: 'forward' } },
        { load: 'M1', factor: 1.2 }, { until: { F1: 'tripped' }, within: [0, 7_200_000] },
      ],
    };
    const leaping = runChecks({ program: THREE_WIRE.solution, panel: REVERSING_CONVEYOR, script: s });
    const running = runChecks({ program: THREE_WIRE.solution, panel: REVERSING_CONVEYOR, script: s, leap: false });
    if (!leaping.ok || !running.ok) throw new Error('script refused');
    expect(leaping.report).toEqual(running.report);
    expect(leaping.report.passed).toBe(true);
    expect(leaping.scans!.leapt).toBeGreaterThan(0.99 * leaping.report.scans);
    expect(running.scans!.leapt).toBe(0);
  }, 60_000);
});
