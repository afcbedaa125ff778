/**
 * The programs the proof benchmark decides, in Node and in Chromium alike: for each standard lab,
 * its reference solution and every typical wrong answer (tests/unit/labs/mistakes.ts), each with
 * the lab's safety properties (tests/unit/proof/labProperties.ts), once each.
 */
import { standardLab, STANDARD_LABS } from '@shared/labs';
import type { Program } from '@shared/ladder/schema';
import type { Property } from '@shared/proof';
import { MISTAKES } from '../unit/labs/mistakes';
import { LAB_CASES } from '../unit/proof/labProperties';

export interface ProofCase {
  lab: string;
  /** `reference`, or the wrong answer's name. */
  name: string;
  program: Program;
  properties: Property[];
}

export function proofCases(): ProofCase[] {
  const cases: ProofCase[] = [];
  for (const lab of STANDARD_LABS) {
    const properties = LAB_CASES.filter((c) => c.lab === lab.id).flatMap((c) => c.properties);
    const unique = [...new Map(properties.map((p) => [JSON.stringify(p), p])).values()];
    const programs: [string, Program][] = [['reference', standardLab(lab.id)!.solution], ...MISTAKES.filter((m) => m.lab === lab.id).map((m): [string, Program] => [m.name, m.program])];
    for (const [name, program] of programs) cases.push({ lab: lab.id, name, program, properties: unique });
  }
  return cases;
}

/** `io-checkout reference`: the key that matches a case in Node with the same case in the page. */
export const caseKey = (c: Pick<ProofCase, 'lab' | 'name'>): string => `${c.lab} ${c.name}`;
