/**
 * "Show me": replay a check run in the workbench's simulator up to one check, so the student sees
 * the panel, the I/O and the trace as they were at that moment. The replay drives a simulator
 * session exactly as the shared runner drives its simulation — settle, then each step: device
 * actions at once, waits as whole scans — so it reaches the check's `atMs` in the same state.
 */
import { parseCheckScript, stepAction, stepSpanMs, type CheckScript } from '@shared/checks';
import type { ActionArgs, DeviceAction } from '@shared/field';

/** The part of a simulator session a replay needs (`src/simulation/session.ts` has it). */
export interface ReplayTarget {
  readonly scanMs: number;
  advance(count: number): void;
  act(deviceId: string, action: DeviceAction, args?: ActionArgs): { ok: boolean };
  /** The script's own steps beyond device actions; a target without one says it did not replay it. */
  force?(operand: string, value: boolean): { ok: boolean };
  unforce?(operand: string): void;
  clearForces?(): void;
  preheat?(deviceId: string, factor: number): { ok: boolean };
  power?(on: boolean): void;
}

/** Where the replay stopped and what it did. */
export interface ReplayOutcome {
  /** Virtual ms run (settling included): equals the check's `atMs` when the scan period matches. */
  virtualMs: number;
  /** The step the replay stopped after (the check's own number). */
  stepNumber: number;
  /** Device actions the panel refused on the way (as the runner would log them), and steps not replayed. */
  refused: string[];
}

/** Replay `script` on `target` (freshly loaded, at time 0) through step `stepNumber` (1-based). */
export function replayTo(target: ReplayTarget, script: CheckScript, stepNumber: number): ReplayOutcome {
  const refused: string[] = [];
  let virtualMs = 0;
  const wait = (ms: number): void => {
    const scans = Math.ceil(ms / target.scanMs);
    target.advance(scans);
    virtualMs += scans * target.scanMs;
  };
  wait(script.settleMs);
  const last = Math.min(stepNumber, script.steps.length);
  for (let i = 0; i < last; i += 1) {
    const step = script.steps[i]!;
    const action = stepAction(step);
    if (action === 'expect' || action === 'prove') continue;
    if (action === 'wait' || action === 'during' || action === 'until') {
      // A check over time runs its scans as a wait does (an `until` lasts its whole window).
      wait(stepSpanMs(step));
      continue;
    }
    const s = step as Record<string, unknown>;
    if (action === 'force' || action === 'unforce' || action === 'preheat' || action === 'power') {
      if (!replayOwnStep(target, s, action)) refused.push(`step ${i + 1}: ${action} ${String(s[action])} (not replayed in the workbench)`);
      continue;
    }
    const device = String(s[action]);
    const result = target.act(device, action, { to: s.to as string | undefined, factor: s.factor as number | undefined });
    if (!result.ok) refused.push(`step ${i + 1}: ${action} ${device}`);
  }
  return { virtualMs, stepNumber: last, refused };
}

/** A force, unforce, preheat or power step on the target, as the runner does it; false when the target cannot. */
function replayOwnStep(target: ReplayTarget, s: Record<string, unknown>, action: 'force' | 'unforce' | 'preheat' | 'power'): boolean {
  switch (action) {
    case 'force':
      return target.force !== undefined && target.force(String(s.force), s.to === true).ok;
    case 'unforce':
      if (s.unforce === 'all') {
        if (!target.clearForces) return false;
        target.clearForces();
      } else {
        if (!target.unforce) return false;
        target.unforce(String(s.unforce));
      }
      return true;
    case 'preheat':
      return target.preheat !== undefined && target.preheat(String(s.preheat), s.factor as number).ok;
    case 'power':
      if (!target.power) return false;
      target.power(s.power === 'on');
      return true;
  }
}

/** Parse a stored script for a replay; null when it does not parse (then there is nothing to replay). */
export function replayableScript(json: unknown): CheckScript | null {
  const parsed = parseCheckScript(json);
  return parsed.ok ? parsed.value : null;
}
