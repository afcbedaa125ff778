/**
 * The scan engine: compile a program to a plan, run it in virtual time, force, trace, snapshot.
 */
export { compile, type CompileOptions, type CompileResult } from './compile';
export type { Diagnostic, DiagnosticCode, Severity } from './diagnostic';
export type { Plan, PlanNode, PlanRung, PlanInstance, PlanEdge, PlanSource, BitLayout } from './plan';
export { checkScanMs, DEFAULT_SCAN_MS, SCAN_MS_MAX, SCAN_MS_MIN, type Runtime, type RuntimeOptions, type SavedState } from './runtime';
export { createRuntime } from './scanRuntime';
export { transferMemory } from './transfer';
export { SNAPSHOT_FORMAT, type RestoreReport, type RuntimeSnapshot } from './snapshot';
export { createTrace, type Trace, type TraceRow } from './trace';
export type { ElementFlow, PowerFlowView } from './powerFlow';
