/** Lab 2: two-wire control from the maintained selector. Demo scenario. */
import { buildProgram, coil, nc, no, rung } from './build';
import { conveyorTags } from './conveyorTags';
import { brief, type Lab } from './lab';

const solution = buildProgram(
  'Two-wire control (reference)',
  'The belt follows the selector; the lamps follow the contactor auxiliary contact.',
  conveyorTags(),
  [
    rung('Two-wire: the belt runs while S4 is at RUN and S1 is not pressed', no('Stop_PB'), no('Run_Sel'), coil('K1_Coil')),
    rung('Green lamp shows what K1 really does (auxiliary contact), not what the program asks', no('K1_Aux'), coil('Green_Lamp')),
    rung('Red lamp while K1 is open', nc('K1_Aux'), coil('Red_Lamp')),
  ],
);

const starter = buildProgram(
  'Two-wire control',
  'Run the belt from the selector switch.',
  conveyorTags(),
  [rung('Starts the belt (but from which device?)', no('Fwd_PB'), coil('K1_Coil'))],
);

export const TWO_WIRE: Lab = {
  id: 'two-wire',
  order: 2,
  title: 'Two-wire control',
  summary: 'Run the belt from a maintained switch and see it restart by itself when power returns.',
  panel: 'reversing-conveyor',
  brief: brief(
    '# Two-wire control',
    '*Demo scenario — Larch Hollow Timber Co. (invented).* The sorting crew wants the infeed belt to run whenever the ' +
      'selector S4 is at RUN, like a plain on/off switch. Write **two-wire control**: K1 (%QX1) is on while S4 is at RUN ' +
      '(`Run_Sel`, %IX4) and the stop button S1 (`Stop_PB`, NC) is not pressed.',
    'Show the belt\'s real state: the green lamp P1 (%QX4) lit while K1 is actually closed, the red lamp P2 (%QX5) lit ' +
      'while it is open. Use K1\'s auxiliary contact (`K1_Aux`, %IX7), not the output bit: when the overload F1 trips, ' +
      'its 95-96 contact drops K1 although %QX1 stays ON.',
    'Press the emergency stop while the belt runs, then release it. A two-wire circuit restarts **by itself** the ' +
      'moment power returns — that is why two-wire control is kept for loads where a surprise restart is harmless.',
  ),
  starter,
  solution,
  script: {
    panel: 'reversing-conveyor',
    scanMs: 10,
    title: 'Two-wire control',
    steps: [
      { expect: { K1: 'open', P2: 'lit', P1: 'dark' }, label: 'at rest: K1 open, red lamp lit' },
      { set: 'S4', to: 'RUN' }, { wait: 700 },
      { expect: { K1: 'closed', M1: 'forward', P1: 'lit', P2: 'dark' }, label: 'selector at RUN runs the belt', points: 2 },
      { set: 'S4', to: 'JOG' }, { wait: 100 },
      { expect: { K1: 'open', '%QX1': false }, label: 'selector back at JOG stops it' },
      { set: 'S4', to: 'RUN' }, { wait: 700 },
      { press: 'S1' }, { wait: 100 },
      { expect: { K1: 'open' }, label: 'stop button opens the circuit while held' },
      { release: 'S1' }, { wait: 700 },
      { press: 'S0' }, { wait: 100 },
      { expect: { K1: 'open', '%IX4': false, P2: 'dark' }, label: 'e-stop: inputs dead, K1 open, even the red lamp is dark' },
      { release: 'S0' }, { wait: 700 },
      { expect: { K1: 'closed', M1: 'forward' }, label: 'two-wire control restarts by itself when the e-stop is released', points: 2 },
      { trip: 'F1' }, { wait: 100 },
      { expect: { K1: 'open', '%QX1': true, P1: 'dark' }, label: 'overload drops K1 while %QX1 stays ON; green lamp follows K1', hidden: true, points: 2 },
      { reset: 'F1' }, { wait: 700 },
      { expect: { K1: 'closed' }, label: 'after the overload reset a two-wire circuit recloses', hidden: true },
    ],
  },
};
