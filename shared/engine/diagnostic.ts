/**
 * The engine speaks validation's language: its diagnostics are `Diagnostic`s from
 * `shared/ladder/diagnostics.ts`, shown in the same messages drawer. The engine adds only
 * fallbacks for what validation should already have caught, as `operand-invalid` with the reason.
 */
import { createDiagnostic, type Diagnostic } from '../ladder/diagnostics';
import type { NodePath } from '../ladder/schema';

export type { Diagnostic, DiagnosticCode, Severity } from '../ladder/diagnostics';

/** A located error found while lowering (a gap in validation, never a crash). */
export function engineDiagnostic(
  rungId: string | null,
  path: NodePath,
  elementId: string | null,
  operand: string,
  reason: string,
  field?: string,
): Diagnostic {
  return createDiagnostic('operand-invalid', { operand, reason }, { rungId, path, elementId, field });
}
