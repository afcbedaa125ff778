/** Lab 5: forward / reverse with electrical interlocking and auxiliary-contact feedback. Demo scenario. */
import { buildProgram, coil, nc, no, par, rung } from './build';
import { conveyorTags } from './conveyorTags';
import { brief, type Lab } from './lab';
import { pulse } from './steps';
import { threeWireRungs } from './threeWire';

const solution = buildProgram('Forward / reverse (reference)', 'Forward-stop-reverse with interlocks and feedback.', conveyorTags(), [
  rung(
    'Forward: sealed in on K1\'s auxiliary contact; locked out while K2 is closed (feedback) or commanded (same scan)',
    no('Stop_PB'), par(no('Fwd_PB'), no('K1_Aux')), nc('K2_Aux'), nc('K2_Coil'), coil('K1_Coil'),
  ),
  rung(
    'Reverse: the mirror image',
    no('Stop_PB'), par(no('Rev_PB'), no('K2_Aux')), nc('K1_Aux'), nc('K1_Coil'), coil('K2_Coil'),
  ),
  rung('Green lamp while running forward', no('K1_Aux'), coil('Green_Lamp')),
  rung('Amber lamp while running in reverse', no('K2_Aux'), coil('Amber_Lamp')),
  rung('Red lamp while stopped', nc('K1_Aux'), nc('K2_Aux'), coil('Red_Lamp')),
]);

const starter = buildProgram('Forward / reverse', 'Forward works; add reverse, safely.', conveyorTags(), threeWireRungs());

export const FORWARD_REVERSE: Lab = {
  id: 'forward-reverse',
  order: 5,
  title: 'Forward / reverse with interlocks',
  summary: 'Reverse the belt with K2, never both contactors at once, with feedback from the auxiliary contacts.',
  panel: 'reversing-conveyor',
  brief: brief(
    '# Forward / reverse',
    '*Demo scenario — Larch Hollow Timber Co. (invented).* When a board jams at the planer, the operator backs the ' +
      'belt out in reverse. K1 (%QX1) runs the belt forward, K2 (%QX2) in reverse by swapping two phases. K1 and K2 ' +
      'closed together would short two phases, so they must never both be commanded.',
    '**Forward–stop–reverse**: S2 starts forward, S3 starts reverse, S1 stops. Each direction seals in on its own ' +
      'auxiliary contact. Pressing the other direction\'s button while the belt runs does nothing; press S1 first.',
    'Interlock electrically in two ways: each coil rung has the *other* contactor\'s auxiliary contact (`K2_Aux` / ' +
      '`K1_Aux`) as an NC contact, so a direction can start only once the other contactor has really opened; and ' +
      'the other coil\'s bit, so that pressing S2 and S3 in the same scan commands only one. The panel also has a ' +
      'mechanical interlock R1; if both coils are energised in the same scan while both contactors are open, neither ' +
      'closes and R1 reports a conflict — a well-written program never lets that happen.',
    'Lamps: green P1 forward, amber P3 reverse, red P2 stopped.',
  ),
  starter,
  solution,
  script: {
    panel: 'reversing-conveyor',
    scanMs: 10,
    title: 'Forward / reverse',
    steps: [
      { expect: { K1: 'open', K2: 'open', P2: 'lit' }, label: 'at rest: both contactors open, red lamp lit' },
      ...pulse('S2', 100, 700),
      { expect: { K1: 'closed', M1: 'forward', P1: 'lit' }, label: 'S2 runs the belt forward, sealed in', points: 2 },
      { press: 'S3' }, { wait: 100 },
      { expect: { K1: 'closed', K2: 'open', '%QX2': false }, label: 'reverse is locked out while K1 is closed', points: 2 },
      { release: 'S3' }, { wait: 100 },
      ...pulse('S1', 100, 1000),
      { expect: { K1: 'open', M1: 'stopped' }, label: 'S1 stops the belt' },
      ...pulse('S3', 100, 700),
      { expect: { K2: 'closed', M1: 'reverse', P3: 'lit', P1: 'dark' }, label: 'S3 runs the belt in reverse, sealed in', points: 2 },
      { press: 'S2' }, { wait: 100 },
      { expect: { K2: 'closed', K1: 'open', '%QX1': false }, label: 'forward is locked out while K2 is closed', hidden: true },
      { release: 'S2' },
      ...pulse('S1', 100, 1000),
      { press: 'S2' }, { press: 'S3' }, { wait: 100 },
      { expect: { R1: 'clear' }, label: 'S2 and S3 pressed together: never both coils commanded (no interlock conflict)', hidden: true, points: 2 },
      { release: 'S2' }, { release: 'S3' },
      ...pulse('S1', 100, 1000),
      ...pulse('S2', 100, 700),
      { trip: 'F1' }, { wait: 100 },
      { expect: { K1: 'open', '%IX7': false }, label: 'an overload trip drops K1', hidden: true },
      { reset: 'F1' }, { wait: 700 },
      { expect: { K1: 'open', K2: 'open', '%QX1': false }, label: 'seal-in on the auxiliary contact: stays stopped after the overload reset', hidden: true, points: 2 },
    ],
  },
};
