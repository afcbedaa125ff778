/**
 * The scan engine: compile a program to a plan, run it in virtual time, force, trace, snapshot.
 * Only what other parts use is exported here; the rest is imported from its own module.
 */
export { compile } from './compile';
export type { Diagnostic } from './diagnostic';
export type { Plan } from './plan';
export { checkScanMs, DEFAULT_SCAN_MS, SCAN_MS_MAX, SCAN_MS_MIN, type Runtime } from './runtime';
export { createRuntime } from './scanRuntime';
export { transferMemory } from './transfer';
export type { RuntimeSnapshot } from './snapshot';
export { createTrace } from './trace';
