/**
 * The tag table every lab on the `reversing-conveyor` panel starts from (demo scenario, Larch
 * Hollow Timber Co.). Tag names differ from the device ids (S1, K1…) on purpose: a tag names a
 * PLC bit, a device id names a thing on the panel, and `K1_Aux` (the input) is not `K1` (the contactor).
 */
import type { Tag } from '../ladder/schema';
import { tag } from './build';

export const CONVEYOR_TAGS: readonly Tag[] = Object.freeze([
  tag('Stop_PB', '%IX1', 'S1 stop, red, NC: TRUE at rest'),
  tag('Fwd_PB', '%IX2', 'S2 forward, green, NO'),
  tag('Rev_PB', '%IX3', 'S3 reverse, black, NO'),
  tag('Run_Sel', '%IX4', 'S4 selector: TRUE at RUN, FALSE at JOG'),
  tag('Box_Eye', '%IX5', 'B1 photo-eye: TRUE while a box blocks the beam'),
  tag('OL_Tripped', '%IX6', 'F1 97-98: TRUE when the overload has tripped'),
  tag('K1_Aux', '%IX7', 'K1 auxiliary 13-14: TRUE while K1 is closed'),
  tag('K2_Aux', '%IX8', 'K2 auxiliary 13-14: TRUE while K2 is closed'),
  tag('K1_Coil', '%QX1', 'K1 forward contactor coil (through F1 95-96)'),
  tag('K2_Coil', '%QX2', 'K2 reverse contactor coil (through F1 95-96)'),
  tag('Horn', '%QX3', 'H1 warning horn'),
  tag('Green_Lamp', '%QX4', 'P1 green lamp'),
  tag('Red_Lamp', '%QX5', 'P2 red lamp'),
  tag('Amber_Lamp', '%QX6', 'P3 amber lamp'),
]);

/** A fresh copy of the tags for a program document. */
export function conveyorTags(): Tag[] {
  return CONVEYOR_TAGS.map((t) => ({ ...t }));
}
