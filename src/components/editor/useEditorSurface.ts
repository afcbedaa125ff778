/**
 * What every editing surface wires up the same way around the rung editor: the dock tab, the error
 * count, the view effects the commands call (zoom, text form, Enter/comment editing in the
 * inspector), and the page's own keys: Ctrl/Cmd+S from anywhere, the other `page` commands (`?`)
 * from anywhere outside a text field. Editor keys are the canvas's and the palette's business.
 *
 * The dock opens on the field panel. It turns to the inspector when an element is edited (Enter,
 * double-click) or inserted (its operand is to be typed next), and back to the panel when the
 * simulation starts running: editing shows the element, running shows what the student operates.
 */
import { computed, getCurrentScope, onBeforeUnmount, onMounted, ref, watch, type Ref } from 'vue';
import { allIds } from '@shared/ladder/walk';
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
export type DockTab = 'panel' | 'io' | 'inspector' | 'tags' | 'proof';

/** Sets the editor's effects and the save key for one editing surface; call once in `setup`. */
export function useEditorSurface(options: EditorSurfaceOptions) {
  const editor = useEditorStore();
  const { canvas, inspector } = options;
  const dockTab = ref<DockTab>('panel');
  const errorCount = computed(() => editor.diagnostics.filter((d) => d.severity === 'error').length);

  // An edit that leaves one element selected that the document before it did not have inserted it.
  // Synchronous, so the selection read is the one that came with this very document (a load
  // followed by a selection in the same tick is not an insertion).
  watch(
    () => editor.doc,
    (doc, previous) => {
      const selection = editor.selection;
      if (previous === undefined || selection.kind !== 'elements' || selection.ids.length !== 1) return;
      const id = selection.ids[0]!;
      if (!allIds(previous).includes(id) && allIds(doc).includes(id)) dockTab.value = 'inspector';
    },
    { flush: 'sync' },
  );
  const scope = getCurrentScope();
  let following: Promise<void> | null = null;
  /**
   * From now on the dock tab follows the simulation. Its store brings the engine and the field
   * models with it (over 130 kB of code, evaluated before the first rungs when it was imported
   * here statically, or even lazily at setup), so the surface calls this once its rungs are on
   * screen: the workbench does with the rest of its chrome, which holds the dock that runs one.
   */
  function followSimulation(): Promise<void> {
    following ??= import('@/stores/simulation').then(({ useSimulationStore }) => {
      if (!scope?.active) return;
      scope.run(() => {
        const simulation = useSimulationStore();
        watch(
          () => simulation.mode,
          (mode) => {
            if (mode === 'running' && (dockTab.value === 'inspector' || dockTab.value === 'tags')) dockTab.value = 'panel';
          },
        );
      });
    });
    return following;
  }

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

  return { dockTab, errorCount, followSimulation };
}
