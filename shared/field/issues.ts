/**
 * Turns zod's issues into located messages a person can act on: `devices[3].params.settingA:
 * expected a number`. Shared by panel layouts and check scripts.
 */
import type { z } from 'zod';

/** `devices[3].params.settingA` from a zod path. */
export function formatPath(path: readonly PropertyKey[], prefix = ''): string {
  let text = prefix;
  for (const part of path) {
    if (typeof part === 'number') text += `[${part}]`;
    else text += text === '' ? String(part) : `.${String(part)}`;
  }
  return text;
}

/** One message per issue, each starting with where it is. */
export function formatIssues(error: z.ZodError, prefix = ''): string[] {
  return error.issues.map((issue) => {
    const where = formatPath(issue.path, prefix);
    const message = issue.message.replace(/^Invalid input: /, '');
    return where === '' ? message : `${where}: ${message}`;
  });
}
