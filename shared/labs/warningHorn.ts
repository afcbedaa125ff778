/** Lab 6: a 3 s warning horn before the belt starts (TON). Demo scenario. */
import { block, buildProgram, coil, nc, no, par, rung } from './build';
import { conveyorTags } from './conveyorTags';
import { brief, type Lab } from './lab';
import { pulse } from './steps';
import { tag } from './build';

const tags = () => [...conveyorTags(), tag('Start_Req', '%MX1', 'start requested: warning, then run')];

const solution = buildProgram('Warning horn (reference)', 'Start request, 3 s warning on TON T1, then run.', tags(), [
  rung('Start request: S2 sets it, S1 or an overload trip clears it', no('Stop_PB'), nc('OL_Tripped'), par(no('Fwd_PB'), no('Start_Req')), coil('Start_Req')),
  rung('Warning time: 3 s from the start request', no('Start_Req'), block('TON', 'T1', { PT: 'T#3s' })),
  rung('Horn sounds during the warning', no('Start_Req'), nc('T1.Q'), coil('Horn')),
  rung('The belt starts when the warning is over', no('Start_Req'), no('T1.Q'), coil('K1_Coil')),
  rung('Green lamp while K1 is closed', no('K1_Aux'), coil('Green_Lamp')),
]);

const starter = buildProgram('Warning horn', 'The belt starts at once; add the 3 s warning.', tags(), [
  rung('Starts at once, no warning', no('Stop_PB'), par(no('Fwd_PB'), no('K1_Aux')), coil('K1_Coil')),
  rung('Green lamp while K1 is closed', no('K1_Aux'), coil('Green_Lamp')),
]);

export const WARNING_HORN: Lab = {
  id: 'warning-horn',
  order: 6,
  title: 'Warning horn before start (TON)',
  summary: 'Sound the horn for 3 s before the belt starts, with an on-delay timer.',
  panel: 'reversing-conveyor',
  brief: brief(
    '# Warning horn before start',
    '*Demo scenario — Larch Hollow Timber Co. (invented).* The infeed belt runs along a walkway. Before it moves, ' +
      'anyone nearby must be warned: pressing S2 sounds the horn H1 (%QX3) for **3 s**, then K1 starts the belt and ' +
      'the horn stops. S1 stops everything, also during the warning; an overload trip (`OL_Tripped`, %IX6) cancels the start.',
    'Keep the request in a memory bit (`Start_Req`, %MX1) sealed in on itself, time it with an on-delay timer ' +
      '`TON` named T1 with `PT := T#3s`, sound the horn while the request is on and `T1.Q` is not, and energise K1 ' +
      'when `T1.Q` is on (IEC 61131-3 TON: Q turns on once IN has been on for PT).',
  ),
  starter,
  solution,
  script: {
    panel: 'reversing-conveyor',
    scanMs: 10,
    title: 'Warning horn',
    steps: [
      { expect: { H1: 'silent', K1: 'open' }, label: 'at rest: horn silent, belt stopped' },
      ...pulse('S2', 100, 900),
      { expect: { H1: 'sounding', K1: 'open' }, label: '1 s after S2: the horn warns and the belt has not started', points: 2 },
      { wait: 1800 },
      { expect: { H1: 'sounding', K1: 'open' }, label: 'still warning at 2.8 s', hidden: true },
      { wait: 400 },
      { expect: { K1: 'closed', M1: 'forward', H1: 'silent' }, label: 'after 3 s the belt starts and the horn stops', points: 2 },
      { wait: 2000 },
      { expect: { K1: 'closed', H1: 'silent' }, label: 'the horn stays silent while the belt runs', hidden: true },
      ...pulse('S1'),
      { expect: { K1: 'open', H1: 'silent' }, label: 'S1 stops the belt' },
      ...pulse('S2', 100, 900),
      ...pulse('S1', 100, 3000),
      { expect: { K1: 'open', H1: 'silent' }, label: 'S1 during the warning cancels the start', hidden: true, points: 2 },
    ],
  },
};
