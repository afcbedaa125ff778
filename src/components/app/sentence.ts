/**
 * A message shown on its own as a sentence: capital first letter, closing full stop. The server's
 * and the schemas' messages are fragments ("this link is not valid"), written to follow a field
 * name or to sit under a field.
 */
export function asSentence(text: string): string {
  const capitalised = `${text.charAt(0).toUpperCase()}${text.slice(1)}`;
  return /[.!?]$/.test(capitalised) ? capitalised : `${capitalised}.`;
}

/** A count with its noun: "1 student", "3 students", "0 students". `many` for irregular plurals. */
export function plural(n: number, one: string, many = `${one}s`): string {
  return `${n} ${n === 1 ? one : many}`;
}
