/**
 * A lab: one exercise of the course as data — a brief in Markdown, the panel it runs on, the
 * program a student starts from, the check script that grades it (visible and hidden checks) and
 * a reference solution that passes every check.
 */
import type { Program } from '../ladder/schema';
import type { CheckScriptInput } from '../checks/script';
import { SAFETY_CAUTION } from './safetyCaution';

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

/** Join the paragraphs of a brief and append the caution. */
export function brief(...paragraphs: string[]): string {
  return `${paragraphs.join('\n\n')}\n\n${SAFETY_CAUTION}\n`;
}
