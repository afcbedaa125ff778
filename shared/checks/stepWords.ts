/**
 * The words a report uses for a script step ("press S2", "wait 100 ms"): each check lists the
 * steps that led to it in these words. The student's view of a report is rebuilt from them
 * (`redactReport`), so the words of a wait can be read back.
 */
import { stepAction, type Step } from './script';

/** Words for one step of a check's steps list. */
export function describeStep(step: Step): string {
  const s = step as Record<string, unknown>;
  switch (stepAction(step)) {
    case 'set':
      return `set ${String(s.set)} to ${String(s.to)}`;
    case 'load':
      return `load ${String(s.load)} at ${String(s.factor)} × FLA`;
    case 'wait':
      return describeWait(s.wait as number);
    case 'expect':
    case 'during':
    case 'until':
    case 'prove':
      return 'check';
    case 'force':
      return `force ${String(s.force)} to ${String(s.to)}`;
    case 'unforce':
      return s.unforce === 'all' ? 'remove every force' : `unforce ${String(s.unforce)}`;
    case 'power':
      return s.power === 'off' ? 'controller power off' : 'controller power on (warm restart)';
    case 'preheat':
      return `preheat ${String(s.preheat)} at ${String(s.factor)} × its setting`;
    default: {
      const action = stepAction(step);
      return `${action} ${String(s[action])}`;
    }
  }
}

/** "wait 100 ms". */
export function describeWait(ms: number): string {
  return `wait ${ms} ms`;
}

/** The ms of a wait's words, or null for any other step. */
export function waitOfWords(words: string): number | null {
  const match = /^wait (\d+) ms$/.exec(words);
  return match ? Number(match[1]) : null;
}
