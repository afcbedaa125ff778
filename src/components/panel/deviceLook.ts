/**
 * How the panel draws devices: IEC 60073 colours for actuators and lamps (IEC 60204-1 10.2.1 and
 * 10.3.2 give the meanings; the layout chooses the colour), the section of the enclosure each kind
 * sits in, and the props every device component takes.
 */
import type { Colour, DeviceKind, DeviceSpec, DeviceView } from '@shared/field';
import type { PanelControl } from '@/simulation/panelKeys';

/** Actuator body colours (our own shades of the IEC 60073 colours). */
export const ACTUATOR_COLOURS = {
  red: '#c62828',
  yellow: '#f2c200',
  green: '#2e7d32',
  blue: '#1565c0',
  white: '#f1f1ee',
  grey: '#9aa0a6',
  black: '#26282c',
} as const satisfies Record<Colour, string>;

/** A lamp's lens when lit (bright) and dark (dim), and the glow around a lit lens. */
export const LAMP_COLOURS = {
  red: { lit: '#ff4b3e', dark: '#5c1f1c', glow: 'rgba(255,75,62,0.75)' },
  yellow: { lit: '#ffc21a', dark: '#5a4712', glow: 'rgba(255,194,26,0.75)' },
  green: { lit: '#39e36b', dark: '#1d4a2a', glow: 'rgba(57,227,107,0.7)' },
  blue: { lit: '#4aa3ff', dark: '#1b3552', glow: 'rgba(74,163,255,0.7)' },
  white: { lit: '#fffdf0', dark: '#55575a', glow: 'rgba(255,253,240,0.8)' },
  grey: { lit: '#d9dde2', dark: '#4a4d52', glow: 'rgba(217,221,226,0.7)' },
  black: { lit: '#9aa0a6', dark: '#202225', glow: 'rgba(154,160,166,0.5)' },
} as const satisfies Record<Colour, { lit: string; dark: string; glow: string }>;

/** Text on an actuator of that colour stays readable. */
export const LABEL_ON = {
  red: '#fff',
  yellow: '#222',
  green: '#fff',
  blue: '#fff',
  white: '#222',
  grey: '#222',
  black: '#fff',
} as const satisfies Record<Colour, string>;

/** Where on the panel a kind of device sits. */
export type PanelSection = 'operator' | 'indicators' | 'gear' | 'field';

export const SECTION_OF = {
  estop: 'operator',
  pushbutton: 'operator',
  selector: 'operator',
  lamp: 'indicators',
  horn: 'indicators',
  contactor: 'gear',
  interlock: 'gear',
  overload: 'gear',
  motor: 'field',
  photoeye: 'field',
  limit: 'field',
} as const satisfies Record<DeviceKind, PanelSection>;

export const SECTION_TITLES = {
  operator: 'Operator station',
  indicators: 'Indicators',
  gear: 'Control gear (inside the enclosure)',
  field: 'Field',
} as const satisfies Record<PanelSection, string>;

/** What every device component is given. */
export interface DeviceProps {
  view: DeviceView;
  spec: DeviceSpec;
  /** The key bound to each of its controls. */
  keys: Partial<Record<PanelControl, string>>;
  /** A momentary device held down hands-free (pin toggle or modifier-click). */
  pinned?: boolean;
}

/** `(key 2)` for an accessible name, '' when unbound. */
export function keyNote(key: string | undefined): string {
  return key ? ` (key ${key.toUpperCase()})` : '';
}
