/**
 * The interactive overlay, drawn on its own layer above the static rungs: selection outlines, drop
 * slots (all of them faintly while dragging, the targeted one lit), the keyboard's slot, and a red
 * underline under every element a diagnostic points at. Pure: program coordinates in, marks out.
 */
import type { Diagnostic } from '@shared/ladder/diagnostics';
import { GUTTER_W, SLOT_MARK_R } from './geometry';
import type { ProgramLayout, RungLayout, SlotTarget } from './layoutTypes';
import { sameSlot, type Selection } from './selection';

export type OverlayMark =
  | { mark: 'selected-element'; key: string; x: number; y: number; w: number; h: number }
  | { mark: 'selected-rung'; key: string; x: number; y: number; w: number; h: number }
  | { mark: 'slot'; key: string; x: number; y: number; r: number; lit: boolean }
  | { mark: 'error'; key: string; points: number[]; severity: Diagnostic['severity'] };

export interface OverlayInput {
  selection: Selection;
  diagnostics: readonly Diagnostic[];
  /** True while a palette item is dragged over the canvas: every slot shows. */
  dragging: boolean;
  /** The slot under the pointer while dragging. */
  hoverSlot: SlotTarget | null;
}

/** The overlay marks for the rungs on screen. */
export function overlayMarks(layout: ProgramLayout, visible: readonly RungLayout[], input: OverlayInput): OverlayMark[] {
  const marks: OverlayMark[] = [];
  const selectedElements = new Set(input.selection.kind === 'elements' ? input.selection.ids : []);
  const selectedRungs = new Set(input.selection.kind === 'rungs' ? input.selection.ids : []);
  const flagged = new Map<string, Diagnostic['severity']>();
  const flaggedRungs = new Map<string, Diagnostic['severity']>();
  for (const d of input.diagnostics) {
    if (d.elementId !== null) flagged.set(d.elementId, flagged.get(d.elementId) === 'error' ? 'error' : d.severity);
    else if (d.rungId !== null) flaggedRungs.set(d.rungId, flaggedRungs.get(d.rungId) === 'error' ? 'error' : d.severity);
  }
  for (const rung of visible) {
    if (selectedRungs.has(rung.rungId)) {
      marks.push({ mark: 'selected-rung', key: `rung:${rung.rungId}`, x: 2, y: rung.top + 2, w: layout.width - 4, h: rung.height - 4 });
    }
    const rungSeverity = flaggedRungs.get(rung.rungId);
    if (rungSeverity) {
      const y = rung.top + rung.wireY + 12;
      marks.push({ mark: 'error', key: `rung-error:${rung.rungId}`, points: [12, y, GUTTER_W - 8, y], severity: rungSeverity });
    }
    for (const box of rung.elements) {
      const top = rung.top + box.y;
      if (selectedElements.has(box.id)) {
        marks.push({ mark: 'selected-element', key: `el:${box.id}`, x: box.x + 2, y: top + 1, w: box.width - 4, h: box.height - 2 });
      }
      const severity = flagged.get(box.id);
      if (severity) {
        // Under the symbol (or under a block's box), clear of the comment line.
        const y = box.element.kind === 'block' ? top + box.height - 20 : rung.top + box.wireY + 19;
        marks.push({ mark: 'error', key: `error:${box.id}`, points: [box.x + 10, y, box.x + box.width - 10, y], severity });
      }
    }
    const keyboardSlot = input.selection.kind === 'slot' ? input.selection.slot : null;
    for (const slot of rung.slots) {
      const lit = (input.hoverSlot !== null && sameSlot(slot.target, input.hoverSlot)) || (keyboardSlot !== null && sameSlot(slot.target, keyboardSlot));
      if (!lit && !input.dragging) continue;
      marks.push({ mark: 'slot', key: `slot:${slot.key}`, x: slot.x, y: rung.top + slot.y, r: lit ? SLOT_MARK_R + 2 : SLOT_MARK_R - 1, lit });
    }
  }
  return marks;
}
