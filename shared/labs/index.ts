/** The standard course as data, in teaching order. */
import { BOX_COUNTER } from './boxCounter';
import { FORWARD_REVERSE } from './forwardReverse';
import { IO_CHECKOUT } from './ioCheckout';
import { JOG_RUN } from './jogRun';
import type { Lab } from './lab';
import { THREE_WIRE } from './threeWire';
import { TWO_WIRE } from './twoWire';
import { WARNING_HORN } from './warningHorn';

export const STANDARD_LABS: readonly Lab[] = Object.freeze([IO_CHECKOUT, TWO_WIRE, THREE_WIRE, JOG_RUN, FORWARD_REVERSE, WARNING_HORN, BOX_COUNTER]);

/** A standard lab by id, or undefined. */
export function standardLab(id: string): Lab | undefined {
  return STANDARD_LABS.find((lab) => lab.id === id);
}

export { BOX_COUNTER, FORWARD_REVERSE, IO_CHECKOUT, JOG_RUN, THREE_WIRE, TWO_WIRE, WARNING_HORN };
export type { Lab } from './lab';
export { SAFETY_CAUTION } from './safetyCaution';
export { CONVEYOR_TAGS, conveyorTags } from './conveyorTags';
export * as build from './build';
