/** Lab 3: three-wire start/stop with a seal-in contact. Demo scenario. */
import { buildProgram, coil, nc, no, par, rung } from './build';
import { conveyorTags } from './conveyorTags';
import { brief, type Lab } from './lab';
import { pulse } from './steps';

/** The three-wire rungs, reused by later labs' starters. */
export function threeWireRungs() {
  return [
    rung('Three-wire: stop (NC, TRUE at rest) in series with start, sealed in by K1\'s auxiliary contact', no('Stop_PB'), par(no('Fwd_PB'), no('K1_Aux')), coil('K1_Coil')),
    rung('Green lamp while K1 is closed', no('K1_Aux'), coil('Green_Lamp')),
    rung('Red lamp while K1 is open', nc('K1_Aux'), coil('Red_Lamp')),
  ];
}

const solution = buildProgram('Three-wire start/stop (reference)', 'Start, stop and a seal-in on the auxiliary contact.', conveyorTags(), threeWireRungs());

const starter = buildProgram('Three-wire start/stop', 'Make the belt keep running after S2 is released.', conveyorTags(), [
  rung('Runs only while S2 is held', no('Fwd_PB'), coil('K1_Coil')),
]);

export const THREE_WIRE: Lab = {
  id: 'three-wire',
  order: 3,
  title: 'Three-wire start/stop with a seal-in',
  summary: 'Start with S2, stop with S1, seal in on the contactor\'s auxiliary contact, and stay stopped after power returns.',
  panel: 'reversing-conveyor',
  brief: brief(
    '# Three-wire start/stop',
    '*Demo scenario — Larch Hollow Timber Co. (invented).* The infeed belt must start with the green button S2 and ' +
      'keep running after it is released, until the red stop button S1 is pressed. This is **three-wire control**: ' +
      'stop in series with start, and a holding (seal-in) contact in parallel with start.',
    'Seal in on K1\'s auxiliary contact (`K1_Aux`, %IX7), which reports what the contactor really does. When the ' +
      'overload F1 trips, its 95-96 contact drops K1 whatever the program says; the auxiliary contact opens, the seal ' +
      'breaks, and the belt stays stopped after F1 is reset. A seal-in on the output bit %QX1 would not notice.',
    'Lamps: green P1 while K1 is closed, red P2 while it is open. After an emergency stop the belt must **not** ' +
      'restart by itself when S0 is released (ISO 13850: the reset must not restart the machine).',
  ),
  starter,
  solution,
  script: {
    panel: 'reversing-conveyor',
    scanMs: 10,
    title: 'Three-wire start/stop',
    steps: [
      { expect: { K1: 'open', P2: 'lit', '%IX1': true }, label: 'at rest: NC stop reads TRUE, K1 open, red lamp lit' },
      ...pulse('S2', 100, 700),
      { expect: { K1: 'closed', M1: 'forward', P1: 'lit', P2: 'dark' }, label: 'S2 starts the belt and it stays sealed in after release', points: 2 },
      ...pulse('S1'),
      { expect: { K1: 'open', '%QX1': false }, label: 'S1 stops it' },
      ...pulse('S2', 100, 700),
      { press: 'S0' }, { wait: 100 },
      { expect: { K1: 'open', '%IX7': false }, label: 'the e-stop drops K1' },
      { release: 'S0' }, { wait: 1000 },
      { expect: { K1: 'open', '%QX1': false, M1: 'stopped' }, label: 'releasing the e-stop does not restart the belt', points: 2 },
      ...pulse('S2', 100, 700),
      { trip: 'F1' }, { wait: 100 },
      { expect: { K1: 'open', '%IX7': false, '%IX6': true }, label: 'an overload trip drops K1 and the auxiliary input falls', hidden: true },
      { reset: 'F1' }, { wait: 700 },
      { expect: { K1: 'open', '%QX1': false }, label: 'after the overload reset the belt stays stopped', hidden: true, points: 2 },
      ...pulse('S2', 100, 700),
      { expect: { K1: 'closed' }, label: 'it starts again with S2 after the reset', hidden: true },
      // A controller power loss drops K1 (its output opens); on the warm restart a seal-in on a
      // retained bit would restart the belt by itself, one on K1_Aux or a plain bit does not.
      { power: 'off' }, { wait: 500 }, { power: 'on' }, { wait: 1000 },
      { expect: { K1: 'open', M1: 'stopped', '%QX1': false }, label: 'after a power loss of the controller the belt stays stopped', hidden: true, points: 2 },
    ],
  },
};
