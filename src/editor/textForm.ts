/**
 * The one-line text form of each rung shown under it on the canvas (DESIGN.md: "every rung also
 * has a one-line text form, e.g. `S1 AND (S2 OR K1) -> K1`").
 */
import type { NetworkNode, Program } from '@shared/ladder/schema';

const CONTACT_TEXT = {
  no: (o: string) => o,
  nc: (o: string) => `NOT ${o}`,
  rising: (o: string) => `RISING ${o}`,
  falling: (o: string) => `FALLING ${o}`,
} as const;

const COIL_TEXT = {
  coil: (o: string) => o,
  negated: (o: string) => `NOT ${o}`,
  set: (o: string) => `SET ${o}`,
  reset: (o: string) => `RESET ${o}`,
} as const;

const blank = (operand: string) => (operand.trim() === '' ? '?' : operand.trim());

/** The condition a node puts on power flow, in words; coils are collected apart. */
function condition(node: NetworkNode, outputs: string[]): string {
  switch (node.kind) {
    case 'contact':
      return CONTACT_TEXT[node.variant](blank(node.operand));
    case 'coil':
      outputs.push(COIL_TEXT[node.variant](blank(node.operand)));
      return '';
    case 'block':
      outputs.push(`${node.instance || '?'}:${node.type}`);
      return '';
    case 'series': {
      const parts = node.items.map((item) => condition(item, outputs)).filter((p) => p !== '');
      return parts.join(' AND ');
    }
    case 'parallel': {
      const parts = node.branches.map((branch) => condition(branch, outputs) || 'TRUE');
      return parts.length > 1 ? `(${parts.join(' OR ')})` : (parts[0] ?? '');
    }
  }
}

/** One rung as text. */
export function rungText(network: NetworkNode): string {
  const outputs: string[] = [];
  const when = condition(network, outputs) || 'TRUE';
  return outputs.length === 0 ? when : `${when} -> ${outputs.join(', ')}`;
}

/** Rung id → its text form, for every rung. */
export function rungTextMap(program: Program): Map<string, string> {
  return new Map(program.rungs.map((rung) => [rung.id, rungText(rung.network)]));
}
