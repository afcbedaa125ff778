/** Lab 1: I/O checkout — prove every field device reaches the PLC before anything moves. Demo scenario. */
import { buildProgram, coil, no, par, rung } from './build';
import { conveyorTags } from './conveyorTags';
import { brief, type Lab } from './lab';
import { pulse } from './steps';

const solution = buildProgram(
  'I/O checkout (reference)',
  'Each input shown on a lamp or the horn.',
  conveyorTags(),
  [
    rung('Stop button S1 is NC: examined by a NO contact it reads TRUE at rest, so the red lamp is lit until S1 is pressed', no('Stop_PB'), coil('Red_Lamp')),
    rung('Forward button S2 on the green lamp', no('Fwd_PB'), coil('Green_Lamp')),
    rung('Reverse button S3 sounds the horn (horn test)', no('Rev_PB'), coil('Horn')),
    rung('Selector at RUN or a box at the photo-eye lights the amber lamp', par(no('Run_Sel'), no('Box_Eye')), coil('Amber_Lamp')),
  ],
);

const starter = buildProgram(
  'I/O checkout',
  'Show each input on a lamp or the horn. The first rung is done for you.',
  conveyorTags(),
  [rung('Forward button S2 on the green lamp', no('Fwd_PB'), coil('Green_Lamp'))],
);

export const IO_CHECKOUT: Lab = {
  id: 'io-checkout',
  order: 1,
  title: 'I/O checkout',
  summary: 'Show every input on a lamp or the horn, and see why a normally closed stop button reads TRUE at rest.',
  panel: 'reversing-conveyor',
  brief: brief(
    '# I/O checkout',
    '*Demo scenario — Larch Hollow Timber Co. (invented).* The maintenance crew has rewired the infeed conveyor panel. ' +
      'Before the belt may move, prove that every field device reaches the PLC: write a program that shows each input ' +
      'on an indicator. The contactors K1 and K2 must stay off for the whole checkout.',
    [
      '| input | device | show it on |',
      '| --- | --- | --- |',
      '| %IX1 `Stop_PB` | S1 stop, red, **normally closed** | P2 red lamp (%QX5), lit while S1 is *not* pressed |',
      '| %IX2 `Fwd_PB` | S2 forward | P1 green lamp (%QX4) |',
      '| %IX3 `Rev_PB` | S3 reverse | H1 horn (%QX3) |',
      '| %IX4 `Run_Sel`, %IX5 `Box_Eye` | S4 at RUN, or a box at photo-eye B1 | P3 amber lamp (%QX6) |',
    ].join('\n'),
    'Think about S1: its contact is closed at rest, so the input is TRUE until the button is pressed. Which contact ' +
      'instruction makes the red lamp follow the *healthy* state of the stop circuit? Try the emergency stop S0 too: ' +
      'it is wired ahead of the input common, so every input goes FALSE while it is pressed.',
  ),
  starter,
  solution,
  script: {
    panel: 'reversing-conveyor',
    scanMs: 10,
    title: 'I/O checkout',
    steps: [
      { expect: { P2: 'lit', '%IX1': true, P1: 'dark', P3: 'dark', H1: 'silent' }, label: 'at rest the NC stop button reads TRUE: red lamp lit', points: 2 },
      { press: 'S2' }, { wait: 50 },
      { expect: { P1: 'lit', '%IX2': true }, label: 'forward button shows on the green lamp' },
      { release: 'S2' }, { press: 'S1' }, { wait: 50 },
      { expect: { P2: 'dark', P1: 'dark', '%IX1': false }, label: 'pressing stop opens its NC contact: red lamp dark' },
      { release: 'S1' }, { press: 'S3' }, { wait: 50 },
      { expect: { H1: 'sounding', P2: 'lit' }, label: 'reverse button sounds the horn' },
      { release: 'S3' }, { set: 'S4', to: 'RUN' }, { wait: 50 },
      { expect: { P3: 'lit', H1: 'silent' }, label: 'selector at RUN lights the amber lamp' },
      { set: 'S4', to: 'JOG' }, { block: 'B1' }, { wait: 50 },
      { expect: { P3: 'lit' }, label: 'a box at the photo-eye lights the amber lamp', hidden: true },
      { unblock: 'B1' }, { wait: 50 },
      { expect: { P3: 'dark' }, label: 'amber lamp dark with JOG and no box', hidden: true },
      { press: 'S0' }, { wait: 50 },
      { expect: { '%IX1': false, P2: 'dark' }, label: 'e-stop removes every input', hidden: true },
      { release: 'S0' }, { wait: 50 },
      { expect: { P2: 'lit' }, label: 'red lamp back once the e-stop is released', hidden: true },
      ...pulse('S2'),
      { expect: { K1: 'open', K2: 'open', M1: 'stopped' }, label: 'the belt never moved during checkout', hidden: true },
    ],
  },
};
