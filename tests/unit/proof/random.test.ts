/**
 * Cross-check with random programs (tests/unit/engine/oracle/randomProgram.ts) and random
 * properties over the panel's outputs: a `proved` or `unreachable` verdict is never contradicted
 * by long random runs of the ordinary simulator (random operator actions, several at once, at
 * random scans), and every counterexample or witness replays (the proof checks that itself; a
 * defect would show as `defect`).
 */
import fc from 'fast-check';
import { describe, expect, it } from 'vitest';
import { createSimulation, REVERSING_CONVEYOR, type Simulation } from '@shared/field';
import { prove, type Property } from '@shared/proof';
import { block, buildProgram, coil, nc, no, par, resetCoil, rung, setCoil } from '@shared/labs/build';
import type { Program } from '@shared/ladder/schema';
import { randomProgram } from '../engine/oracle/randomProgram';

/**
 * Small control-like programs: contacts on the panel's inputs and on outputs and memory (seal-ins),
 * set/reset coils and an on-delay timer, so that outputs really follow the operator. The oracle's
 * generator explores every element kind but its outputs rarely depend on the buttons.
 */
const signal = fc.oneof(
  { weight: 4, arbitrary: fc.integer({ min: 1, max: 8 }).map((i) => `%IX${i}`) },
  { weight: 2, arbitrary: fc.integer({ min: 1, max: 6 }).map((i) => `%QX${i}`) },
  { weight: 1, arbitrary: fc.integer({ min: 1, max: 3 }).map((i) => `%MX${i}`) },
  { weight: 1, arbitrary: fc.constant('T1.Q') },
);
const written = fc.oneof(fc.integer({ min: 1, max: 6 }).map((i) => `%QX${i}`), fc.integer({ min: 1, max: 3 }).map((i) => `%MX${i}`));
const element = fc.tuple(fc.boolean(), signal).map(([open, s]) => (open ? no(s) : nc(s)));
const smallRung = fc.oneof(
  fc.tuple(fc.array(element, { minLength: 1, maxLength: 3 }), fc.option(element), fc.constantFrom(coil, coil, setCoil, resetCoil), written).map(([items, seal, kind, out]) =>
    rung('', ...(seal ? [par(items[0]!, seal), ...items.slice(1)] : items), kind(out)),
  ),
  fc.tuple(element, fc.integer({ min: 1, max: 5 })).map(([input, tenths]) => rung('', input, block('TON', 'T1', { PT: `T#${tenths * 10}ms` }))),
);
const smallProgram: fc.Arbitrary<Program> = fc.array(smallRung, { minLength: 1, maxLength: 4 }).map((rungs) => buildProgram('random', '', [], rungs));

/** The bits a program's coils write: the properties speak of them, so they are not trivially true. */
function writtenBits(program: unknown): string[] {
  const found = new Set<string>();
  const walk = (node: unknown): void => {
    if (Array.isArray(node)) node.forEach(walk);
    else if (node !== null && typeof node === 'object') {
      const n = node as Record<string, unknown>;
      if (n.kind === 'coil' && typeof n.operand === 'string') found.add(n.operand.toUpperCase());
      Object.values(n).forEach(walk);
    }
  };
  walk(program);
  return [...found].sort();
}

const propertiesFor = (program: unknown): fc.Arbitrary<Property[]> => {
  const bits = writtenBits(program);
  const key = bits.length > 0 ? fc.constantFrom(...bits) : fc.constant('%QX1');
  const condition = fc.dictionary(key, fc.boolean(), { minKeys: 1, maxKeys: 2 });
  const property: fc.Arbitrary<Property> = fc.oneof(
    condition.map((c) => ({ never: c })),
    fc.tuple(condition, condition).map(([a, w]) => ({ always: a, when: w })),
    condition.map((c) => ({ reachable: c })),
  );
  return fc.array(property, { minLength: 1, maxLength: 3 });
};

/** Every action the operator has on this panel (the proof's environment, but for the overload's heat). */
const ACTIONS: readonly ((sim: Simulation) => void)[] = [
  (s) => s.press('S0'), (s) => s.release('S0'),
  (s) => s.press('S1'), (s) => s.release('S1'),
  (s) => s.press('S2'), (s) => s.release('S2'),
  (s) => s.press('S3'), (s) => s.release('S3'),
  (s) => s.set('S4', 'RUN'), (s) => s.set('S4', 'JOG'),
  (s) => s.block('B1'), (s) => s.unblock('B1'),
  (s) => s.trip('F1'), (s) => s.reset('F1'),
];

const holds = (sim: Simulation, c: Record<string, unknown>): boolean => Object.entries(c).every(([k, v]) => sim.runtime.read(k) === v);
/** Is the property broken (never/always) or met (reachable) in the simulation's state? */
const hit = (sim: Simulation, p: Property): boolean => {
  if ('never' in p) return holds(sim, p.never);
  if ('always' in p) return holds(sim, p.when ?? {}) && !holds(sim, p.always);
  if ('reachable' in p) return holds(sim, p.reachable);
  return false;
};

/** A run: before each scan, a few random actions (indices into ACTIONS), or none. */
const run = fc.array(fc.array(fc.nat(ACTIONS.length - 1), { maxLength: 3 }), { minLength: 50, maxLength: 400 });

describe('proof against random simulation', () => {
  it('never proves what a random run breaks, and every counterexample replays', () => {
    let decided = 0;
    fc.assert(
      fc.property(fc.oneof(smallProgram, smallProgram, randomProgram).chain((program) => fc.tuple(fc.constant(program), propertiesFor(program))), fc.array(run, { minLength: 3, maxLength: 3 }), ([program, properties], runs) => {
        const result = prove({ program, panel: REVERSING_CONVEYOR, properties, maxStates: 3000 });
        if (!result.ok) return; // a random program the panel's address space refuses
        result.results.forEach((r, i) => {
          expect(r.defect, r.reason).toBeUndefined();
          if (r.verdict === 'refuted' || r.verdict === 'reached') expect(r.counterexample).toBeDefined();
          if (r.verdict !== 'proved' && r.verdict !== 'unreachable') return;
          decided += 1;
          for (const actions of runs) {
            const created = createSimulation({ program, panel: REVERSING_CONVEYOR, maxEvents: 1 });
            if (!created.ok) throw new Error(created.error);
            const sim = created.simulation;
            for (const step of actions) {
              for (const a of step) ACTIONS[a]!(sim);
              sim.scan();
              expect(hit(sim, properties[i]!), `${r.label} (${r.verdict}) broken at scan ${sim.scanCount}`).toBe(false);
            }
          }
        });
      }),
      { numRuns: 40, seed: 19 },
    );
    // The draw must include decided verdicts, or the check above checked nothing.
    expect(decided).toBeGreaterThan(10);
  }, 300_000);
});
