/**
 * The default panel layout `reversing-conveyor` (docs/names-and-rules.md): the reversible belt conveyor at the
 * Larch Hollow Timber Co. — a demo scenario, invented data.
 *
 * S0 is hardwired ahead of both commons (11-12 on the input common, 21-22 on the output common);
 * both contactor coils run through F1 95-96; K1 and K2 feed M1 forward and reverse and are
 * mechanically interlocked (R1; IEC 81346-2 class R "restricting" [memory]).
 * M1: 1/2 hp, 208 V three-phase, FLA 2.4 A (NEC Table 430.250, value from memory); F1 class 10 set
 * to FLA. Contactor pick-up 25 ms and drop-out 15 ms (typical, from memory).
 */
import type { PanelLayoutInput } from '../layout';

/** M1's full-load current in A: NEC Table 430.250, 1/2 hp at 208 V (value from memory). */
export const CONVEYOR_FLA_A = 2.4;

export const REVERSING_CONVEYOR_INPUT = {
  format: 'rungwright.panel',
  version: 1,
  id: 'reversing-conveyor',
  title: 'Reversing conveyor (demo: Larch Hollow Timber Co.)',
  description:
    'Demo scenario, invented: the reversible infeed belt at the Larch Hollow Timber Co. planer mill. ' +
    'Forward carries boards to the planer; reverse backs a jammed board out. The emergency stop S0 is ' +
    'hardwired ahead of the input and output commons; the overload F1 sits in series with both contactor coils.',
  inputs: 8,
  outputs: 6,
  devices: [
    { id: 'S0', kind: 'estop', label: 'Emergency stop', params: {} },
    { id: 'S1', kind: 'pushbutton', label: 'Stop', params: { form: 'NC', colour: 'red' }, feeds: '%IX1' },
    { id: 'S2', kind: 'pushbutton', label: 'Forward', params: { form: 'NO', colour: 'green' }, feeds: '%IX2' },
    { id: 'S3', kind: 'pushbutton', label: 'Reverse', params: { form: 'NO', colour: 'black' }, feeds: '%IX3' },
    { id: 'S4', kind: 'selector', label: 'Jog / Run', params: { positions: ['JOG', 'RUN'], initial: 'JOG' }, feeds: '%IX4', contact: 'RUN' },
    { id: 'B1', kind: 'photoeye', label: 'Photo-eye at the belt end', params: { closesWhen: 'blocked' }, feeds: '%IX5' },
    { id: 'F1', kind: 'overload', label: 'Motor overload', params: { settingA: CONVEYOR_FLA_A, tripClass: '10', motor: 'M1' }, feeds: '%IX6', contact: '97-98' },
    {
      id: 'K1', kind: 'contactor', label: 'Forward contactor', params: { pickUpMs: 25, dropOutMs: 15 },
      feeds: '%IX7', contact: '13-14', drivenBy: '%QX1', through: [{ device: 'F1', contact: '95-96' }],
    },
    {
      id: 'K2', kind: 'contactor', label: 'Reverse contactor', params: { pickUpMs: 25, dropOutMs: 15 },
      feeds: '%IX8', contact: '13-14', drivenBy: '%QX2', through: [{ device: 'F1', contact: '95-96' }],
    },
    { id: 'R1', kind: 'interlock', label: 'Mechanical interlock K1-K2', params: { contactors: ['K1', 'K2'] } },
    { id: 'H1', kind: 'horn', label: 'Warning horn', params: {}, drivenBy: '%QX3' },
    { id: 'P1', kind: 'lamp', label: 'Green lamp', params: { colour: 'green' }, drivenBy: '%QX4' },
    { id: 'P2', kind: 'lamp', label: 'Red lamp', params: { colour: 'red' }, drivenBy: '%QX5' },
    { id: 'P3', kind: 'lamp', label: 'Amber lamp', params: { colour: 'yellow' }, drivenBy: '%QX6' },
    {
      id: 'M1', kind: 'motor', label: 'Conveyor motor, 1/2 hp 208 V',
      params: {
        flaA: CONVEYOR_FLA_A, hp: 0.5, volts: 208,
        feeders: [{ contactor: 'K1', direction: 'forward' }, { contactor: 'K2', direction: 'reverse' }],
      },
    },
  ],
  inputCommon: [{ device: 'S0', contact: '11-12' }],
  outputCommon: [{ device: 'S0', contact: '21-22' }],
} as const satisfies PanelLayoutInput;
