/**
 * The panel a lab runs on, from the lab's `panel` field: a built-in layout by id, or a custom
 * layout checked by the shared layout parser. Errors come back located (`devices[3].feeds: …`),
 * for the message under the JSON field.
 */
import type { LabPanel } from '@shared/api/labs';
import { builtInPanel, parsePanelLayout, REVERSING_CONVEYOR_INPUT, type PanelLayout } from '@shared/field';
import { PROGRAM_FORMAT, PROGRAM_VERSION, type Program } from '@shared/ladder/schema';

export type PanelResult = { ok: true; panel: PanelLayout } | { ok: false; errors: string[] };

/** The layout of a lab's panel choice. */
export function resolveLabPanel(choice: LabPanel): PanelResult {
  if (choice.kind === 'builtIn') {
    const panel = builtInPanel(choice.id);
    return panel ? { ok: true, panel } : { ok: false, errors: [`there is no built-in panel "${choice.id}"`] };
  }
  const parsed = parsePanelLayout(choice.layout);
  return parsed.ok ? { ok: true, panel: parsed.value } : { ok: false, errors: parsed.errors };
}

/** JSON text typed in the layout editor → a layout or every problem, never a throw. */
export function readLayoutJson(text: string): PanelResult & { json?: unknown } {
  let json: unknown;
  try {
    json = JSON.parse(text);
  } catch (error) {
    return { ok: false, errors: [`The JSON cannot be read: ${error instanceof Error ? error.message : String(error)}`] };
  }
  const parsed = parsePanelLayout(json);
  return parsed.ok ? { ok: true, panel: parsed.value, json } : { ok: false, errors: parsed.errors, json };
}

/** A starting point for a custom layout: the default panel as JSON, renamed so it is a different layout. */
export function customLayoutTemplate(): string {
  return `${JSON.stringify({ ...REVERSING_CONVEYOR_INPUT, id: 'custom-panel', title: 'Custom panel' }, null, 2)}\n`;
}

/** A program with no rungs: the panel preview runs it so the panel shows at rest. */
export function emptyProgram(title = ''): Program {
  return { format: PROGRAM_FORMAT, version: PROGRAM_VERSION, title, description: '', tags: [], rungs: [] };
}
