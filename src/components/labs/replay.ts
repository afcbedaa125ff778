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
    if (action === 'expect') continue;
    if (action === 'wait' || action === 'during' || action === 'until') {
      // A check over time runs its scans as a wait does (an `until` lasts its whole window).
      wait(stepSpanMs(step));
      continue;
    }
    if (action === 'force' || action === 'unforce' || action === 'preheat' || action === 'power') {
      // The workbench session takes device actions only: say so rather than pretend.
      refused.push(`step ${i + 1}: ${action} ${String((step as Record<string, unknown>)[action])} (not replayed in the workbench)`);
      continue;
    }
    const s = step as Record<string, unknown>;
    const device = String(s[action]);
    const result = target.act(device, action, { to: s.to as string | undefined, factor: s.factor as number | undefined });
    if (!result.ok) refused.push(`step ${i + 1}: ${action} ${device}`);
  }
  return { virtualMs, stepNumber: last, refused };
}

/** Parse a stored script for a replay; null when it does not parse (then there is nothing to replay). */
export function replayableScript(json: unknown): CheckScript | null {
  const parsed = parseCheckScript(json);
  return parsed.ok ? parsed.value : null;
}
