/**
 * The live view for the rung canvas: per element id, energised or not, a contact's state, a coil's
 * variable and a block's figures, from the running simulation's last scan (null while nothing has
 * run, so the editor draws the plain ink drawing). Also the colours to draw them with.
 */
import { computed, type ComputedRef } from 'vue';
import type { Palette } from '@/theme';
import { useSimulationStore } from '@/stores/simulation';
import type { ElementLive, LiveView } from './liveView';

export type { BlockLive, ElementLive, LiveView } from './liveView';

/** The simulation store's live view (recomputed after every scan batch). */
export function useLiveView(): ComputedRef<LiveView | null> {
  const store = useSimulationStore();
  return computed(() => store.liveView);
}

/** How a conductor is drawn: amber with a dash that flows left to right when energised. */
export interface ConductorStyle {
  stroke: string;
  /** Konva/SVG dash pattern; empty for a solid line. */
  dash: number[];
  /** True when the dash should be animated (offset decreasing, so the dashes move rightwards). */
  flowing: boolean;
}

/** The dash of an energised conductor, px. */
export const FLOW_DASH = [10, 6];
/** How fast the dash moves, px per second: slow, so it reads as current, not as alarm. */
export const FLOW_SPEED_PX_S = 24;

/**
 * The style of a conductor or symbol: `null` live state (no simulation) draws in ink; energised in
 * the palette's amber with the flow; de-energised slate grey.
 */
export function conductorStyle(live: ElementLive | undefined | null, side: 'in' | 'out', palette: Palette): ConductorStyle {
  if (live == null) return { stroke: palette.ink, dash: [], flowing: false };
  const on = side === 'in' ? live.left : live.right;
  return on ? { stroke: palette.energised, dash: FLOW_DASH, flowing: true } : { stroke: palette.deEnergised, dash: [], flowing: false };
}

/** The dash offset at `ms` of wall time, for the flow animation. */
export function flowDashOffset(ms: number): number {
  const period = FLOW_DASH[0]! + FLOW_DASH[1]!;
  return -((ms / 1000) * FLOW_SPEED_PX_S) % period;
}

/** A block's figures as one short line: `ET 1.20 s / PT 5.00 s`, `CV 2 / PV 3`. */
export function blockFigures(live: ElementLive | undefined | null): string {
  const b = live?.block;
  if (!b) return '';
  const seconds = (ms: number): string => `${(ms / 1000).toFixed(2)} s`;
  if (b.kind === 'timer') return `ET ${seconds(b.et)} / PT ${b.pt === null ? '?' : seconds(b.pt)}`;
  if (b.kind === 'counter') return `CV ${b.cv} / PV ${b.pv === null ? '?' : b.pv}`;
  return `Q ${b.q ? 'TRUE' : 'FALSE'}`;
}
