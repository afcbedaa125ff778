/**
 * The power flow of the last scan, as the live view reads it: for every node (contact, coil,
 * block, series, parallel; a rung id stands for its root series) whether it was energised on its
 * left and on its right. The kernel that records it stores both sides of every node as it solves
 * them (see `kernel.ts`); a view copies them out once per scan.
 */
import type { Plan } from './plan';

/** One node's power flow. */
export interface ElementFlow {
  /** Energised on its left side (power arrives). */
  readonly left: boolean;
  /** Energised on its right side (power passes on; for a coil, the same as its left). */
  readonly right: boolean;
}

/** A read-only view, keyed by document id. */
export interface PowerFlowView {
  /** The scan this view describes. */
  readonly scanCount: number;
  /**
   * False when that scan was not recorded (nothing has run yet, recording had not started, or the
   * runtime was restored since): then every node reads de-energised.
   */
  readonly recorded: boolean;
  /** Every id the view knows, in document order. */
  readonly ids: readonly string[];
  /** The node's flow, or `undefined` for an id not in the program. */
  get(id: string): ElementFlow | undefined;
  has(id: string): boolean;
}

/** Power per node, indexed by `PlanNode.flow`: 1 where energised. */
export interface FlowRecord {
  readonly left: Uint8Array;
  readonly right: Uint8Array;
}

/** Wrap recorded flow arrays; reads are O(1) and allocate one small object. */
export function createPowerFlowView(plan: Plan, record: FlowRecord, scanCount: number, recorded: boolean): PowerFlowView {
  return {
    scanCount,
    recorded,
    ids: plan.flowIds,
    get(id) {
      const at = plan.flowIndex.get(id);
      if (at === undefined) return undefined;
      return { left: record.left[at] === 1, right: record.right[at] === 1 };
    },
    has: (id) => plan.flowIndex.has(id),
  };
}
