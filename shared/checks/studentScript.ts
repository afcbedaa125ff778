/**
 * The student's script: what a student may know of a check script, and the numbering every
 * student view of a run uses (the self-check the browser runs, the redacted grade report).
 *
 * From the full script: hidden checks' expect steps are removed, steps after the last visible
 * check are left out (they lead only to hidden checks), and two waits that a removed hidden
 * check kept apart become one wait, so neither the steps nor their numbers nor the times at
 * which they start show where a hidden check sat. A hidden check that spans time (a `during`, or
 * an `until`, which lasts its whole window) becomes a wait of that span, joined with the waits
 * beside it, so the time runs on as in grading. Every other step stays: an expect step only
 * reads, and the actions before a hidden check may change what a later visible check sees, so
 * each visible check runs at the same virtual time, in the same state, as in grading.
 */
import { isCheckStep, MAX_WAIT_MS, stepSpanMs, type CheckScript, type Step } from './script';

export interface StudentScript {
  script: CheckScript;
  /** What stays on the server: how many hidden checks and their points. */
  withheld: { hiddenChecks: number; hiddenPoints: number };
}

const isHidden = (step: Step): boolean => isCheckStep(step) && step.hidden === true;

/**
 * One wait that runs exactly the scans of `wait firstMs` then `wait thenMs`, or null when it
 * would pass the longest wait a script may hold (the two then stay apart). A wait runs whole
 * scans (`ceil(ms / scanMs)`), so the first is rounded up to its scans before the second is
 * added. `scanMs` null (a report from before it was recorded) adds them as written.
 */
export function joinWaits(firstMs: number, thenMs: number, scanMs: number | null): number | null {
  const first = scanMs === null ? firstMs : Math.ceil(firstMs / scanMs) * scanMs;
  const joined = first + thenMs;
  return joined <= MAX_WAIT_MS ? joined : null;
}

/** The student's script of a (parsed) check script; see the module comment. */
export function studentScript(script: CheckScript): StudentScript {
  const lastVisible = script.steps.findLastIndex((step) => isCheckStep(step) && !step.hidden);
  const steps: Step[] = [];
  let hiddenChecks = 0;
  let hiddenPoints = 0;
  // A hidden check was removed since the last step kept.
  let afterHidden = false;
  script.steps.forEach((step, i) => {
    if (isHidden(step)) {
      hiddenChecks += 1;
      hiddenPoints += (isCheckStep(step) ? step.points : undefined) ?? 1;
      const span = stepSpanMs(step);
      if (span > 0 && i < lastVisible) {
        // Its time still runs: as a wait, joined with a wait just before it when that fits.
        const previous = steps.at(-1);
        const joined = previous && 'wait' in previous ? joinWaits(previous.wait, span, script.scanMs) : null;
        if (previous && joined !== null) steps[steps.length - 1] = { wait: joined };
        else steps.push({ wait: span });
      }
      afterHidden = true;
      return;
    }
    if (i > lastVisible) return;
    const previous = steps.at(-1);
    if (afterHidden && 'wait' in step && previous && 'wait' in previous) {
      const joined = joinWaits(previous.wait, step.wait, script.scanMs);
      if (joined !== null) {
        steps[steps.length - 1] = { wait: joined };
        afterHidden = false;
        return;
      }
    }
    steps.push(step);
    afterHidden = false;
  });
  return { script: { ...script, steps }, withheld: { hiddenChecks, hiddenPoints } };
}
