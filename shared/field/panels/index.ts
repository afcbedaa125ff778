/** The panel layouts that ship with Rungwright, by id. */
import type { PanelLayout } from '../layout';
import { parsePanelLayout } from '../parseLayout';
import { REVERSING_CONVEYOR_INPUT } from './reversingConveyor';

function builtIn(input: unknown): PanelLayout {
  const parsed = parsePanelLayout(input);
  // A built-in layout that does not validate is a programming error caught by the unit tests.
  if (!parsed.ok) throw new Error(`built-in panel layout is invalid: ${parsed.errors.join('; ')}`);
  return parsed.value;
}

/** The default panel (docs/names-and-rules.md), validated and with defaults filled in. */
export const REVERSING_CONVEYOR: PanelLayout = builtIn(REVERSING_CONVEYOR_INPUT);

export const DEFAULT_PANEL_ID = 'reversing-conveyor';

export const BUILT_IN_PANELS: Readonly<Record<string, PanelLayout>> = Object.freeze({
  [REVERSING_CONVEYOR.id]: REVERSING_CONVEYOR,
});

/** A built-in panel by id, or undefined. */
export function builtInPanel(id: string): PanelLayout | undefined {
  return Object.hasOwn(BUILT_IN_PANELS, id) ? BUILT_IN_PANELS[id] : undefined;
}

export { CONVEYOR_FLA_A, REVERSING_CONVEYOR_INPUT } from './reversingConveyor';
