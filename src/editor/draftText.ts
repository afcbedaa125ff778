/**
 * Text fields over the shared edits. The shared edits store text trimmed (`setOperand`,
 * `setComment`, `setRungComment`…), so a field bound straight to the document would swallow the
 * space a student has just typed between two words. A field keeps what was typed as a draft and
 * shows it while it still means the stored text; once the document says something else (undo, a
 * different element, an edit refused as too long) the stored text wins.
 */

/** The text a field shows: the draft while its trimmed form is the stored text, else the stored text. */
export function shownText(draft: string | undefined, stored: string): string {
  return draft !== undefined && draft.trim() === stored ? draft : stored;
}
