/** Lab 4: jog / run with the selector. Demo scenario. */
import { buildProgram, coil, nc, no, par, rung, ser } from './build';
import { conveyorTags } from './conveyorTags';
import { brief, type Lab } from './lab';
import { pulse } from './steps';
import { threeWireRungs } from './threeWire';

const solution = buildProgram('Jog / run (reference)', 'The seal-in only counts at RUN.', conveyorTags(), [
  rung('At RUN the auxiliary contact seals in; at JOG the seal branch is open, so the belt runs only while S2 is held', no('Stop_PB'), par(no('Fwd_PB'), ser(no('K1_Aux'), no('Run_Sel'))), coil('K1_Coil')),
  rung('Green lamp while K1 is closed', no('K1_Aux'), coil('Green_Lamp')),
  rung('Red lamp while K1 is open', nc('K1_Aux'), coil('Red_Lamp')),
]);

const starter = buildProgram('Jog / run', 'Three-wire control; add jogging at JOG.', conveyorTags(), threeWireRungs());

export const JOG_RUN: Lab = {
  id: 'jog-run',
  order: 4,
  title: 'Jog and run with the selector',
  summary: 'At JOG the belt moves only while S2 is held; at RUN it seals in.',
  panel: 'reversing-conveyor',
  brief: brief(
    '# Jog and run',
    '*Demo scenario — Larch Hollow Timber Co. (invented).* To line up a board with the planer, the operator needs to ' +
      'inch the belt forward. With the selector S4 at **JOG** (`Run_Sel` FALSE) the belt runs only while S2 is held; ' +
      'at **RUN** (`Run_Sel` TRUE) S2 starts it and it seals in as in the three-wire lab. S1 stops it in both positions.',
    'Jogging must defeat the holding contact: put the selector in the seal-in branch, not in the start branch. ' +
      'Turning S4 from RUN to JOG while the belt runs breaks the seal and stops it.',
  ),
  starter,
  solution,
  script: {
    panel: 'reversing-conveyor',
    scanMs: 10,
    title: 'Jog and run',
    steps: [
      { press: 'S2' }, { wait: 100 },
      { expect: { K1: 'closed' }, label: 'at JOG, S2 runs the belt while held' },
      { release: 'S2' }, { wait: 100 },
      { expect: { K1: 'open', '%QX1': false }, label: 'at JOG the belt stops as soon as S2 is released', points: 2 },
      { set: 'S4', to: 'RUN' },
      ...pulse('S2', 100, 700),
      { expect: { K1: 'closed', M1: 'forward' }, label: 'at RUN, S2 starts the belt and it seals in', points: 2 },
      ...pulse('S1'),
      { expect: { K1: 'open' }, label: 'S1 stops it at RUN' },
      ...pulse('S2', 100, 700),
      { set: 'S4', to: 'JOG' }, { wait: 100 },
      { expect: { K1: 'open', '%QX1': false }, label: 'turning to JOG breaks the seal-in', hidden: true },
      { press: 'S2' }, { wait: 100 }, { press: 'S1' }, { wait: 100 },
      { expect: { K1: 'open' }, label: 'S1 stops a jog too', hidden: true },
      { release: 'S1' }, { release: 'S2' }, { set: 'S4', to: 'RUN' },
      ...pulse('S2', 100, 700),
      { press: 'S0' }, { wait: 100 }, { release: 'S0' }, { wait: 700 },
      { expect: { K1: 'open', '%QX1': false }, label: 'after an e-stop the belt stays stopped at RUN', hidden: true },
    ],
  },
};
