/**
 * What a file or an answer would hold if the standard labs' answers leaked into it: the labels of
 * the hidden checks and the rungs of the reference solutions (by their comments, the one part of
 * a rung that is a long string of its own; operands are short tag names every program shares),
 * with the solutions' titles and descriptions.
 *
 * Each text is searched for by its longest run of characters that any bundler or JSON writer
 * copies as they are into a string literal (no quote, backslash, `$`, brace or non-ASCII
 * character, which may come out escaped), so a leak is found whatever quoting the output uses.
 */
import type { Lab } from '@shared/labs';

export type AnswerKind = 'hidden check' | 'reference rung' | 'reference title';

export interface AnswerMarker {
  lab: string;
  kind: AnswerKind;
  /** The text as the lab holds it. */
  text: string;
  /** What is searched for. */
  marker: string;
}

/** Shorter runs could occur by chance in unrelated text. */
export const MIN_MARKER_LENGTH = 12;

const VERBATIM = /[A-Za-z0-9 .,:;()/%+=?!&*<>#@_-]+/g;

/** The longest run of `text` that is copied verbatim into any string literal. */
export function markerOf(text: string): string {
  const runs = text.match(VERBATIM) ?? [];
  const longest = runs.reduce((best, run) => (run.trim().length > best.length ? run.trim() : best), '');
  if (longest.length < MIN_MARKER_LENGTH) throw new Error(`"${text}" has no run of ${MIN_MARKER_LENGTH} plain characters to search for; give it a longer label or comment`);
  return longest;
}

export interface MarkerOptions {
  /**
   * Leave out reference rungs that the lab's starter holds too (a student is given the starter,
   * so its rungs are no answer).
   */
  beyondStarter?: boolean;
}

/** Every hidden-check label and every reference rung of `labs`, with its marker. */
export function answerMarkers(labs: readonly Lab[], options: MarkerOptions = {}): AnswerMarker[] {
  const markers: AnswerMarker[] = [];
  const add = (lab: Lab, kind: AnswerKind, text: string) => markers.push({ lab: lab.id, kind, text, marker: markerOf(text) });
  for (const lab of labs) {
    for (const step of lab.script.steps) {
      if ('expect' in step && step.hidden) {
        if (!step.label) throw new Error(`${lab.id}: a hidden check without a label has nothing of its own to search for`);
        add(lab, 'hidden check', step.label);
      }
    }
    const starterComments = new Set(lab.starter.rungs.map((r) => r.comment));
    for (const rung of lab.solution.rungs) {
      if (options.beyondStarter && starterComments.has(rung.comment)) continue;
      add(lab, 'reference rung', rung.comment);
    }
    add(lab, 'reference title', lab.solution.title);
    add(lab, 'reference title', lab.solution.description);
  }
  return markers;
}

/** The markers `text` holds. */
export function answersIn(text: string, markers: readonly AnswerMarker[]): AnswerMarker[] {
  return markers.filter((m) => text.includes(m.marker));
}
