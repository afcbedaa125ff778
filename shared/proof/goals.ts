/**
 * Properties as search goals. A goal watches every state after a scan: `never` is hit where its
 * condition holds, `always` where `when` holds and `always` does not, `reachable` where its
 * condition holds. `after … within … expect` has a monitor: whether the trigger held in the state
 * before (to see it become true) and the age in scans of the oldest trigger still waiting for the
 * expectation; it is hit in the first state after the window (the counterexample stops at the
 * window's last scan).
 */
import type { Expectation } from '../checks/script';
import type { Simulation } from '../field/simulation';
import { HIT, type Goal } from './explore';
import type { Condition, Property } from './property';

export type Actual = boolean | number | string | null;

/** Reads a value as a check script does: a device's state word, or the program's value. */
export function readKey(sim: Simulation, key: string): Actual {
  const word = sim.word(key);
  if (word !== undefined) return word;
  const value = sim.runtime.read(key);
  return value === undefined ? null : value;
}

function matches(expected: Expectation, actual: Actual): boolean {
  if (typeof expected === 'object') {
    if (typeof actual !== 'number') return false;
    return (expected.min === undefined || actual >= expected.min) && (expected.max === undefined || actual <= expected.max);
  }
  return actual === expected;
}

/** A test of a condition against the state the simulation holds. */
export function conditionTest(sim: Simulation, condition: Condition): () => boolean {
  const entries = Object.entries(condition);
  return () => {
    for (let i = 0; i < entries.length; i += 1) if (!matches(entries[i]![1], readKey(sim, entries[i]![0]))) return false;
    return true;
  };
}

/** The number of whole scans a window of `ms` covers: the last scan it includes. */
export const windowScans = (ms: number, scanMs: number): number => Math.floor(ms / scanMs);

/** The after-goal's monitor: bit 0 = the trigger held before; the rest = 1 + the age (0 = nothing pending). */
export const monitorAge = (monitor: number): number => (monitor >> 1) - 1;

export function goalOf(sim: Simulation, property: Property): Goal {
  if ('never' in property) {
    const test = conditionTest(sim, property.never);
    return { initial: 0, observe: () => (test() ? HIT : 0) };
  }
  if ('reachable' in property) {
    const test = conditionTest(sim, property.reachable);
    return { initial: 0, observe: () => (test() ? HIT : 0) };
  }
  if ('always' in property) {
    const holds = conditionTest(sim, property.always);
    const when = property.when ? conditionTest(sim, property.when) : () => true;
    return { initial: 0, observe: () => (when() && !holds() ? HIT : 0) };
  }
  const trigger = conditionTest(sim, property.after);
  const expected = conditionTest(sim, property.expect);
  const limit = windowScans(property.within, sim.scanMs);
  return {
    // Before power-up the trigger counts as not holding: a trigger true at power-up "becomes true" then.
    initial: 0,
    observe(monitor) {
      const before = (monitor & 1) === 1;
      let age = monitorAge(monitor);
      if (age >= 0) age += 1;
      // The first scan past the window with a trigger still waiting: too late, whatever it shows.
      if (age > limit) return HIT;
      const now = trigger();
      if (expected()) age = -1;
      else if (now && !before && age < 0) age = 0;
      return ((age + 1) << 1) | (now ? 1 : 0);
    },
  };
}
