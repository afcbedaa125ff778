/**
 * What a printed program or submission says about itself: who, which class and lab, which version,
 * when; then the tags and the rungs (as drawn, and each as its one-line text form). Pure, so the
 * wording is tested without a browser.
 */
import { rungText, type Program } from '@shared/ladder';

export interface PrintFacts {
  title: string;
  student: string | null;
  className: string | null;
  lab: string | null;
  version: number | null;
  /** When the version was saved or submitted (ISO). */
  savedAt: string | null;
  /** When the sheet was printed (ISO). */
  printedAt: string;
}

/** The header's lines, label and value, leaving out what is unknown. */
export function factLines(facts: PrintFacts, when: (iso: string) => string): { label: string; value: string }[] {
  const lines: { label: string; value: string }[] = [];
  if (facts.student) lines.push({ label: 'Student', value: facts.student });
  if (facts.className) lines.push({ label: 'Class', value: facts.className });
  if (facts.lab) lines.push({ label: 'Lab', value: facts.lab });
  if (facts.version !== null) lines.push({ label: 'Version', value: `${facts.version}${facts.savedAt ? `, saved ${when(facts.savedAt)}` : ''}` });
  lines.push({ label: 'Printed', value: when(facts.printedAt) });
  return lines;
}

/** Each rung's number, comment and text form (`S1 AND (S2 OR K1) -> K1`). */
export function rungLines(program: Program): { number: number; comment: string; text: string }[] {
  return program.rungs.map((rung, i) => ({ number: i + 1, comment: rung.comment, text: rungText(rung, program) }));
}
