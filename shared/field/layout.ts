/**
 * The panel layout: a field panel described as data (JSON), validated by these zod schemas and by
 * `parsePanelLayout` (which also checks the cross references). It lists the devices, which device
 * contact feeds which PLC input, which PLC output drives which load and through which hardwired
 * series contacts, and the contacts the input and output commons run through. Nothing about these
 * circuits is built into the simulator: a layout without an overload relay, or with two e-stops in
 * series on each common, runs the same way.
 */
import { z } from 'zod';
import { ContactorParamsSchema } from './devices/contactor';
import { EstopParamsSchema } from './devices/estop';
import { HornParamsSchema, LampParamsSchema } from './devices/indicators';
import { InterlockParamsSchema } from './devices/interlock';
import { MotorParamsSchema } from './devices/motor';
import { OverloadParamsSchema } from './devices/overload';
import { PushbuttonParamsSchema } from './devices/pushbutton';
import { SelectorParamsSchema } from './devices/selector';
import { LimitParamsSchema, PhotoeyeParamsSchema } from './devices/sensors';

export const PANEL_FORMAT = 'rungwright.panel';
export const PANEL_VERSION = 1;

/**
 * A device's reference designation in the style of IEC 81346-2 letter codes: capital letters then
 * a number (S0, S1, K1, F1, P1, H1, B1, M1).
 */
export const DeviceIdSchema = z
  .string()
  .regex(/^[A-Z]{1,3}[0-9]{1,3}$/, 'a device id is a letter code and a number, like S1, K1 or F1 (IEC 81346)');

/** One contact of one device, by terminal marking: `{ "device": "F1", "contact": "95-96" }`. */
export const ContactRefSchema = z.object({
  device: z.string(),
  contact: z.string(),
});
export type ContactRef = z.infer<typeof ContactRefSchema>;

/** Wiring and naming shared by every device entry. */
const common = {
  id: DeviceIdSchema,
  label: z.string().min(1, 'a device needs a label').max(80),
  /** The PLC input (`%IX<n>`) this device's contact is wired to. */
  feeds: z.string().optional(),
  /** Which of the device's contacts feeds the input; its only (first) contact if omitted. */
  contact: z.string().optional(),
  /** The PLC output (`%QX<n>`) that drives this load (contactor coil, lamp, horn). */
  drivenBy: z.string().optional(),
  /** Hardwired contacts in series with the load, e.g. the overload's 95-96 in a coil circuit. */
  through: z.array(ContactRefSchema).max(8).default([]),
};

export const DeviceSpecSchema = z.discriminatedUnion('kind', [
  z.object({ ...common, kind: z.literal('pushbutton'), params: PushbuttonParamsSchema.default({ form: 'NO', colour: 'black' }) }),
  z.object({ ...common, kind: z.literal('estop'), params: EstopParamsSchema.default({}) }),
  z.object({ ...common, kind: z.literal('selector'), params: SelectorParamsSchema }),
  z.object({ ...common, kind: z.literal('contactor'), params: ContactorParamsSchema.default({ pickUpMs: 25, dropOutMs: 15 }) }),
  z.object({ ...common, kind: z.literal('interlock'), params: InterlockParamsSchema }),
  z.object({ ...common, kind: z.literal('overload'), params: OverloadParamsSchema }),
  z.object({ ...common, kind: z.literal('lamp'), params: LampParamsSchema.default({ colour: 'white' }) }),
  z.object({ ...common, kind: z.literal('horn'), params: HornParamsSchema.default({}) }),
  z.object({ ...common, kind: z.literal('motor'), params: MotorParamsSchema }),
  z.object({ ...common, kind: z.literal('photoeye'), params: PhotoeyeParamsSchema.default({ closesWhen: 'blocked' }) }),
  z.object({ ...common, kind: z.literal('limit'), params: LimitParamsSchema.default({}) }),
]);
export type DeviceSpec = z.infer<typeof DeviceSpecSchema>;

export const PanelLayoutSchema = z.object({
  format: z.literal(PANEL_FORMAT),
  version: z.literal(PANEL_VERSION),
  /** Stable id, e.g. `reversing-conveyor`. */
  id: z.string().regex(/^[a-z0-9][a-z0-9-]{0,63}$/, 'a panel id uses lower-case letters, digits and "-"'),
  title: z.string().min(1).max(200),
  description: z.string().max(5000).default(''),
  /** How many PLC inputs and outputs the trainer has (memory bits are the engine's default). */
  inputs: z.number().int().min(1).max(64).default(8),
  outputs: z.number().int().min(1).max(64).default(6),
  devices: z.array(DeviceSpecSchema).min(1, 'a panel needs at least one device').max(64),
  /** Hardwired contacts in series ahead of every input (the input common). Empty = always live. */
  inputCommon: z.array(ContactRefSchema).max(8).default([]),
  /** Hardwired contacts in series ahead of every output's load (the output common). */
  outputCommon: z.array(ContactRefSchema).max(8).default([]),
});
export type PanelLayout = z.infer<typeof PanelLayoutSchema>;
/** A layout as written in JSON, before defaults. */
export type PanelLayoutInput = z.input<typeof PanelLayoutSchema>;
