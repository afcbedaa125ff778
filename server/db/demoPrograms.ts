/**
 * Demo programs for the Larch Hollow Timber Co. reversing conveyor (invented scenario, demo data).
 * Addresses follow the default `reversing-conveyor` panel layout in docs/names-and-rules.md.
 */
import { PROGRAM_FORMAT, PROGRAM_VERSION, type Element, type Program, type Tag } from '@shared/ladder/schema';
import { buildProgram, coil as labCoil, nc as labNc, no as labNo, par, rung } from '@shared/labs/build';
import { conveyorTags } from '@shared/labs/conveyorTags';

const no = (id: string, operand: string): Element => ({ kind: 'contact', id, variant: 'no', operand });
const nc = (id: string, operand: string): Element => ({ kind: 'contact', id, variant: 'nc', operand });
const coil = (id: string, operand: string): Element => ({ kind: 'coil', id, variant: 'coil', operand });

const CONVEYOR_TAGS: Tag[] = [
  { name: 'S1_Stop', address: '%IX1', comment: 'Stop, red, NC (reads TRUE at rest)' },
  { name: 'S2_Fwd', address: '%IX2', comment: 'Forward, green, NO' },
  { name: 'S3_Rev', address: '%IX3', comment: 'Reverse, black, NO' },
  { name: 'K1_Fwd', address: '%QX1', comment: 'Forward contactor coil' },
  { name: 'K2_Rev', address: '%QX2', comment: 'Reverse contactor coil' },
  { name: 'P2_Red', address: '%QX5', comment: 'Red lamp: stopped' },
];

function program(title: string, description: string, rungs: Program['rungs']): Program {
  return { format: PROGRAM_FORMAT, version: PROGRAM_VERSION, title, description, tags: CONVEYOR_TAGS, rungs };
}

/** Three-wire start/stop: the forward contactor seals itself in through its own output. */
export const THREE_WIRE_DEMO: Program = program(
  'Three-wire start/stop (demo)',
  'Demo: Larch Hollow Timber Co. conveyor, forward only. S1 is a normally closed button, so the NO contact on %IX1 passes power at rest.',
  [
    {
      id: 'r1',
      comment: 'Start forward; seal in; stop breaks the seal',
      network: { kind: 'series', id: 's1', items: [no('c1', 'S1_Stop'), { kind: 'parallel', id: 'p1', branches: [no('c2', 'S2_Fwd'), no('c3', 'K1_Fwd')] }, coil('q1', 'K1_Fwd')] },
    },
  ],
);

/** Forward/reverse with electrical interlocks and a red "stopped" lamp. */
export const REVERSING_DEMO: Program = program(
  'Forward/reverse with interlocks (demo)',
  'Demo: Larch Hollow Timber Co. reversing conveyor. Each direction is sealed in and blocked while the other runs.',
  [
    {
      id: 'r1',
      comment: 'Forward, interlocked against reverse',
      network: {
        kind: 'series',
        id: 's1',
        items: [no('c1', 'S1_Stop'), { kind: 'parallel', id: 'p1', branches: [no('c2', 'S2_Fwd'), no('c3', 'K1_Fwd')] }, nc('c4', 'K2_Rev'), coil('q1', 'K1_Fwd')],
      },
    },
    {
      id: 'r2',
      comment: 'Reverse, interlocked against forward',
      network: {
        kind: 'series',
        id: 's2',
        items: [no('c5', 'S1_Stop'), { kind: 'parallel', id: 'p2', branches: [no('c6', 'S3_Rev'), no('c7', 'K2_Rev')] }, nc('c8', 'K1_Fwd'), coil('q2', 'K2_Rev')],
      },
    },
    {
      id: 'r3',
      comment: 'Red lamp while neither direction runs',
      network: { kind: 'series', id: 's3', items: [nc('c9', 'K1_Fwd'), nc('c10', 'K2_Rev'), coil('q3', 'P2_Red')] },
    },
  ],
);

/**
 * A demo submission to the forward/reverse lab with the interlocks left out (demo data): each
 * direction seals in, but nothing stops both contactors being commanded at once.
 */
export const MISSING_INTERLOCK_DEMO: Program = buildProgram('Forward/reverse, no interlock (demo)', 'Demo: a first try at the Larch Hollow reversing conveyor that forgets the interlocks.', conveyorTags(), [
  rung('', labNo('Stop_PB'), par(labNo('Fwd_PB'), labNo('K1_Aux')), labCoil('K1_Coil')),
  rung('', labNo('Stop_PB'), par(labNo('Rev_PB'), labNo('K2_Aux')), labCoil('K2_Coil')),
  rung('', labNo('K1_Aux'), labCoil('Green_Lamp')),
  rung('', labNo('K2_Aux'), labCoil('Amber_Lamp')),
  rung('', labNc('K1_Aux'), labNc('K2_Aux'), labCoil('Red_Lamp')),
]);
