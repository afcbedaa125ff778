/**
 * A message shown on its own as a sentence: capital first letter, closing full stop. The server's
 * and the schemas' messages are fragments ("this link is not valid"), written to follow a field
 * name or to sit under a field.
 */
export function asSentence(text: string): string {
  const capitalised = `${text.charAt(0).toUpperCase()}${text.slice(1)}`;
  return /[.!?]$/.test(capitalised) ? capitalised : `${capitalised}.`;
}
