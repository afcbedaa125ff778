/**
 * What every editing surface wires up the same way around the rung editor: the dock tab, the error
 * count, the view effects the commands call (zoom, text form, Enter/comment editing in the
 * inspector), and the page's own keys: Ctrl/Cmd+S from anywhere, the other `page` commands (`?`)
 * from anywhere outside a text field. Editor keys are the canvas's and the palette's business.
 */
import { computed, onBeforeUnmount, onMounted, ref, type Ref } from 'vue';
import { command, commandForKey } from '@/editor/commands/registry';
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

/** True when a key goes to a text field (or a control that takes typing), where letters are text. */
function typingIn(target: EventTarget | null): boolean {
  const el = target as Partial<Pick<HTMLElement, 'closest'>> | null;
  return typeof el?.closest === 'function' && el.closest('input, textarea, select, [contenteditable="true"], [role="textbox"]') !== null;
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

  function onPageKey(event: KeyboardEvent): void {
    if ((event.ctrlKey || event.metaKey) && event.key.toLowerCase() === 's') {
      event.preventDefault();
      options.onSaveKey();
      return;
    }
    if (event.defaultPrevented || typingIn(event.target)) return;
    const found = commandForKey(event);
    if (!found || (command(found.name).area ?? 'editor') !== 'page') return;
    event.preventDefault();
    editor.dispatch(found.name, found.args);
  }
  onMounted(() => window.addEventListener('keydown', onPageKey));
  onBeforeUnmount(() => window.removeEventListener('keydown', onPageKey));

  return { dockTab, errorCount };
}
