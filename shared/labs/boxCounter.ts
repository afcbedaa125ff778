/** Lab 7: stop the belt after a count of boxes on the photo-eye (CTU). Demo scenario. */
import { block, buildProgram, coil, nc, no, par, rung } from './build';
import { conveyorTags } from './conveyorTags';
import { brief, type Lab } from './lab';
import { box, boxes, pulse } from './steps';
import { threeWireRungs } from './threeWire';

/** Boxes in one batch. */
export const BATCH_SIZE = 5;

const solution = buildProgram('Box counter (reference)', 'Three-wire run, CTU C1 counts boxes, stops at 5.', conveyorTags(), [
  rung('Three-wire run, stopped when the batch is complete', no('Stop_PB'), par(no('Fwd_PB'), no('K1_Aux')), nc('C1.Q'), coil('K1_Coil')),
  rung('Count boxes leaving the belt; S2 starts a new batch', no('Box_Eye'), block('CTU', 'C1', { R: 'Fwd_PB', PV: String(BATCH_SIZE) })),
  rung('Amber lamp: batch complete', no('C1.Q'), coil('Amber_Lamp')),
  rung('Green lamp while K1 is closed', no('K1_Aux'), coil('Green_Lamp')),
]);

const starter = buildProgram('Box counter', 'Three-wire control; add the count.', conveyorTags(), threeWireRungs());

export const BOX_COUNTER: Lab = {
  id: 'box-counter',
  order: 7,
  title: 'Stop after a count of boxes (CTU)',
  summary: 'Count boxes on the photo-eye with an up counter and stop the belt after five.',
  panel: 'reversing-conveyor',
  brief: brief(
    '# Stop after a count of boxes',
    '*Demo scenario — Larch Hollow Timber Co. (invented).* Finished boards leave the belt in boxes of shims; the ' +
      `packer wants the belt to stop after **${BATCH_SIZE} boxes** so a pallet can be changed. The photo-eye B1 ` +
      '(`Box_Eye`, %IX5) is TRUE while a box blocks its beam.',
    'Start and stop as in the three-wire lab. Count boxes with an up counter `CTU` named C1, `PV := 5`, its count ' +
      'input from the photo-eye; when `C1.Q` turns on, the belt stops and the amber lamp P3 (%QX6) shows "batch ' +
      'complete". S2 starts a new batch: wire it to the counter\'s reset `R`. A box standing in the beam counts once ' +
      '(CTU counts rising edges, IEC 61131-3).',
  ),
  starter,
  solution,
  script: {
    panel: 'reversing-conveyor',
    scanMs: 10,
    title: 'Box counter',
    steps: [
      ...pulse('S2', 100, 700),
      { expect: { K1: 'closed', P3: 'dark' }, label: 'S2 starts the belt' },
      ...boxes(BATCH_SIZE - 1),
      { expect: { K1: 'closed', P3: 'dark' }, label: `still running after ${BATCH_SIZE - 1} boxes`, points: 2 },
      ...box(),
      { expect: { K1: 'open', P3: 'lit' }, label: `stops after box ${BATCH_SIZE}, amber lamp lit`, points: 2 },
      ...pulse('S2', 100, 700),
      { expect: { K1: 'closed', P3: 'dark' }, label: 'S2 starts a new batch', points: 2 },
      { block: 'B1' }, { wait: 3000 }, { unblock: 'B1' }, { wait: 300 },
      ...boxes(BATCH_SIZE - 2),
      { expect: { K1: 'closed' }, label: 'a box standing in the beam counts once', hidden: true, points: 2 },
      ...box(),
      { expect: { K1: 'open', P3: 'lit' }, label: 'the second batch stops at the right count', hidden: true },
      ...pulse('S1'),
      { expect: { K1: 'open' }, label: 'S1 still stops the belt', hidden: true },
    ],
  },
};
