/**
 * Breadth-first search over the model of `model.ts`: from the power-up state, every set of moves
 * the environment can make before each scan, one scan per level. Goals watch the state after
 * every scan. The first state found that hits
 * a goal is therefore reached in the fewest scans (the shortest counterexample or witness in
 * time). The search ends when every reachable state has been visited (a complete search), when
 * the state budget is spent or when the caller's `shouldStop` says so (a cut search, whose
 * verdicts can only be "unknown").
 */
import type { EnvMove } from './abstraction';
import type { ProofModel } from './model';

/** A goal's monitor value meaning "hit in this state". */
export const HIT = -1;

/** What a search looks for, watched at every state after a scan (the simulation holds it). */
export interface Goal {
  /** The monitor value before power-up (0 for a goal without memory). */
  readonly initial: number;
  /** The monitor value in the state the simulation holds, given the value in the state before; `HIT` when hit. */
  observe(monitor: number): number;
}

export interface SearchNode {
  readonly bytes: Uint8Array;
  readonly field: readonly unknown[];
  readonly monitors: readonly number[];
  readonly parent: SearchNode | null;
  /** The moves made before the scan that led here (empty for power-up and for a plain scan). */
  readonly moves: readonly { device: number; move: EnvMove }[];
  /** Scans from power-up. */
  readonly depth: number;
}

export interface SearchProgress {
  states: number;
  depth: number;
}

export interface SearchOptions {
  /** Stop after visiting this many states (a cut search). */
  maxStates: number;
  /** Stop after simulating this many scans (a cut search); no limit if omitted. */
  maxScans?: number;
  /** Asked every few hundred states; true stops the search (a cut search). */
  shouldStop?: (progress: SearchProgress) => boolean;
}

export interface SearchResult {
  /** Every reachable state was visited (or every goal was hit). */
  complete: boolean;
  /** Why the search was cut, when it was. */
  cutBy: 'states' | 'scans' | 'stopped' | null;
  states: number;
  transitions: number;
  /** Scans from power-up of the deepest level fully explored. */
  depth: number;
  /** For each goal, the first state that hit it (fewest scans), or null. */
  hits: (SearchNode | null)[];
}

const NO_MOVES: readonly { device: number; move: EnvMove }[] = [];

export function search(model: ProofModel, goals: readonly Goal[], options: SearchOptions): SearchResult {
  const hits: (SearchNode | null)[] = goals.map(() => null);
  let open = goals.length;
  const observe = (before: readonly number[], node: { monitors: number[] }): number[] => {
    const found: number[] = [];
    for (let g = 0; g < goals.length; g += 1) {
      // A goal already hit stops watching: its monitor stays 0, so it no longer splits states.
      const m = hits[g] !== null ? 0 : goals[g]!.observe(before[g]!);
      if (m === HIT) {
        found.push(g);
        node.monitors[g] = 0;
      } else node.monitors[g] = m;
    }
    return found;
  };

  const first = model.take();
  const root: SearchNode & { monitors: number[] } = {
    bytes: first.bytes.slice(),
    field: first.field.slice(),
    monitors: [],
    parent: null,
    moves: NO_MOVES,
    depth: 0,
  };
  // Power-up is not observed: a property speaks of the states after each scan, as the program
  // has run at least once there (at power-up every output is off, every lamp dark).
  root.monitors.push(...goals.map((goal) => goal.initial));
  const keyOf = (bytes: Uint8Array, field: readonly unknown[], monitors: readonly number[]): string =>
    `${model.engineKey(bytes)}|${model.fieldKey(field)}|${monitors.join(',')}`;
  const visited = new Set<string>([keyOf(root.bytes, root.field, root.monitors)]);
  const queue: SearchNode[] = [root];
  let head = 0;
  let transitions = 0;
  let depth = 0;
  const done = (complete: boolean, cutBy: SearchResult['cutBy']): SearchResult => ({ complete, cutBy, states: visited.size, transitions, depth, hits });
  const active = model.active;
  const monitors = { monitors: new Array<number>(goals.length).fill(0) };
  const choice = new Int32Array(active.length);
  while (head < queue.length) {
    const node = queue[head]!;
    head += 1;
    depth = node.depth;
    if (options.maxScans !== undefined && transitions >= options.maxScans) return done(false, 'scans');
    if ((head & 255) === 0 && options.shouldStop?.({ states: visited.size, depth }) === true) return done(false, 'stopped');
    const options_ = active.map((d) => model.movesOf(d, node.field[d]));
    choice.fill(0);
    for (;;) {
      // One combination: device k stays (choice 0) or makes its move choice-1.
      const field = node.field.slice();
      const moves: { device: number; move: EnvMove }[] = [];
      let refused = false;
      for (let k = 0; k < active.length; k += 1) {
        const c = choice[k]!;
        if (c === 0) continue;
        const d = active[k]!;
        const move = options_[k]![c - 1]!;
        const next = model.apply(d, field[d], move);
        if (next === null) refused = true;
        else {
          field[d] = next;
          moves.push({ device: d, move });
        }
      }
      if (!refused) {
        model.load(node.bytes, field);
        model.sim.scan();
        transitions += 1;
        const after = model.take();
        const found = observe(node.monitors, monitors);
        const key = keyOf(after.bytes, after.field, monitors.monitors);
        if (!visited.has(key) || found.length > 0) {
          if (visited.size >= options.maxStates) return done(false, 'states');
          visited.add(key);
          const child: SearchNode = {
            bytes: after.bytes.slice(),
            field: after.field.slice(),
            monitors: monitors.monitors.slice(),
            parent: node,
            moves: moves.length ? moves : NO_MOVES,
            depth: node.depth + 1,
          };
          for (const g of found) {
            if (hits[g] !== null) continue;
            hits[g] = child;
            open -= 1;
          }
          if (open === 0) return done(true, null);
          queue.push(child);
        }
      }
      // Next combination (odometer over the active devices' choices).
      let k = 0;
      while (k < active.length) {
        choice[k] = choice[k]! + 1;
        if (choice[k]! <= options_[k]!.length) break;
        choice[k] = 0;
        k += 1;
      }
      if (k === active.length) break;
    }
  }
  return done(true, null);
}

/** The transitions from power-up to `node`, in order. */
export function pathTo(node: SearchNode): SearchNode[] {
  const path: SearchNode[] = [];
  for (let n: SearchNode | null = node; n !== null; n = n.parent) path.push(n);
  return path.reverse();
}
