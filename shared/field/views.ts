/**
 * Read-only views of devices for the panel drawing and the check runner: the state word, each
 * contact open or closed, and a few figures per kind (motor speed and current, overload thermal
 * level). One table keyed by kind.
 */
import type { AnyDeviceModel } from './devices';
import type { ContactorState } from './devices/contactor';
import type { DeviceKind, ContactForm } from './devices/model';
import { motorDirection, type MotorState } from './devices/motor';
import { resetLevel, thermalLevel, type OverloadParams, type OverloadState } from './devices/overload';
import type { DeviceSpec } from './layout';

export type DetailValue = string | number | boolean;

export interface DeviceView {
  id: string;
  kind: DeviceKind;
  label: string;
  /** The state in one word, as check scripts name it. */
  word: string;
  contacts: { name: string; form: ContactForm; closed: boolean }[];
  /** For a load: does its circuit have power after the last scan? null for other devices. */
  energised: boolean | null;
  /** Figures worth showing for this kind (speed, current in A, thermal level 0..1 of trip…). */
  detail: Readonly<Record<string, DetailValue>>;
}

type Detail = (state: unknown, params: unknown) => Record<string, DetailValue>;


const round = (x: number, digits = 3): number => Math.round(x * 10 ** digits) / 10 ** digits;

export const DEVICE_DETAILS = {
  pushbutton: (state) => ({ pressed: (state as { pressed: boolean }).pressed }),
  estop: (state) => ({ latched: (state as { latched: boolean }).latched }),
  selector: (state) => ({ position: (state as { position: string }).position }),
  contactor: (state) => {
    const s = state as ContactorState;
    return { closed: s.closed, moving: s.movingMs > 0, held: s.held };
  },
  interlock: (state) => ({ conflict: (state as { conflict: boolean }).conflict }),
  overload: (state, params) => {
    const s = state as OverloadState;
    const p = params as OverloadParams;
    return {
      tripped: s.tripped,
      level: round(thermalLevel(s, p)),
      resettable: !s.tripped || thermalLevel(s, p) <= resetLevel(p),
      currentA: round(s.currentA),
      multiple: round(s.currentA / p.settingA),
    };
  },
  lamp: (state) => ({ lit: (state as { on: boolean }).on }),
  horn: (state) => ({ sounding: (state as { on: boolean }).on }),
  motor: (state) => {
    const s = state as MotorState;
    return { direction: motorDirection(s), speed: round(s.speed), currentA: round(s.currentA), loadFactor: s.loadFactor };
  },
  photoeye: (state) => ({ blocked: (state as { blocked: boolean }).blocked }),
  limit: (state) => ({ actuated: (state as { actuated: boolean }).actuated }),
} as const satisfies Record<DeviceKind, Detail>;


/** Build the view of one device. */
export function deviceView(
  spec: DeviceSpec,
  model: AnyDeviceModel,
  state: unknown,
  params: unknown,
  word: string,
  energised: boolean | null,
): DeviceView {
  return {
    id: spec.id,
    kind: spec.kind,
    label: spec.label,
    word,
    contacts: model.contacts(params).map((c) => ({ name: c.name, form: c.form, closed: model.isClosed(state, params, c.name) })),
    energised,
    detail: DEVICE_DETAILS[spec.kind](state, params),
  };
}
