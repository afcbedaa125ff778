/**
 * A lab: one exercise of the course as data — a brief in Markdown, the panel it runs on, the
 * program a student starts from, the check script that grades it (visible and hidden checks) and
 * a reference solution that passes every check.
 */
import type { Program } from '../ladder/schema';
import type { CheckScriptInput } from '../checks/script';

export interface Lab {
  /** Stable id, e.g. `three-wire`. */
  id: string;
  /** Position in the course, from 1. */
  order: number;
  title: string;
  /** One sentence for a lab list. */
  summary: string;
  /** The brief in Markdown, ending with the safety caution. */
  brief: string;
  /** The panel layout id. */
  panel: string;
  starter: Program;
  script: CheckScriptInput;
  solution: Program;
}

/**
 * The caution every lab shows (DESIGN.md "Safety cautions"): one plain line and the standards.
 */
export const SAFETY_CAUTION = [
  '> **Safety.** A simulator does not replace lockout/tagout. On a real panel, de-energise and lock out / tag out',
  '> (OSHA 29 CFR 1910.147, CSA Z460), work to NFPA 70E / CSA Z462, keep the emergency stop hardwired and never rely on',
  '> a PLC program for it (NFPA 79, IEC 60204-1, ISO 13850), clear and stop a controller\'s program before powering it',
  '> on a panel, and defer to local codes and licensed practice.',
].join('\n');

/** Join the paragraphs of a brief and append the caution. */
export function brief(...paragraphs: string[]): string {
  return `${paragraphs.join('\n\n')}\n\n${SAFETY_CAUTION}\n`;
}
