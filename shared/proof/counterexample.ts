/**
 * A path found by the search, written as a check script: the environment's moves as steps, the
 * scans between them as waits, and last the check that the violating (or witnessed) state is
 * there. Run by the ordinary check runner, the script passes exactly when the path reproduces in
 * the simulator. The script starts at power-up (`settleMs` 0), as the search does.
 */
import type { CheckScript, Step } from '../checks/script';
import type { EnvMove } from './abstraction';
import { pathTo, type SearchNode } from './explore';
import { monitorAge } from './goals';
import type { Condition, Property } from './property';

export interface ScriptContext {
  panelId: string;
  scanMs: number;
  deviceIds: readonly string[];
  /** The values of `keys` in `node`'s state, as a check script reads them. */
  actual(node: SearchNode, keys: readonly string[]): Condition;
}

function moveSteps(id: string, move: EnvMove): Step[] {
  switch (move.action) {
    case 'set':
      return [{ set: id, to: move.to ?? '' }];
    case 'reset':
      // The thermal image is abstracted: the relay is taken as cooled before it is reset.
      return [{ preheat: id, factor: 0 }, { reset: id }];
    case 'press':
      return [{ press: id }];
    case 'release':
      return [{ release: id }];
    case 'trip':
      return [{ trip: id }];
    case 'block':
      return [{ block: id }];
    case 'unblock':
      return [{ unblock: id }];
    case 'load':
      return [];
  }
}

/** Steps that take the panel from `from` (exclusive) to `to` along the path: moves, then waits. */
function replaySteps(path: readonly SearchNode[], from: number, to: number, ctx: ScriptContext): Step[] {
  const steps: Step[] = [];
  let scans = 0;
  const flush = (): void => {
    if (scans > 0) steps.push({ wait: scans * ctx.scanMs });
    scans = 0;
  };
  for (let i = from + 1; i <= to; i += 1) {
    const node = path[i]!;
    if (node.moves.length > 0) {
      flush();
      for (const m of node.moves) steps.push(...moveSteps(ctx.deviceIds[m.device]!, m.move));
    }
    scans += 1;
  }
  flush();
  return steps;
}

const keysOf = (...conditions: (Condition | undefined)[]): string[] => [...new Set(conditions.flatMap((c) => (c ? Object.keys(c) : [])))];

/** A check script's title and step labels hold 200 characters; a property's label may itself be 200 long. */
const MAX_SCRIPT_TEXT = 200;
const words = (text: string): string => (text.length <= MAX_SCRIPT_TEXT ? text : `${text.slice(0, MAX_SCRIPT_TEXT - 1)}…`);

/** The check script that reproduces the path to `hit` for `property` (its label names the property). */
export function counterexampleScript(property: Property, label: string, hit: SearchNode, goalIndex: number, ctx: ScriptContext): CheckScript {
  const path = pathTo(hit);
  const last = path.length - 1;
  const base = { panel: ctx.panelId, scanMs: ctx.scanMs, settleMs: 0, title: words(`Counterexample: ${label}`) };
  if ('after' in property) {
    // Back from the violation to the scan where the oldest waiting trigger became true.
    // The hit is the first scan past the window: the script covers the window up to the scan before.
    const end = last - 1;
    let trigger = end;
    while (trigger > 0 && monitorAge(path[trigger]!.monitors[goalIndex]!) !== 0) trigger -= 1;
    const steps: Step[] = replaySteps(path, 0, trigger, ctx);
    steps.push({ expect: ctx.actual(path[trigger]!, keysOf(property.after, property.expect)), label: words(`the trigger becomes true: ${label}`) });
    // Then every scan of the window, where the expectation must never hold; moves split the span.
    let scans = 0;
    const flush = (): void => {
      if (scans > 0) steps.push({ during: scans * ctx.scanMs, never: property.expect, label: words(`still not as expected: ${label}`) });
      scans = 0;
    };
    for (let i = trigger + 1; i <= end; i += 1) {
      const node = path[i]!;
      if (node.moves.length > 0) {
        flush();
        for (const m of node.moves) steps.push(...moveSteps(ctx.deviceIds[m.device]!, m.move));
      }
      scans += 1;
    }
    flush();
    return { ...base, steps };
  }
  const steps = replaySteps(path, 0, last, ctx);
  const expect =
    'never' in property ? property.never : 'reachable' in property ? property.reachable : ctx.actual(hit, keysOf(property.always, property.when));
  steps.push({ expect, label: words('reachable' in property ? `reached: ${label}` : `violated: ${label}`) });
  return { ...base, steps };
}
