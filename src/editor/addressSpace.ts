/**
 * The address space of a field panel as the editor validates against it: its own inputs and
 * outputs, and the memory bits every panel offers (the same figures `createSimulation` compiles
 * with, so the editor and the simulation never disagree on an address).
 */
import { DEFAULT_ADDRESS_SPACE, type AddressSpace } from '@shared/ladder/addresses';
import type { Program } from '@shared/ladder/schema';
import type { PanelLayout } from '@shared/field/layout';

export function panelAddressSpace(panel: Pick<PanelLayout, 'inputs' | 'outputs'>): AddressSpace {
  return { inputs: panel.inputs, outputs: panel.outputs, memory: DEFAULT_ADDRESS_SPACE.memory };
}

/** True while nothing is drawn: every rung is empty (a new program's one empty rung). */
export function isBlank(doc: Program): boolean {
  return doc.rungs.every((r) => r.network.items.length === 0);
}
