/**
 * The palette's element factories: a new contact, coil or block with empty operands for the
 * student to fill in, and the instance name a new block gets. Placing the element in a rung is the
 * shared edits' job (`shared/ladder/edits.ts`).
 */
import { BLOCK_SPECS, operandInputs } from '@shared/ladder/blocks';
import type { BlockType, Element, Program } from '@shared/ladder/schema';
import { visitNodes } from '@shared/ladder/walk';
import type { PaletteItem } from './palette';

/** The smallest `T1`, `T2`… (or `C…`, `E…`, `B…`) instance name not yet used by a block of the program. */
export function freeInstanceName(program: Program, type: BlockType): string {
  const prefix = type.startsWith('T') ? 'T' : type.startsWith('C') ? 'C' : type.endsWith('TRIG') ? 'E' : 'B';
  const used = new Set<string>();
  for (const rung of program.rungs) {
    visitNodes(rung.network, (node) => {
      if (node.kind === 'block') used.add(node.instance.toUpperCase());
    });
  }
  for (let n = 1; ; n += 1) if (!used.has(`${prefix}${n}`)) return `${prefix}${n}`;
}

/** A new element for a palette item, with empty operands (a block's required inputs listed empty). */
export function createElement(item: PaletteItem, id: string, program: Program): Element {
  if (item.kind === 'contact') return { kind: 'contact', id, variant: item.variant, operand: '' };
  if (item.kind === 'coil') return { kind: 'coil', id, variant: item.variant, operand: '' };
  const required: readonly string[] = BLOCK_SPECS[item.type].required;
  const inputs = Object.fromEntries(operandInputs(item.type).filter((p) => required.includes(p.name)).map((p) => [p.name, '']));
  return { kind: 'block', id, type: item.type, instance: freeInstanceName(program, item.type), inputs };
}
