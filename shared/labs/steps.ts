/** Small helpers for writing the labs' check scripts. */
import type { CheckScriptInput } from '../checks/script';

type Steps = CheckScriptInput['steps'];

/** Press a button, hold it `holdMs`, release it, then wait `afterMs`. */
export function pulse(id: string, holdMs = 100, afterMs = 100): Steps {
  return [{ press: id }, { wait: holdMs }, { release: id }, { wait: afterMs }];
}

/** A box passes the photo-eye: blocked `blockedMs`, then clear `gapMs`. */
export function box(id = 'B1', blockedMs = 200, gapMs = 300): Steps {
  return [{ block: id }, { wait: blockedMs }, { unblock: id }, { wait: gapMs }];
}

/** `n` boxes one after the other. */
export function boxes(n: number, id = 'B1'): Steps {
  return Array.from({ length: n }, () => box(id)).flat();
}
