/**
 * The rung canvas's live layer (`useLiveLayer`), loaded once the canvas has painted a rung rather
 * with the canvas: it brings the simulation store, the engine and the field devices with it, whose
 * evaluation held the workbench's first paint back. Until a rung is on screen there is nothing for
 * the live layer to paint over, and no simulation can run before the workbench's controls (loaded
 * after the first paint too) are there.
 */
import { effectScope, onScopeDispose, shallowRef, type Ref } from 'vue';
import type { ProgramLayout, RungLayout } from '@/editor/layoutTypes';
import type { Palette } from '@/theme';
import type { useLiveLayer } from '@/simulation/useLiveLayer';

type LiveLayer = ReturnType<typeof useLiveLayer>;

export function useDeferredLiveLayer(input: { rungs: Ref<readonly RungLayout[]>; layout: Ref<ProgramLayout>; palette: Ref<Palette> }) {
  /** Owned by the calling component's scope: stopped (with the layer's watcher) when it unmounts. */
  const scope = effectScope();
  const live = shallowRef<LiveLayer | null>(null);
  let layerEl: unknown = null;
  let requested = false;
  let disposed = false;
  onScopeDispose(() => {
    disposed = true;
    scope.stop();
  });

  /** Loads the live layer once; called when the canvas paints a rung. */
  function request(): void {
    if (requested) return;
    requested = true;
    void import('@/simulation/useLiveLayer').then(({ useLiveLayer }) => {
      if (disposed) return;
      const layer = scope.run(() => useLiveLayer(input));
      if (!layer) return;
      layer.setLayer(layerEl);
      live.value = layer;
    });
  }

  /** For the live Konva layer's function ref (`:ref="setLayer"`); kept until the layer code is there. */
  const setLayer = (el: unknown): void => {
    layerEl = el;
    live.value?.setLayer(el);
  };
  return { request, setLayer, shape: () => live.value?.shape };
}
