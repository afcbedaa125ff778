/**
 * Small builders for hand-written test programs, and the equivalence the PLCopen round trip
 * promises: same rungs (ids, comments, elements in the same series-parallel shape), same tags.
 * Series and parallel nodes get fresh ids on import (TC6 has no element for them), so they are
 * compared by shape only.
 */
import { PROGRAM_FORMAT, PROGRAM_VERSION } from '@shared/ladder/schema';
import type {
  Block,
  BlockType,
  Coil,
  CoilVariant,
  Contact,
  ContactVariant,
  NetworkNode,
  Parallel,
  Program,
  Rung,
  Series,
  Tag,
} from '@shared/ladder/schema';

/** Builders that number ids in order of creation, so a test reads like the rung it draws. */
export function createBuilders() {
  let n = 0;
  const next = (prefix: string): string => `${prefix}${(n += 1)}`;
  return {
    no: (operand: string): Contact => ({ kind: 'contact', id: next('c'), variant: 'no', operand }),
    nc: (operand: string): Contact => ({ kind: 'contact', id: next('c'), variant: 'nc', operand }),
    contact: (variant: ContactVariant, operand: string): Contact => ({ kind: 'contact', id: next('c'), variant, operand }),
    coil: (operand: string, variant: CoilVariant = 'coil'): Coil => ({ kind: 'coil', id: next('k'), variant, operand }),
    block: (type: BlockType, instance: string, inputs: Record<string, string> = {}): Block => ({
      kind: 'block',
      id: next('b'),
      type,
      instance,
      inputs,
    }),
    series: (...items: NetworkNode[]): Series => ({ kind: 'series', id: next('s'), items }),
    parallel: (...branches: NetworkNode[]): Parallel => ({ kind: 'parallel', id: next('p'), branches }),
    rung: (comment: string, ...items: NetworkNode[]): Rung => ({
      id: next('r'),
      comment,
      network: { kind: 'series', id: next('s'), items },
    }),
  };
}

/** A whole program document. */
export function program(rungs: Rung[], tags: Tag[] = [], title = 'Test program', description = ''): Program {
  return { format: PROGRAM_FORMAT, version: PROGRAM_VERSION, title, description, tags, rungs };
}

type Shape =
  | { kind: 'series'; items: Shape[] }
  | { kind: 'parallel'; branches: Shape[] }
  | Exclude<NetworkNode, Series | Parallel>;

/** A network without the ids of its series and parallel nodes. */
export function shapeOf(node: NetworkNode): Shape {
  if (node.kind === 'series') return { kind: 'series', items: node.items.map(shapeOf) };
  if (node.kind === 'parallel') return { kind: 'parallel', branches: node.branches.map(shapeOf) };
  return node;
}

/** What the round trip keeps: everything but series/parallel ids. */
export function comparable(p: Program): unknown {
  return {
    ...p,
    rungs: p.rungs.map((rung) => ({ ...rung, network: shapeOf(rung.network) })),
  };
}

/**
 * An order-free form: branches of a parallel sorted, ids dropped. Two networks with the same
 * canonical form compute the same function, whatever the order of branches a file lists.
 */
export function canonical(node: NetworkNode): string {
  if (node.kind === 'series') return `S(${node.items.map(canonical).join(' ')})`;
  if (node.kind === 'parallel') return `P(${node.branches.map(canonical).sort().join(' | ')})`;
  if (node.kind === 'block') return `${node.type}:${node.instance}${JSON.stringify(node.inputs)}`;
  return `${node.kind}:${node.variant}:${node.operand}`;
}
