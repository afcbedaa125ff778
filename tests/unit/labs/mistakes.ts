/**
 * Typical wrong answers for each lab, and the checks a teacher expects each one to fail. Written
 * by hand from the way students get these circuits wrong (common practice).
 */
import { block, buildProgram, coil, nc, no, par, rung, ser, tag } from '@shared/labs/build';
import { conveyorTags } from '@shared/labs/conveyorTags';
import type { Program } from '@shared/ladder/schema';

export interface Mistake {
  lab: string;
  name: string;
  program: Program;
  /** Labels of the checks this mistake must fail (exactly these). */
  fails: string[];
}

const p = (...rungs: Parameters<typeof buildProgram>[3]) => buildProgram('wrong answer', '', conveyorTags(), rungs);
const withReq = (...rungs: Parameters<typeof buildProgram>[3]) =>
  buildProgram('wrong answer', '', [...conveyorTags(), tag('Start_Req', '%MX1')], rungs);
const lamps = () => [rung('', no('K1_Aux'), coil('Green_Lamp')), rung('', nc('K1_Aux'), coil('Red_Lamp'))];

export const MISTAKES: Mistake[] = [
  {
    lab: 'io-checkout',
    name: 'stop button examined with an NC contact',
    program: p(rung('', nc('Stop_PB'), coil('Red_Lamp')), rung('', no('Fwd_PB'), coil('Green_Lamp')), rung('', no('Rev_PB'), coil('Horn')), rung('', par(no('Run_Sel'), no('Box_Eye')), coil('Amber_Lamp'))),
    fails: [
      'at rest the NC stop button reads TRUE: red lamp lit',
      'pressing stop opens its NC contact: red lamp dark',
      'reverse button sounds the horn',
      'red lamp back once the e-stop is released',
    ],
  },
  {
    lab: 'io-checkout',
    name: 'horn and amber lamp swapped',
    program: p(rung('', no('Stop_PB'), coil('Red_Lamp')), rung('', no('Fwd_PB'), coil('Green_Lamp')), rung('', no('Rev_PB'), coil('Amber_Lamp')), rung('', par(no('Run_Sel'), no('Box_Eye')), coil('Horn'))),
    fails: ['reverse button sounds the horn', 'selector at RUN lights the amber lamp', 'a box at the photo-eye lights the amber lamp'],
  },
  {
    lab: 'two-wire',
    name: 'green lamp on the output bit instead of the auxiliary contact',
    program: p(rung('', no('Stop_PB'), no('Run_Sel'), coil('K1_Coil')), rung('', no('K1_Coil'), coil('Green_Lamp')), rung('', nc('K1_Aux'), coil('Red_Lamp'))),
    fails: ['overload drops K1 while %QX1 stays ON; green lamp follows K1'],
  },
  {
    lab: 'two-wire',
    name: 'started from the momentary forward button',
    program: p(rung('', no('Stop_PB'), no('Fwd_PB'), coil('K1_Coil')), ...lamps()),
    fails: [
      'selector at RUN runs the belt',
      'two-wire control restarts by itself when the e-stop is released',
      'overload drops K1 while %QX1 stays ON; green lamp follows K1',
      'after the overload reset a two-wire circuit recloses',
    ],
  },
  {
    lab: 'three-wire',
    name: 'no seal-in contact',
    program: p(rung('', no('Stop_PB'), no('Fwd_PB'), coil('K1_Coil')), ...lamps()),
    fails: ['S2 starts the belt and it stays sealed in after release', 'it starts again with S2 after the reset'],
  },
  {
    lab: 'three-wire',
    name: 'seal-in on the output bit instead of the auxiliary contact',
    program: p(rung('', no('Stop_PB'), par(no('Fwd_PB'), no('K1_Coil')), coil('K1_Coil')), ...lamps()),
    fails: ['after the overload reset the belt stays stopped'],
  },
  {
    lab: 'three-wire',
    name: 'stop examined with an NC contact',
    program: p(rung('', nc('Stop_PB'), par(no('Fwd_PB'), no('K1_Aux')), coil('K1_Coil')), ...lamps()),
    // "S1 stops it" passes: the belt never started.
    fails: ['S2 starts the belt and it stays sealed in after release', 'it starts again with S2 after the reset'],
  },
  {
    lab: 'jog-run',
    name: 'seal-in regardless of the selector',
    program: p(rung('', no('Stop_PB'), par(no('Fwd_PB'), no('K1_Aux')), coil('K1_Coil')), ...lamps()),
    fails: ['at JOG the belt stops as soon as S2 is released', 'turning to JOG breaks the seal-in'],
  },
  {
    lab: 'jog-run',
    name: 'selector the wrong way round (seal at JOG)',
    program: p(rung('', no('Stop_PB'), par(no('Fwd_PB'), ser(no('K1_Aux'), nc('Run_Sel'))), coil('K1_Coil')), ...lamps()),
    fails: ['at JOG the belt stops as soon as S2 is released', 'at RUN, S2 starts the belt and it seals in'],
  },
  {
    lab: 'forward-reverse',
    name: 'no interlocks at all',
    program: p(
      rung('', no('Stop_PB'), par(no('Fwd_PB'), no('K1_Aux')), coil('K1_Coil')),
      rung('', no('Stop_PB'), par(no('Rev_PB'), no('K2_Aux')), coil('K2_Coil')),
      rung('', no('K1_Aux'), coil('Green_Lamp')),
      rung('', no('K2_Aux'), coil('Amber_Lamp')),
      rung('', nc('K1_Aux'), nc('K2_Aux'), coil('Red_Lamp')),
    ),
    fails: [
      'reverse is locked out while K1 is closed',
      'forward is locked out while K2 is closed',
      'S2 and S3 pressed together: never both coils commanded (no interlock conflict)',
    ],
  },
  {
    lab: 'forward-reverse',
    name: 'seal-ins on the output bits instead of the auxiliary contacts',
    program: p(
      rung('', no('Stop_PB'), par(no('Fwd_PB'), no('K1_Coil')), nc('K2_Aux'), nc('K2_Coil'), coil('K1_Coil')),
      rung('', no('Stop_PB'), par(no('Rev_PB'), no('K2_Coil')), nc('K1_Aux'), nc('K1_Coil'), coil('K2_Coil')),
      rung('', no('K1_Aux'), coil('Green_Lamp')),
      rung('', no('K2_Aux'), coil('Amber_Lamp')),
      rung('', nc('K1_Aux'), nc('K2_Aux'), coil('Red_Lamp')),
    ),
    fails: ['seal-in on the auxiliary contact: stays stopped after the overload reset'],
  },
  {
    lab: 'forward-reverse',
    name: 'interlocked on the auxiliary contacts only (both buttons at once command both coils)',
    program: p(
      rung('', no('Stop_PB'), par(no('Fwd_PB'), no('K1_Aux')), nc('K2_Aux'), coil('K1_Coil')),
      rung('', no('Stop_PB'), par(no('Rev_PB'), no('K2_Aux')), nc('K1_Aux'), coil('K2_Coil')),
      rung('', no('K1_Aux'), coil('Green_Lamp')),
      rung('', no('K2_Aux'), coil('Amber_Lamp')),
      rung('', nc('K1_Aux'), nc('K2_Aux'), coil('Red_Lamp')),
    ),
    fails: ['S2 and S3 pressed together: never both coils commanded (no interlock conflict)'],
  },
  {
    lab: 'warning-horn',
    name: 'horn and belt together, no timer',
    program: withReq(
      rung('', no('Stop_PB'), nc('OL_Tripped'), par(no('Fwd_PB'), no('Start_Req')), coil('Start_Req')),
      rung('', no('Start_Req'), coil('Horn'), coil('K1_Coil')),
    ),
    fails: [
      '1 s after S2: the horn warns and the belt has not started',
      'still warning at 2.8 s',
      'after 3 s the belt starts and the horn stops',
      'the horn stays silent while the belt runs',
    ],
  },
  {
    lab: 'warning-horn',
    name: 'warning time 300 ms instead of 3 s',
    program: withReq(
      rung('', no('Stop_PB'), nc('OL_Tripped'), par(no('Fwd_PB'), no('Start_Req')), coil('Start_Req')),
      rung('', no('Start_Req'), block('TON', 'T1', { PT: 'T#300ms' })),
      rung('', no('Start_Req'), nc('T1.Q'), coil('Horn')),
      rung('', no('Start_Req'), no('T1.Q'), coil('K1_Coil')),
    ),
    fails: ['1 s after S2: the horn warns and the belt has not started', 'still warning at 2.8 s'],
  },
  {
    lab: 'warning-horn',
    name: 'horn keeps sounding while the belt runs',
    program: withReq(
      rung('', no('Stop_PB'), nc('OL_Tripped'), par(no('Fwd_PB'), no('Start_Req')), coil('Start_Req')),
      rung('', no('Start_Req'), block('TON', 'T1', { PT: 'T#3s' })),
      rung('', no('Start_Req'), coil('Horn')),
      rung('', no('Start_Req'), no('T1.Q'), coil('K1_Coil')),
    ),
    fails: ['after 3 s the belt starts and the horn stops', 'the horn stays silent while the belt runs'],
  },
  {
    lab: 'box-counter',
    name: 'preset 4 instead of 5',
    program: p(
      rung('', no('Stop_PB'), par(no('Fwd_PB'), no('K1_Aux')), nc('C1.Q'), coil('K1_Coil')),
      rung('', no('Box_Eye'), block('CTU', 'C1', { R: 'Fwd_PB', PV: '4' })),
      rung('', no('C1.Q'), coil('Amber_Lamp')),
    ),
    fails: ['still running after 4 boxes', 'a box standing in the beam counts once'],
  },
  {
    lab: 'box-counter',
    name: 'counter never reset',
    program: p(
      rung('', no('Stop_PB'), par(no('Fwd_PB'), no('K1_Aux')), nc('C1.Q'), coil('K1_Coil')),
      rung('', no('Box_Eye'), block('CTU', 'C1', { PV: '5' })),
      rung('', no('C1.Q'), coil('Amber_Lamp')),
    ),
    fails: ['S2 starts a new batch', 'a box standing in the beam counts once'],
  },
];
