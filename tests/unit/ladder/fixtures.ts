/**
 * Small programs for the ladder tests. Demo data: the Larch Hollow Timber Co. reversing conveyor
 * (an invented scenario).
 */
import type { Block, Coil, Contact, Element, NetworkNode, Parallel, Program, Rung, Series, Tag } from '@shared/ladder/schema';

export const no = (id: string, operand: string): Contact => ({ kind: 'contact', id, variant: 'no', operand });
export const nc = (id: string, operand: string): Contact => ({ kind: 'contact', id, variant: 'nc', operand });
export const rising = (id: string, operand: string): Contact => ({ kind: 'contact', id, variant: 'rising', operand });
export const falling = (id: string, operand: string): Contact => ({ kind: 'contact', id, variant: 'falling', operand });
export const coil = (id: string, operand: string, variant: Coil['variant'] = 'coil'): Coil => ({
  kind: 'coil',
  id,
  variant,
  operand,
});
export const block = (id: string, type: Block['type'], instance: string, inputs: Record<string, string> = {}): Block => ({
  kind: 'block',
  id,
  type,
  instance,
  inputs,
});
export const series = (id: string, ...items: NetworkNode[]): Series => ({ kind: 'series', id, items });
export const parallel = (id: string, ...branches: NetworkNode[]): Parallel => ({ kind: 'parallel', id, branches });
export const rung = (id: string, ...items: NetworkNode[]): Rung => ({ id, comment: '', network: series(`${id}-net`, ...items) });
export const tag = (name: string, address: string, comment = ''): Tag => ({ name, address, comment });

export function program(rungs: Rung[], tags: Tag[] = []): Program {
  return { format: 'rungwright.program', version: 1, title: 'Demo: Larch Hollow conveyor', description: '', tags, rungs };
}

/** The demo tags of the reversing-conveyor panel (docs/names-and-rules.md). */
export const CONVEYOR_TAGS: Tag[] = [
  tag('S1', '%IX1', 'stop, NC'),
  tag('S2', '%IX2', 'forward'),
  tag('S3', '%IX3', 'reverse'),
  tag('S4', '%IX4', 'JOG/RUN'),
  tag('B1', '%IX5', 'photo-eye'),
  tag('K1', '%QX1', 'forward contactor'),
  tag('K2', '%QX2', 'reverse contactor'),
  tag('H1', '%QX3', 'warning horn'),
  tag('P1', '%QX4', 'green lamp'),
];

/** Three-wire forward start with the reverse interlock: `S1 AND (S2 OR K1) AND NOT K2 -> K1`. */
export function threeWireForward(): Program {
  return program(
    [rung('r1', no('c1', 'S1'), parallel('p1', no('c2', 'S2'), no('c3', 'K1')), nc('c4', 'K2'), coil('k1', 'K1'))],
    CONVEYOR_TAGS,
  );
}

export function elementIds(node: NetworkNode): string[] {
  const own: Element[] = [];
  const collect = (n: NetworkNode): void => {
    if (n.kind === 'series') n.items.forEach(collect);
    else if (n.kind === 'parallel') n.branches.forEach(collect);
    else own.push(n);
  };
  collect(node);
  return own.map((e) => e.id);
}
