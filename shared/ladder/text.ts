/**
 * The one-line text form of a rung, for screen readers, learning and diffs:
 * `S1 AND (S2 OR K1) AND NOT K2 -> K1`. Contacts read `S1`, `NOT S1`, `RISING S2`, `FALLING S2`;
 * coils `-> K1`, `-> NOT K1`, `-> SET K1`, `-> RESET K1`; several outputs `-> K1, P1`; a final
 * branch with its own conditions `-> K1, (S3 -> P1)`; a block
 * `TON T1(IN := S2, PT := T#3s) -> H1` (its power-flow input is left out when it comes straight
 * from the rail or the shared part of the rung). A coil in the middle of a rung (a shape error)
 * splits the text at `;`.
 */
import { BLOCK_SPECS } from './blocks';
import { flowThroughItems, printExpr, splitOutputs, term, TRUE_EXPR, type FlowStyle } from './flow';
import { createNameView, type NameView } from './names';
import type { Block, Coil, Contact, NetworkNode, Program, Rung, Series } from './schema';

const CONTACT_PREFIX = { no: '', nc: 'NOT ', rising: 'RISING ', falling: 'FALLING ' } as const satisfies Record<
  Contact['variant'],
  string
>;
const COIL_PREFIX = { coil: '', negated: 'NOT ', set: 'SET ', reset: 'RESET ', positive: 'RISING ', negative: 'FALLING ' } as const satisfies Record<Coil['variant'], string>;

function coilText(coil: Coil, names: NameView): string {
  return `${COIL_PREFIX[coil.variant]}${names.display(coil.operand)}`;
}

/** `TON T1(IN := S2, PT := T#3s)`: inputs in the standard's order, then any unknown ones. */
export function blockCallText(block: Block, powerInput: string | null, display: (text: string) => string): string {
  const spec = BLOCK_SPECS[block.type];
  const args: string[] = [];
  if (powerInput !== null) args.push(`${spec.powerIn} := ${powerInput}`);
  const known = spec.inputs.map((p) => p.name).filter((name) => name !== spec.powerIn);
  const extra = Object.keys(block.inputs).filter((name) => !known.includes(name)).sort();
  for (const name of [...known, ...extra]) {
    const value = block.inputs[name]?.trim() ?? '';
    if (value !== '') args.push(`${name} := ${display(value)}`);
  }
  return `${block.type} ${block.instance.trim() || '?'}(${args.join(', ')})`;
}

function seriesText(items: readonly NetworkNode[], names: NameView): string {
  const sideWrites: string[] = [];
  const style: FlowStyle = {
    contact: (contact) => term(`${CONTACT_PREFIX[contact.variant]}${names.display(contact.operand)}`),
    block: (block, input) =>
      term(blockCallText(block, input.kind === 'true' ? null : printExpr(input, true), (t) => names.display(t))),
    midCoil: (coil, input) => sideWrites.push(`${printExpr(input, true)} -> ${coilText(coil, names)}`),
  };
  const series: Series = { kind: 'series', id: '', items: [...items] };
  const { body, outputs } = splitOutputs(series);
  const flow = flowThroughItems(body, TRUE_EXPR, style);
  let main: string;
  if (outputs.length === 0) main = printExpr(flow, true);
  else main = `${printExpr(flow, true)} -> ${outputs.flatMap((o) => outputTexts(o, names)).join(', ')}`;
  return [...sideWrites, main].join('; ');
}

function outputTexts(node: NetworkNode, names: NameView): string[] {
  if (node.kind === 'coil') return [coilText(node, names)];
  if (node.kind === 'parallel') return node.branches.map((branch) => branchText(branch, names));
  return [seriesText([node], names)];
}

function branchText(branch: NetworkNode, names: NameView): string {
  if (branch.kind === 'coil') return coilText(branch, names);
  if (branch.kind === 'block') return seriesText([branch], names);
  const items = branch.kind === 'series' ? branch.items : [branch];
  return `(${seriesText(items, names)})`;
}

/** The text form of one rung, with the program's tag names. */
export function rungText(rung: Rung, program: Program | NameView): string {
  const names = 'display' in program ? program : createNameView(program);
  if (rung.network.items.length === 0) return '(empty rung)';
  return seriesText(rung.network.items, names);
}

/** One line per rung, numbered from 1: `1: S1 AND (S2 OR K1) -> K1`. */
export function programText(program: Program): string {
  const names = createNameView(program);
  return program.rungs.map((rung, index) => `${index + 1}: ${rungText(rung, names)}`).join('\n');
}
