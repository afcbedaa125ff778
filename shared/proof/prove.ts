/**
 * `prove`: decide properties of a program on a panel (see `decide.ts`), every counterexample and
 * witness replayed through the ordinary check runner before it is reported.
 */
import type { PanelLayout } from '../field/layout';
import type { Program } from '../ladder/schema';
import { runChecks } from '../checks/runner';
import type { CheckScript } from '../checks/script';
import { decideProperties, type ProveOptions, type ProveResult } from './decide';

/** Run `script` on the simulator: null when every step passes, else what failed, in words. */
export function replayOnRunner(program: Program, panel: PanelLayout, script: CheckScript): string | null {
  const run = runChecks({ program, panel, script });
  if (!run.ok) return run.errors.join('; ');
  if (run.report.passed) return null;
  return run.report.checks
    .filter((c) => !c.passed)
    .map((c) => `step ${c.index} (${c.label}) failed`)
    .join('; ');
}

export function prove(options: ProveOptions): ProveResult {
  return decideProperties(options, (script) => replayOnRunner(options.program, options.panel, script));
}
