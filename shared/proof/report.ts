/**
 * The proof report the command line prints, and its exit code: 0 when every property holds
 * (proved, or reached for `reachable`), 1 when one is refuted or unreachable, 3 when one is
 * unknown and none failed (2, bad input, is the caller's).
 */
import type { PropertyResult } from './decide';

export const PROOF_REPORT_FORMAT = 'rungwright.proof-report';

export interface ProofReport {
  format: typeof PROOF_REPORT_FORMAT;
  version: 1;
  panel: string;
  scanMs: number;
  /** What the explored model leaves out (see shared/proof/abstraction.ts). */
  abstractions: readonly string[];
  /** Devices whose moves were not explored because nothing observed depends on them. */
  ignoredDevices: readonly string[];
  results: PropertyResult[];
}

export function proofReport(panel: string, scanMs: number, results: PropertyResult[], abstractions: readonly string[], ignoredDevices: readonly string[]): ProofReport {
  return { format: PROOF_REPORT_FORMAT, version: 1, panel, scanMs, abstractions, ignoredDevices, results };
}

export function proofExitCode(results: readonly PropertyResult[]): 0 | 1 | 3 {
  if (results.some((r) => r.verdict === 'refuted' || r.verdict === 'unreachable')) return 1;
  if (results.some((r) => r.verdict === 'unknown')) return 3;
  return 0;
}
