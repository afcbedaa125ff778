/**
 * What the workbench and the lab workbench wire up the same way around the rung editor: the dock
 * tab, the error count, the view effects the commands call (zoom, text form, Enter/comment editing
 * in the inspector), and Ctrl/Cmd+S from anywhere on the page.
 */
import { computed, onBeforeUnmount, onMounted, ref, type Ref } from 'vue';
import type { EditorEffects } from '@/editor/commands/types';
import type RungCanvas from '@/components/editor/RungCanvas.vue';
import type InspectorPanel from '@/components/editor/InspectorPanel.vue';
import { useEditorStore } from '@/stores/editor';

/** The effects that differ between the two surfaces, and what Ctrl/Cmd+S does on each. */
export interface EditorSurfaceOptions {
  /** The template refs of the surface's canvas and inspector (declared in the component, bound by `ref=`). */
  canvas: Ref<InstanceType<typeof RungCanvas> | null>;
  inspector: Ref<InstanceType<typeof InspectorPanel> | null>;
  effects: Pick<EditorEffects, 'save' | 'toggleMessages'> & Partial<EditorEffects>;
  /** Called on Ctrl/Cmd+S, even while a form field has the focus (the browser's own save is stopped). */
  onSaveKey: () => void;
}

/** Which tab of the right dock is showing. */
export type DockTab = 'inspector' | 'tags';

/** Sets the editor's effects and the save key for one editing surface; call once in `setup`. */
export function useEditorSurface(options: EditorSurfaceOptions) {
  const editor = useEditorStore();
  const { canvas, inspector } = options;
  const dockTab = ref<DockTab>('inspector');
  const errorCount = computed(() => editor.diagnostics.filter((d) => d.severity === 'error').length);

  editor.setEffects({
    zoomBy: (f) => canvas.value?.zoomBy(f),
    zoomReset: () => canvas.value?.zoomReset(),
    fitToView: () => canvas.value?.fitToView(),
    toggleTextForm: () => editor.toggleTextForm(),
    // Enter on an element edits it in the inspector.
    editSelection: () => {
      dockTab.value = 'inspector';
      void inspector.value?.focusFirst();
    },
    editRungComment: () => {
      dockTab.value = 'inspector';
      void inspector.value?.focusRungComment();
    },
    ...options.effects,
  });

  function onSaveKey(event: KeyboardEvent): void {
    if ((event.ctrlKey || event.metaKey) && event.key.toLowerCase() === 's') {
      event.preventDefault();
      options.onSaveKey();
    }
  }
  onMounted(() => window.addEventListener('keydown', onSaveKey));
  onBeforeUnmount(() => window.removeEventListener('keydown', onSaveKey));

  return { dockTab, errorCount };
}
