/**
 * Validation of what a lab runs: its panel (a built-in id or a custom layout, checked by the shared
 * layout parser) and its check script (the shared step-by-step parser, then against the panel).
 * Problems come back as `validation` failures with located `fields`: `panel.layout` for the
 * layout, `script.steps.<n>` (0-based, as JSON paths count) for a step, `script` otherwise.
 */
import type { LabPanel } from '@shared/api';
import { checkScriptAgainstPanel, parseCheckScript, studentScript, type CheckScript, type ExpectStep, type StudentScript } from '@shared/checks';
import { builtInPanel, BUILT_IN_PANELS } from '@shared/field/panels';
import { parsePanelLayout } from '@shared/field/parseLayout';
import type { PanelLayout } from '@shared/field/layout';
import { failure, success, type Failure, type Outcome } from '../http/failure';

/** The layout of a lab panel, or a located failure. */
export function resolvePanel(panel: LabPanel): Outcome<PanelLayout> {
  if (panel.kind === 'builtIn') {
    const layout = builtInPanel(panel.id);
    if (layout) return success(layout);
    const known = Object.keys(BUILT_IN_PANELS).join(', ');
    return failure('validation', `panel.id: there is no built-in panel "${panel.id}" (built in: ${known})`, { fields: { 'panel.id': `no built-in panel "${panel.id}"; use one of ${known}` } });
  }
  const parsed = parsePanelLayout(panel.layout);
  if (parsed.ok) return success(parsed.value);
  return failure('validation', `panel.layout: ${parsed.errors.slice(0, 3).join('; ')}`, { fields: { 'panel.layout': parsed.errors.join('; ') }, details: { errors: parsed.errors } });
}

/** `step 4: …` → `script.steps.3`; anything else → `script`. */
function fieldOf(error: string): string {
  const match = /^step (\d+)/.exec(error);
  return match ? `script.steps.${Number(match[1]) - 1}` : 'script';
}

/** The script parsed and checked against `layout`, or a failure naming each step and field. */
export function checkLabScript(script: unknown, layout: PanelLayout): Outcome<CheckScript> {
  const parsed = parseCheckScript(script);
  const errors = parsed.ok ? checkScriptAgainstPanel(parsed.value, layout) : parsed.errors;
  if (parsed.ok && errors.length === 0) return success(parsed.value);
  const fields: Record<string, string> = {};
  for (const error of errors) fields[fieldOf(error)] ??= error;
  return failure('validation', `The check script has ${errors.length} problem${errors.length === 1 ? '' : 's'}: ${errors.slice(0, 3).join('; ')}`, { fields, details: { errors } });
}

/** What a lab runs: its layout and its script checked against it. */
export interface LabRun {
  layout: PanelLayout;
  script: CheckScript;
}

/** A lab's run, or which part of it is wrong and how. */
export type LabRunOutcome = { ok: true; value: LabRun } | { ok: false; part: 'panel' | 'script'; failure: Failure };

/**
 * Checked runs by their JSON text. Parsing and checking a script against its panel took about
 * 0.5 ms of every submission (measured); the result depends only on the text, so it can never be
 * stale, and an edited lab simply has another key. Bounded, oldest first out.
 */
const checkedRuns = new Map<string, LabRunOutcome>();
const CHECKED_RUNS_KEPT = 256;

/** A lab's panel and script ready to run (shared, read-only), or the located failure. */
export function labRun(panel: LabPanel, script: unknown): LabRunOutcome {
  const key = JSON.stringify([panel, script]);
  const known = checkedRuns.get(key);
  if (known) return known;
  const layout = resolvePanel(panel);
  const checked = layout.ok ? checkLabScript(script, layout.value) : null;
  const run: LabRunOutcome = !layout.ok
    ? { ok: false, part: 'panel', failure: layout.failure }
    : !checked!.ok
      ? { ok: false, part: 'script', failure: checked!.failure }
      : { ok: true, value: { layout: layout.value, script: checked!.value } };
  if (checkedRuns.size >= CHECKED_RUNS_KEPT) checkedRuns.delete(checkedRuns.keys().next().value as string);
  checkedRuns.set(key, run);
  return run;
}

export interface CheckCounts {
  visible: number;
  hidden: number;
  maxScore: number;
}

const isExpect = (step: CheckScript['steps'][number]): step is ExpectStep => 'expect' in step;

/** How many visible and hidden checks a (valid) script has, and its points. */
export function countChecks(script: CheckScript): CheckCounts {
  const counts: CheckCounts = { visible: 0, hidden: 0, maxScore: 0 };
  for (const step of script.steps) {
    if (!isExpect(step)) continue;
    if (step.hidden) counts.hidden += 1;
    else counts.visible += 1;
    counts.maxScore += step.points ?? 1;
  }
  return counts;
}

/**
 * The self-check script for a student (see `SelfCheckScriptSchema`): the student's script of
 * `studentScript` in `shared/checks` — no hidden check, nothing after the last visible check, no
 * wait split where a hidden check sat — numbered as the student's grade reports are.
 */
export function selfCheckScript(script: CheckScript): StudentScript {
  return studentScript(script);
}
