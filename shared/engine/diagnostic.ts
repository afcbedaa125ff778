/**
 * Diagnostics the engine adds to validation's, in the same shape, so the editor shows them in the
 * same messages drawer.
 */
import type { NodePath } from '../ladder/schema';

export type Severity = 'error' | 'warning';

/** A located message: which rung, which node (path and id), how bad, and what to do. */
export interface Diagnostic {
  code: string;
  rungId: string;
  path: NodePath;
  elementId: string | null;
  severity: Severity;
  message: string;
}

/** Engine-side codes, for problems validation should already have caught. */
export type EngineDiagnosticCode = 'engine-document' | 'engine-operand' | 'engine-coil-target' | 'engine-block';

export function engineDiagnostic(
  code: EngineDiagnosticCode,
  rungId: string,
  path: NodePath,
  elementId: string | null,
  message: string,
): Diagnostic {
  return { code, rungId, path: [...path], elementId, severity: 'error', message };
}
