/**
 * Power flow through a network as a boolean expression, shared by the one-line text form and the
 * Structured Text rendering. Semantics follow IEC 61131-3 ladder evaluation (clause 8.2 [memory]):
 * a series ANDs, a parallel ORs its branches, a contact ANDs its test onto the state on its left,
 * a coil passes the state on unchanged (and writes it), and a block's power-flow output replaces
 * the state (its input takes the state on its left). The style decides how each element prints.
 */
import type { Block, Coil, Contact, NetworkNode, Series } from './schema';
import { outputTailStart } from './shape';

/** A boolean expression over operand terms. */
export type Expr =
  | { kind: 'true' }
  | { kind: 'term'; text: string }
  | { kind: 'and'; items: Expr[] }
  | { kind: 'or'; items: Expr[] };

export const TRUE_EXPR: Expr = { kind: 'true' };

export const term = (text: string): Expr => ({ kind: 'term', text });

/** `a AND b`, flattening nested ANDs and dropping a TRUE (the left rail). */
export function and(a: Expr, b: Expr): Expr {
  if (a.kind === 'true') return b;
  if (b.kind === 'true') return a;
  const items = [...(a.kind === 'and' ? a.items : [a]), ...(b.kind === 'and' ? b.items : [b])];
  return { kind: 'and', items };
}

/** `a OR b OR …`; a single branch is itself. */
export function or(items: Expr[]): Expr {
  if (items.length === 1) return items[0]!;
  return { kind: 'or', items: items.flatMap((e) => (e.kind === 'or' ? e.items : [e])) };
}

/**
 * Print with the usual precedence (NOT > AND > OR): an OR inside an AND gets parentheses. With
 * `groupOr`, every OR does, so a parallel branch always reads as one group (the text form).
 */
export function printExpr(expr: Expr, groupOr = false, insideAnd = false): string {
  switch (expr.kind) {
    case 'true':
      return 'TRUE';
    case 'term':
      return expr.text;
    case 'and':
      return expr.items.map((e) => printExpr(e, groupOr, true)).join(' AND ');
    case 'or': {
      const text = expr.items.map((e) => printExpr(e, groupOr, false)).join(' OR ');
      return insideAnd || groupOr ? `(${text})` : text;
    }
  }
}

/** True when printing needs an operator (used to decide on parentheses and temporaries). */
export function isCompound(expr: Expr): boolean {
  return expr.kind === 'and' || expr.kind === 'or';
}

/** How a renderer prints elements; it may also record statements on the side (ST does). */
export interface FlowStyle {
  /** The test a contact ANDs onto the flow. */
  contact(contact: Contact): Expr;
  /** A block fed by `input`; returns the expression of its power-flow output. */
  block(block: Block, input: Expr): Expr;
  /** A coil reached by `input` where the rung goes on after it (not in the output tail). */
  midCoil(coil: Coil, input: Expr): void;
}

/** Blocks and coils need the real input (a block's call, a coil's write), so they stop factoring. */
function needsInput(node: NetworkNode): boolean {
  if (node.kind === 'block' || node.kind === 'coil') return true;
  if (node.kind === 'series') return node.items.some(needsInput);
  if (node.kind === 'parallel') return node.branches.some(needsInput);
  return false;
}

/** The flow leaving `node` when `input` enters it. */
export function flowThrough(node: NetworkNode, input: Expr, style: FlowStyle): Expr {
  switch (node.kind) {
    case 'contact':
      return and(input, style.contact(node));
    case 'coil':
      style.midCoil(node, input);
      return input;
    case 'block':
      return style.block(node, input);
    case 'series':
      return flowThroughItems(node.items, input, style);
    case 'parallel': {
      if (node.branches.length === 0) return input;
      // Without blocks the input factors out: `S1 AND (S2 OR K1)`. A block's output does not carry
      // its input, so branches holding blocks each take the input themselves.
      if (!node.branches.some(needsInput)) {
        return and(input, or(node.branches.map((b) => flowThrough(b, TRUE_EXPR, style))));
      }
      return or(node.branches.map((b) => flowThrough(b, input, style)));
    }
  }
}

/** The flow leaving a run of series items. */
export function flowThroughItems(items: readonly NetworkNode[], input: Expr, style: FlowStyle): Expr {
  return items.reduce((flow, item) => flowThrough(item, flow, style), input);
}

/** A series split into the part that computes the flow and the output tail it drives. */
export function splitOutputs(series: Series): { body: NetworkNode[]; outputs: NetworkNode[] } {
  const start = outputTailStart(series);
  return { body: series.items.slice(0, start), outputs: series.items.slice(start) };
}
