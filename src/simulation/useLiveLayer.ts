/**
 * The live layer of the rung canvas: the running simulation's power flow (`livePaint.ts`) painted
 * on a Konva layer of its own above the static rungs, so a refresh of the live view never repaints
 * the static drawing (its many labels are the costly part to rasterise).
 *
 * The layer is drawn synchronously, in the animation frame that refreshed the view, rather than
 * through Konva's `batchDraw` (which waits for the next frame): every change of the page then lands
 * in the same frame, and the frames in between leave the page untouched (in a software-painted
 * browser every changed frame costs a few ms of painting). It is drawn when a visible rung's marks
 * changed, or while a visible conductor is energised: its dashes flow with wall time and move at
 * each refresh (20 Hz while running). The lead-in from the live left rail is energised on every
 * rung, so while running it is drawn at each refresh; paused, the view does not change and the
 * layer is left alone, its dashes standing still.
 */
import { watch, type Ref } from 'vue';
import type { Context } from 'konva/lib/Context';
import type { Layer } from 'konva/lib/Layer';
import type { ProgramLayout, RungLayout } from '@/editor/layoutTypes';
import type { Palette } from '@/theme';
import { liveRungMarks, paintLiveMarks, type LiveMark } from './livePaint';
import { sameData } from './sharing';
import { useLiveView } from './useLiveView';

/** What the layer shows for one visible rung; `marks` is the previous refresh's array when equal. */
export interface PaintedRung {
  rung: RungLayout;
  marks: readonly LiveMark[];
  flows: boolean;
}

/**
 * The marks for the visible rungs, sharing the previous refresh's arrays where unchanged, and
 * whether the layer must be drawn again (something changed, or a conductor is flowing and the flow
 * moves — it stands still for readers who ask for reduced motion). Pure.
 */
export function nextPaint(
  previous: readonly PaintedRung[],
  rungs: readonly RungLayout[],
  marksOf: ((rung: RungLayout) => LiveMark[]) | null,
  flowMoves = true,
): { painted: PaintedRung[]; redraw: boolean } {
  if (marksOf === null) return { painted: [], redraw: previous.length > 0 };
  const before = new Map(previous.map((p) => [p.rung, p.marks] as const));
  const painted = rungs.map((rung): PaintedRung => {
    const fresh = marksOf(rung);
    const old = before.get(rung);
    const marks = old !== undefined && sameData(old, fresh) ? old : fresh;
    return { rung, marks, flows: marks.some((m) => m.kind === 'line' && m.flow) };
  });
  const changed = painted.length !== previous.length || painted.some((p, i) => p.rung !== previous[i]?.rung || p.marks !== previous[i]?.marks);
  return { painted, redraw: changed || (flowMoves && painted.some((p) => p.flows)) };
}

/** A handle on a vue-konva layer component (`<KLayer ref=…>`). */
type LayerHandle = { getNode(): Layer };

export function useLiveLayer(input: { rungs: Ref<readonly RungLayout[]>; layout: Ref<ProgramLayout>; palette: Ref<Palette> }) {
  const live = useLiveView();
  const flowMoves = globalThis.matchMedia?.('(prefers-reduced-motion: reduce)').matches !== true;
  let layer: LayerHandle | null = null;
  let painted: readonly PaintedRung[] = [];

  /** One shape paints every visible rung's marks; its config never changes, the layer is redrawn instead. */
  const shape = {
    listening: false,
    perfectDrawEnabled: false,
    sceneFunc: (ctx: Context) => {
      const raw = ctx._context;
      const now = flowMoves ? performance.now() : 0;
      for (const p of painted) {
        raw.save();
        raw.translate(0, p.rung.top);
        paintLiveMarks(raw, p.marks, input.palette.value, now);
        raw.restore();
      }
    },
  };

  watch(
    [live, input.rungs, input.layout, input.palette],
    ([view, rungs, layout], old) => {
      const paletteChanged = old !== undefined && old[3] !== input.palette.value;
      const next = nextPaint(painted, rungs, view ? (rung) => liveRungMarks(rung, layout, view) : null, flowMoves);
      painted = next.painted;
      if (next.redraw || paletteChanged) layer?.getNode().draw();
    },
    // Immediate: the canvas loads this layer late (`useDeferredLiveLayer`), maybe while a simulation already runs.
    { flush: 'post', immediate: true },
  );

  /** For the layer's function ref (`:ref="setLayer"`). */
  const setLayer = (el: unknown): void => {
    layer = el && typeof (el as LayerHandle).getNode === 'function' ? (el as LayerHandle) : null;
  };
  return { setLayer, shape };
}
