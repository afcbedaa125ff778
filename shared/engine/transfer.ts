/**
 * Recompiling while running: move what still makes sense from the old runtime into one built on
 * the new plan, so the machine does not lose its state because a student edited a rung.
 */
import type { Runtime } from './runtime';
import type { RestoreReport } from './snapshot';

/**
 * Keep `%MX` bits, outputs, the input and output images, edge-contact memories (same element,
 * same operand), block states of instances that still exist with the same type, forces, and the
 * virtual time and scan count. `kept` and `dropped` name the block instances carried over or left
 * behind (and any bit or force the new panel has no room for).
 */
export function transferMemory(from: Runtime, to: Runtime): RestoreReport {
  return to.restore(from.snapshot());
}
