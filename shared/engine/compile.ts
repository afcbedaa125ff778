/**
 * `compile`: from a program document to an executable plan, or to the diagnostics that say why
 * not. A user's mistake is always returned, never thrown.
 */
import { DEFAULT_ADDRESS_SPACE, type AddressSpace } from '../ladder/addresses';
import { hasErrors } from '../ladder/diagnostics';
import { parseProgram } from '../ladder/restore';
import { ok } from '../ladder/result';
import type { Program } from '../ladder/schema';
import { validateProgram } from '../ladder/validate';
import { engineDiagnostic, type Diagnostic } from './diagnostic';
import { MAX_MODULE_BYTES, moduleBytesBound } from './kernel';
import { lowerProgram } from './lower';
import type { Plan } from './plan';
import { isParsedProgram } from '../ladder/wellFormed';

export type CompileResult =
  | { ok: true; plan: Plan; /** warnings only */ diagnostics: Diagnostic[] }
  | { ok: false; diagnostics: Diagnostic[] };

export interface CompileOptions {
  /** The panel's address space; the default panel's 8 inputs, 6 outputs, 64 memory bits if absent. */
  space?: AddressSpace;
}

/**
 * Validate and lower a program: the document is checked (a program that is already exactly what
 * `parseProgram` returns passes a fast walk, anything else goes through `parseProgram`), then
 * validated against the panel's address space (`validateProgram`); any error stops compilation
 * and is returned with the warnings. Never throws for anything in the document.
 */
export function compile(program: Program, options: CompileOptions = {}): CompileResult {
  const space = options.space ?? DEFAULT_ADDRESS_SPACE;
  const parsed = isParsedProgram(program) ? ok(program) : parseProgram(program);
  if (!parsed.ok) return { ok: false, diagnostics: [engineDiagnostic(null, [], null, '', parsed.error)] };
  const diagnostics = validateProgram(parsed.value, space);
  if (hasErrors(diagnostics)) return { ok: false, diagnostics };
  const lowered = lowerProgram(parsed.value, space);
  if (!lowered.ok) return { ok: false, diagnostics: [...diagnostics, ...lowered.diagnostics] };
  if (moduleBytesBound(lowered.plan) > MAX_MODULE_BYTES) {
    const reason = `the program is too large to run: ${lowered.plan.elementCount} elements in ${lowered.plan.rungs.length} rungs; split it, or remove rungs`;
    return { ok: false, diagnostics: [...diagnostics, engineDiagnostic(null, [], null, '', reason)] };
  }
  return { ok: true, plan: lowered.plan, diagnostics };
}
