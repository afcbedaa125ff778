/** Small hand-built programs for the editor tests (demo data, invented). */
import type { Block, Coil, Contact, NetworkNode, Parallel, Program, Rung, Series } from '@shared/ladder/schema';

export const no = (id: string, operand = ''): Contact => ({ kind: 'contact', id, variant: 'no', operand });
export const nc = (id: string, operand = ''): Contact => ({ kind: 'contact', id, variant: 'nc', operand });
export const coil = (id: string, operand = ''): Coil => ({ kind: 'coil', id, variant: 'coil', operand });
export const ton = (id: string, instance = 'T1', pt = 'T#2s'): Block => ({
  kind: 'block',
  id,
  type: 'TON',
  instance,
  inputs: { PT: pt },
});
export const series = (id: string, ...items: NetworkNode[]): Series => ({ kind: 'series', id, items });
export const parallel = (id: string, ...branches: NetworkNode[]): Parallel => ({ kind: 'parallel', id, branches });
export const rung = (id: string, network: Series, comment = ''): Rung => ({ id, comment, network });

export function program(rungs: Rung[], tags: Program['tags'] = []): Program {
  return { format: 'rungwright.program', version: 1, title: 'Demo', description: '', tags, rungs };
}

/**
 * The three-wire start/stop rung of the demo conveyor: stop S1 (NC at rest, examined by a NO
 * contact), start S2 in parallel with the seal-in contact K1, driving K1.
 */
export function threeWire(): Program {
  return program(
    [
      rung(
        'r1',
        series('r1n', no('stop', 'S1'), parallel('p1', series('b1', no('start', 'S2')), series('b2', no('seal', '%QX1'))), coil('k1', '%QX1')),
        'Three-wire start/stop with seal-in',
      ),
    ],
    [
      { name: 'S1', address: '%IX1', comment: 'stop, NC' },
      { name: 'S2', address: '%IX2', comment: 'forward' },
      { name: 'K1', address: '%QX1', comment: 'forward contactor' },
    ],
  );
}
