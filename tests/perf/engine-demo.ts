/**
 * The engine benchmark's demo programs, each with the same logic written by hand in the strong
 * style (typed arrays, bitwise operators) as its baseline:
 *
 * - the conveyor demo: the 3-rung forward/reverse program with interlocks that the demo data
 *   seeds (server/db/demoPrograms.ts);
 * - the three-wire demo: the simulator's 7-rung three-wire reversing program with lamps and a jam
 *   timer (src/simulation/demoPrograms.ts);
 * - the batch demo: a 6-rung reversing conveyor with a horn timer and a box counter on an edge
 *   contact, also the subject of tests/unit/engine/demo.test.ts.
 *
 * All Larch Hollow Timber Co. scenarios: demo data, invented.
 */
import type { AddressSpace } from '@shared/ladder/addresses';
import { DEFAULT_ADDRESS_SPACE } from '@shared/ladder/addresses';
import type { Program } from '@shared/ladder/schema';
import { REVERSING_DEMO } from '../../server/db/demoPrograms';
import { threeWireProgram } from '../../src/simulation/demoPrograms';
import { programBuilder } from '../unit/engine/build';

/** Horn sounds this long after a start, ms (batch demo). */
export const DEMO_HORN_MS = 3000;
/** Boxes per batch (batch demo). */
export const DEMO_BATCH = 10;

/** The batch demo: 6 rungs on the default panel. */
export function demoProgram(): Program {
  const b = programBuilder();
  const tags = [
    { name: 'S1_Stop', address: '%IX1', comment: 'stop, NC at rest' },
    { name: 'S2_Fwd', address: '%IX2', comment: '' },
    { name: 'S3_Rev', address: '%IX3', comment: '' },
    { name: 'S4_Run', address: '%IX4', comment: 'selector at RUN' },
    { name: 'B1_Eye', address: '%IX5', comment: '' },
    { name: 'F1_Trip', address: '%IX6', comment: '' },
    { name: 'K1', address: '%QX1', comment: 'forward contactor' },
    { name: 'K2', address: '%QX2', comment: 'reverse contactor' },
    { name: 'H1', address: '%QX3', comment: 'horn' },
    { name: 'P1', address: '%QX4', comment: 'green lamp' },
    { name: 'P2', address: '%QX5', comment: 'red lamp' },
    { name: 'P3', address: '%QX6', comment: 'amber lamp' },
  ];
  return b.program(
    [
      b.rung(b.parallel(b.no('S2_Fwd'), b.no('K1')), b.no('S1_Stop'), b.nc('K2'), b.nc('F1_Trip'), b.coil('K1')),
      b.rung(b.parallel(b.no('S3_Rev'), b.no('K2')), b.no('S1_Stop'), b.nc('K1'), b.nc('F1_Trip'), b.coil('K2')),
      b.rung(b.parallel(b.no('K1'), b.no('K2')), b.parallel(b.coil('P1'), b.block('TON', 'T1', { PT: 'T#3s' }))),
      b.rung(b.parallel(b.no('K1'), b.no('K2')), b.nc('T1.Q'), b.coil('H1')),
      b.rung(b.contact('rising', 'B1_Eye'), b.block('CTU', 'C1', { PV: String(DEMO_BATCH), R: '%MX1' }), b.coil('%MX2')),
      b.rung(b.parallel(b.series(b.nc('K1'), b.nc('K2'), b.coil('P2')), b.series(b.no('%MX2'), b.coil('P3')))),
    ],
    tags,
  );
}

/** A demo's baseline memory: the bit image, edge memories, and block fields in typed arrays. */
export interface DemoState {
  I: Uint8Array;
  Q: Uint8Array;
  M: Uint8Array;
  E: Uint8Array;
  /** Per block: Q, last CU (counters), ET or CV. */
  BQ: Uint8Array;
  BL: Uint8Array;
  BN: Int32Array;
  outputImage: Uint8Array;
}

/** Block fields the baseline keeps, to compare with the engine's snapshot. */
export interface DemoBlock {
  name: string;
  state: (s: DemoState) => Record<string, boolean | number>;
}

export interface DemoCase {
  name: string;
  program: Program;
  space: AddressSpace;
  /** Edge memories (edge contacts) in the program. */
  edges: number;
  blocks: DemoBlock[];
  scan: (s: DemoState, field: readonly boolean[], dt: number) => void;
}

function demoState(space: AddressSpace, edges: number, blocks: number): DemoState {
  return {
    I: new Uint8Array(space.inputs),
    Q: new Uint8Array(space.outputs),
    M: new Uint8Array(space.memory),
    E: new Uint8Array(Math.max(edges, 1)),
    BQ: new Uint8Array(Math.max(blocks, 1)),
    BL: new Uint8Array(Math.max(blocks, 1)),
    BN: new Int32Array(Math.max(blocks, 1)),
    outputImage: new Uint8Array(space.outputs),
  };
}

export function createDemoState(demo: DemoCase): DemoState {
  return demoState(demo.space, demo.edges, demo.blocks.length);
}

function readInputs(s: DemoState, field: readonly boolean[]): void {
  const I = s.I;
  for (let i = 0; i < I.length; i += 1) I[i] = field[i] ? 1 : 0;
}

function writeOutputs(s: DemoState): void {
  const { Q, outputImage } = s;
  for (let i = 0; i < Q.length; i += 1) outputImage[i] = Q[i]!;
}

/** Conveyor: forward and reverse sealed in on their auxiliary contacts, each blocked by the other's command; red lamp while neither contactor is closed. */
function conveyorScan(s: DemoState, field: readonly boolean[]): void {
  readInputs(s, field);
  const { I, Q } = s;
  Q[0] = I[0]! & (I[1]! | I[6]!) & (Q[1]! ^ 1);
  Q[1] = I[0]! & (I[2]! | I[7]!) & (Q[0]! ^ 1);
  Q[4] = (I[6]! ^ 1) & (I[7]! ^ 1);
  writeOutputs(s);
}

/** Three-wire: stop, start or sealed in on the auxiliary contact at RUN, interlock; lamps; 5 s jam timer and horn. */
function threeWireScan(s: DemoState, field: readonly boolean[], dt: number): void {
  readInputs(s, field);
  const { I, Q, BQ, BN } = s;
  Q[0] = I[0]! & (I[1]! | (I[6]! & I[3]!)) & (Q[1]! ^ 1);
  Q[1] = I[0]! & (I[2]! | (I[7]! & I[3]!)) & (Q[0]! ^ 1);
  Q[3] = I[6]! | I[7]!;
  Q[4] = (I[6]! ^ 1) & (I[7]! ^ 1);
  Q[5] = I[5]!;
  if (I[4]! & I[6]!) {
    const et = Math.min(BN[0]! + dt, 5000);
    BN[0] = et;
    BQ[0] = et >= 5000 ? 1 : 0;
  } else {
    BN[0] = 0;
    BQ[0] = 0;
  }
  Q[2] = BQ[0]!;
  writeOutputs(s);
}

/** Batch: conveyor with overload, green lamp and 3 s horn, box counter with reset on %MX1, red and amber lamps. */
function batchScan(s: DemoState, field: readonly boolean[], dt: number): void {
  readInputs(s, field);
  const { I, Q, M, E, BQ, BL, BN } = s;
  const stop = I[0]!;
  const tripped = I[5]!;
  Q[0] = (I[1]! | Q[0]!) & stop & (Q[1]! ^ 1) & (tripped ^ 1);
  Q[1] = (I[2]! | Q[1]!) & stop & (Q[0]! ^ 1) & (tripped ^ 1);
  const running = Q[0]! | Q[1]!;
  Q[3] = running;
  if (running) {
    const et = Math.min(BN[0]! + dt, DEMO_HORN_MS);
    BN[0] = et;
    BQ[0] = et >= DEMO_HORN_MS ? 1 : 0;
  } else {
    BN[0] = 0;
    BQ[0] = 0;
  }
  Q[2] = (Q[0]! | Q[1]!) & (BQ[0]! ^ 1);
  const eye = I[4]!;
  const box = eye & (E[0]! ^ 1);
  E[0] = eye;
  const counted = box & (BL[1]! ^ 1);
  BL[1] = box;
  if (M[0]) BN[1] = 0;
  else if (counted & (BN[1]! < 32767 ? 1 : 0)) BN[1] += 1;
  BQ[1] = BN[1]! >= DEMO_BATCH ? 1 : 0;
  M[1] = BQ[1]!;
  Q[4] = (Q[0]! ^ 1) & (Q[1]! ^ 1);
  Q[5] = M[1]!;
  writeOutputs(s);
}

const timer = (name: string, k: number): DemoBlock => ({ name, state: (s) => ({ Q: s.BQ[k] === 1, ET: s.BN[k]! }) });
const upCounter = (name: string, k: number): DemoBlock => ({ name, state: (s) => ({ Q: s.BQ[k] === 1, CV: s.BN[k]!, lastCU: s.BL[k] === 1 }) });

/** The three demos, smallest first. */
export function demoCases(): DemoCase[] {
  const space = DEFAULT_ADDRESS_SPACE;
  return [
    { name: 'conveyor', program: REVERSING_DEMO, space, edges: 0, blocks: [], scan: conveyorScan },
    { name: 'three-wire', program: threeWireProgram(), space, edges: 0, blocks: [timer('T1', 0)], scan: threeWireScan },
    { name: 'batch', program: demoProgram(), space, edges: 1, blocks: [timer('T1', 0), upCounter('C1', 1)], scan: batchScan },
  ];
}
