/**
 * Every device kind's model in one table keyed by kind, so a new kind that is not described
 * everywhere fails to compile.
 */
import { contactor } from './contactor';
import { estop } from './estop';
import { horn, lamp } from './indicators';
import { interlock } from './interlock';
import type { DeviceKind, DeviceModel } from './model';
import { motor } from './motor';
import { overload } from './overload';
import { pushbutton } from './pushbutton';
import { selector } from './selector';
import { limit, photoeye } from './sensors';

/** A model with its parameter and state types forgotten, for generic code over the table. */
export type AnyDeviceModel = DeviceModel<unknown, unknown>;

export const DEVICE_MODELS = {
  pushbutton,
  estop,
  selector,
  contactor,
  interlock,
  overload,
  lamp,
  horn,
  motor,
  photoeye,
  limit,
} as const satisfies Record<DeviceKind, AnyDeviceModel>;

export const DEVICE_KINDS = Object.keys(DEVICE_MODELS) as DeviceKind[];

/** The model of a kind, typed for generic use. */
export function modelOf(kind: DeviceKind): AnyDeviceModel {
  return DEVICE_MODELS[kind] as AnyDeviceModel;
}

/**
 * The order the field advances in one step: the interlock decides before the contactors move,
 * contactors before the motor they feed, the motor before the overload that measures its current.
 */
export const STEP_ORDER = {
  pushbutton: 0,
  estop: 0,
  selector: 0,
  photoeye: 0,
  limit: 0,
  interlock: 1,
  contactor: 2,
  lamp: 3,
  horn: 3,
  motor: 4,
  overload: 5,
} as const satisfies Record<DeviceKind, number>;

export * from './model';
export * from './colours';
export * from './thermal';
export { isEngaged, type ContactorParams, type ContactorState } from './contactor';
export { interlockRule, type InterlockParams, type InterlockState, type InterlockVerdict } from './interlock';
export { motorDirection, type MotorFeeder, type MotorParams, type MotorState } from './motor';
export { resetLevel, thermalLevel, type OverloadParams, type OverloadState } from './overload';
export type { PushbuttonParams, PushbuttonState } from './pushbutton';
export type { EstopParams, EstopState } from './estop';
export type { SelectorParams, SelectorState } from './selector';
export type { IndicatorState, LampParams, HornParams } from './indicators';
export type { PhotoeyeParams, PhotoeyeState, LimitParams, LimitState } from './sensors';
