/**
 * The editor's side of the document size limits (`DOCUMENT_LIMITS`): an edit that would take the
 * program past one is not made, and the workbench says why. Rungs are measured once per rung object:
 * edits share the rungs they do not touch, so an edit costs only the rungs it changed, however big
 * the program.
 */
import { measureRung } from '@shared/ladder/bounds';
import { DOCUMENT_LIMITS, type Program, type Rung } from '@shared/ladder/schema';

/** Nodes of each rung already measured (and within the per-rung limits). */
const nodeCounts = new WeakMap<Rung, number>();

/** Why `doc` is past a size limit, as a sentence about the edit, or null when it is within them. */
export function editPastLimits(doc: Program): string | null {
  let total = 0;
  for (let i = 0; i < doc.rungs.length; i += 1) {
    const rung = doc.rungs[i]!;
    let nodes = nodeCounts.get(rung);
    if (nodes === undefined) {
      const measured = measureRung(rung, i);
      if (measured.problem) return `That change was not made: ${measured.problem.message}.`;
      nodes = measured.nodes;
      nodeCounts.set(rung, nodes);
    }
    total += nodes;
  }
  if (total > DOCUMENT_LIMITS.nodesPerProgram) {
    return `That change was not made: the program would have more than ${DOCUMENT_LIMITS.nodesPerProgram} elements and branches.`;
  }
  return null;
}
