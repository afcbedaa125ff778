import { describe, expect, it, vi } from 'vitest';
import { computed, effectScope, ref } from 'vue';
import { createPinia, setActivePinia } from 'pinia';
import { layoutProgram } from '@/editor/layout';
import { threeWireProgram } from '@/simulation/demoPrograms';
import { DARK_PALETTE, LIGHT_PALETTE } from '@/theme';
import { useDeferredLiveLayer } from '@/components/editor/useDeferredLiveLayer';

/**
 * The first import of the live layer's modules (the engine, the field models) is compiled cold by
 * the test runner: on a loaded machine it took over the 1 s `vi.waitFor` allows by default.
 */
const LOADED = { timeout: 10_000 };

function deferredLayer() {
  setActivePinia(createPinia());
  const layout = layoutProgram(threeWireProgram());
  const palette = ref(LIGHT_PALETTE);
  const scope = effectScope();
  const live = scope.run(() => useDeferredLiveLayer({ rungs: ref(layout.rungs), layout: computed(() => layout), palette }))!;
  return { scope, live, palette };
}

describe('the rung canvas’s deferred live layer', () => {
  it('has no live shape until a rung is painted, then loads the live layer once', async () => {
    const { scope, live } = deferredLayer();
    expect(live.shape()).toBeUndefined();
    live.request();
    live.request();
    await vi.waitFor(() => expect(live.shape()?.sceneFunc).toBeTypeOf('function'), LOADED);
    scope.stop();
  });

  it('hands the Konva layer given before the code arrived to the live layer', async () => {
    const { scope, live, palette } = deferredLayer();
    const draw = vi.fn();
    live.setLayer({ getNode: () => ({ draw }) });
    live.request();
    await vi.waitFor(() => expect(live.shape()).toBeDefined(), LOADED);
    expect(draw).not.toHaveBeenCalled();
    // A change of colours redraws the live layer: through the handle given before the code was there.
    palette.value = DARK_PALETTE;
    await vi.waitFor(() => expect(draw).toHaveBeenCalledTimes(1));
    scope.stop();
  });

  it('loads nothing into a canvas that has gone', async () => {
    const { scope, live } = deferredLayer();
    live.request();
    scope.stop();
    await new Promise((resolve) => setTimeout(resolve, 50));
    await import('@/simulation/useLiveLayer');
    expect(live.shape()).toBeUndefined();
  });
});
