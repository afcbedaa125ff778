/**
 * `compile`: from a program document to an executable plan, or to the diagnostics that say why
 * not. A user's mistake is always returned, never thrown.
 */
import { DEFAULT_ADDRESS_SPACE, type AddressSpace } from '../ladder/addresses';
import { ProgramSchema, type Program } from '../ladder/schema';
import { engineDiagnostic, type Diagnostic } from './diagnostic';
import { lowerProgram } from './lower';
import type { Plan } from './plan';

export type CompileResult =
  | { ok: true; plan: Plan; /** warnings only */ diagnostics: Diagnostic[] }
  | { ok: false; diagnostics: Diagnostic[] };

export interface CompileOptions {
  /** The panel's address space; the default panel's 8 inputs, 6 outputs, 64 memory bits if absent. */
  space?: AddressSpace;
}

/** Validate and lower a program. */
export function compile(program: Program, options: CompileOptions = {}): CompileResult {
  const space = options.space ?? DEFAULT_ADDRESS_SPACE;
  const parsed = ProgramSchema.safeParse(program);
  if (!parsed.success) {
    const diagnostics = parsed.error.issues.slice(0, 20).map((issue) => {
      const where = issue.path.length > 0 ? ` at ${issue.path.join('.')}` : '';
      const rungIndex = issue.path[0] === 'rungs' && typeof issue.path[1] === 'number' ? issue.path[1] : -1;
      const rungId = rungIndex >= 0 ? String(program.rungs?.[rungIndex]?.id ?? '') : '';
      return engineDiagnostic('engine-document', rungId, [], null, `the program document is not valid${where}: ${issue.message}`);
    });
    return { ok: false, diagnostics };
  }
  const checked = parsed.data;
  const lowered = lowerProgram(checked, space);
  if (!lowered.ok) return { ok: false, diagnostics: lowered.diagnostics };
  return { ok: true, plan: lowered.plan, diagnostics: [] };
}
