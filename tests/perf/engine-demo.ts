/**
 * The benchmark's small case and a golden test's subject: a 6-rung program like the demo's
 * (Larch Hollow Timber Co. reversing conveyor — demo data, invented), and the same logic written by
 * hand over plain arrays as the baseline.
 *
 * Rungs: 1 forward with seal-in, stop, interlock and overload; 2 reverse likewise; 3 green lamp and
 * horn timer while either direction runs; 4 horn until the timer is done; 5 box counter on the
 * photo-eye, reset by the selector at JOG; 6 red lamp at rest, amber when the count is reached.
 */
import type { Program } from '@shared/ladder/schema';
import { programBuilder } from '../unit/engine/build';

/** Horn sounds this long after a start, ms. */
export const DEMO_HORN_MS = 3000;
/** Boxes per batch. */
export const DEMO_BATCH = 10;

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

/** Memory of the hand-written baseline: plain arrays and objects. */
export interface DemoBaselineState {
  /** %IX1..%IX8 input image. */
  inputs: boolean[];
  /** %QX1..%QX6. */
  q: boolean[];
  /** %MX1..%MX64. */
  m: boolean[];
  outputImage: boolean[];
  t1: { q: boolean; et: number };
  c1: { q: boolean; cv: number; lastCu: boolean };
  eyeLast: boolean;
  timeMs: number;
}

export function demoBaselineState(): DemoBaselineState {
  return {
    inputs: new Array<boolean>(8).fill(false),
    q: new Array<boolean>(6).fill(false),
    m: new Array<boolean>(64).fill(false),
    outputImage: new Array<boolean>(6).fill(false),
    t1: { q: false, et: 0 },
    c1: { q: false, cv: 0, lastCu: false },
    eyeLast: false,
    timeMs: 0,
  };
}

/** One scan of the demo logic, written by hand: input image, the six rungs, output image, time. */
export function demoBaselineScan(s: DemoBaselineState, field: readonly boolean[], dtMs: number): void {
  const { inputs, q, m } = s;
  for (let i = 0; i < 8; i += 1) inputs[i] = field[i]!;
  const stop = inputs[0]!;
  const trip = inputs[5]!;
  q[0] = (inputs[1]! || q[0]!) && stop && !q[1] && !trip;
  q[1] = (inputs[2]! || q[1]!) && stop && !q[0] && !trip;
  const running = q[0]! || q[1]!;
  q[3] = running;
  if (running) {
    s.t1.et = Math.min(s.t1.et + dtMs, DEMO_HORN_MS);
    s.t1.q = s.t1.et >= DEMO_HORN_MS;
  } else {
    s.t1.et = 0;
    s.t1.q = false;
  }
  q[2] = running && !s.t1.q;
  const eye = inputs[4]!;
  const edge = eye && !s.eyeLast;
  s.eyeLast = eye;
  const c1 = s.c1;
  if (m[0]) c1.cv = 0;
  else if (edge && !c1.lastCu && c1.cv < 32767) c1.cv += 1;
  c1.lastCu = edge;
  c1.q = c1.cv >= DEMO_BATCH;
  m[1] = c1.q;
  q[4] = !q[0] && !q[1];
  q[5] = m[1]!;
  for (let i = 0; i < 6; i += 1) s.outputImage[i] = q[i]!;
  s.timeMs += dtMs;
}
