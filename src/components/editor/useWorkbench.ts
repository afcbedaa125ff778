/**
 * The workbench of one program, as the program page and a lab page both run it: loading and
 * saving versions (with conflicts), drafts kept while editing and offered back on opening, a guard
 * on every way out while the document is unsaved, and the view state the commands open (history,
 * Structured Text, print, the keyboard sheet, the save dialog). `ProgramWorkbench.vue` draws it;
 * the simulation half is `useWorkbenchSimulation` (in the dock, loaded with the chrome).
 */
import { computed, nextTick, onBeforeUnmount, onMounted, ref, shallowRef, watch, type Ref } from 'vue';
import { onBeforeRouteLeave, onBeforeRouteUpdate } from 'vue-router';
import { useMessage } from 'naive-ui';
import type { Program } from '@shared/ladder/schema';
import type RungCanvas from './RungCanvas.vue';
import type InspectorPanel from './InspectorPanel.vue';
import { useEditorStore } from '@/stores/editor';
import { useDrafts } from './useDrafts';
import { useEditorSurface } from './useEditorSurface';
import { usePersistence } from './usePersistence';

/** How the user answered "leave with unsaved changes?". */
export type LeaveAnswer = 'stay' | 'keep-draft' | 'discard';

export interface WorkbenchOptions {
  programId: () => string;
  canvas: Ref<InstanceType<typeof RungCanvas> | null>;
  inspector: Ref<InstanceType<typeof InspectorPanel> | null>;
  /** View effects that need the page (export, print). */
  exportPng: () => void;
  print: () => void;
  /** A version was saved (the program list and the like may need refreshing). */
  onSaved?: (version: number) => void;
}

export function useWorkbench(options: WorkbenchOptions) {
  const editor = useEditorStore();
  const message = useMessage();
  const persistence = usePersistence(options.programId);
  const drafts = useDrafts({
    programId: options.programId,
    baseVersion: persistence.baseVersion,
    active: () => persistence.state.value === 'ready' && persistence.viewingVersion.value === null,
  });

  const messagesOpen = ref(true);
  const historyOpen = ref(false);
  const stOpen = ref(false);
  const saveOpen = ref(false);
  const keysOpen = ref(false);
  /** The message of the last save asked for: "keep mine" after a conflict saves with it. */
  const saveMessage = ref('');
  /** The open "leave with unsaved changes?" question, answered through `answerLeave`. */
  const leaving = shallowRef<((answer: LeaveAnswer) => void) | null>(null);

  function openSave(): void {
    if (editor.readOnly) return;
    saveMessage.value = '';
    saveOpen.value = true;
  }

  const { dockTab, errorCount, followSimulation } = useEditorSurface({
    canvas: options.canvas,
    inspector: options.inspector,
    effects: {
      save: openSave,
      showStructuredText: () => (stOpen.value = true),
      exportPng: options.exportPng,
      print: options.print,
      toggleMessages: () => (messagesOpen.value = !messagesOpen.value),
      showHistory: () => (historyOpen.value = true),
      showKeys: () => (keysOpen.value = true),
    },
    // Through the command, so a read-only version refuses it as the toolbar does.
    onSaveKey: () => editor.dispatch('save'),
  });

  // An edit that would pass a document size limit is not made; say why where the user is looking.
  watch(
    () => editor.refusedEdit,
    (refused) => {
      if (refused) message.warning(refused.message, { duration: 6000 });
    },
  );

  /** Load the program, then offer a draft newer than its head. */
  async function open(): Promise<void> {
    await persistence.load();
    if (persistence.state.value !== 'ready' || !persistence.head.value) return;
    await drafts.check(persistence.head.value.createdAt, editor.doc);
  }

  /** Save what is on screen as a version; 'saved', 'conflict' (the dialog opens) or why not. */
  async function saveVersion(versionMessage: string): Promise<'saved' | 'conflict' | string> {
    saveMessage.value = versionMessage;
    const outcome = await persistence.save(versionMessage);
    if (outcome === 'saved') {
      drafts.saved();
      options.onSaved?.(persistence.baseVersion.value);
    }
    return outcome;
  }

  async function submitSave(versionMessage: string): Promise<void> {
    const outcome = await saveVersion(versionMessage);
    if (outcome === 'saved') message.success(`Saved as version ${persistence.baseVersion.value}.`);
    else if (outcome !== 'conflict') message.error(outcome, { duration: 8000 });
  }

  async function keepMine(): Promise<void> {
    const outcome = await persistence.keepMine(saveMessage.value.trim());
    if (outcome === 'saved') {
      drafts.saved();
      options.onSaved?.(persistence.baseVersion.value);
      message.success(`Your changes are saved as version ${persistence.baseVersion.value}.`);
    } else if (outcome !== 'conflict') message.error(outcome);
  }

  async function openVersion(n: number): Promise<void> {
    try {
      await drafts.flush();
      await persistence.openVersion(n);
    } catch (error) {
      message.error(error instanceof Error ? error.message : String(error));
    }
  }

  async function restoreVersion(n: number): Promise<void> {
    if (editor.dirty && (await askLeave()) === 'stay') return;
    const problem = await persistence.restore(n);
    if (problem) message.error(problem);
    else {
      drafts.saved();
      message.success(`Version ${n} restored as version ${persistence.baseVersion.value}.`);
    }
  }

  /** Ask what to do with unsaved changes; the draft is on the server before the question. */
  async function askLeave(): Promise<LeaveAnswer> {
    await drafts.flush();
    return new Promise((resolve) => (leaving.value = resolve));
  }

  function answerLeave(answer: LeaveAnswer): void {
    const resolve = leaving.value;
    leaving.value = null;
    resolve?.(answer);
  }

  const unsaved = () => editor.dirty && !editor.readOnly && persistence.viewingVersion.value === null;

  async function guard(): Promise<boolean> {
    if (!unsaved()) return true;
    const answer = await askLeave();
    if (answer === 'stay') return false;
    if (answer === 'discard') await drafts.discard();
    return true;
  }
  onBeforeRouteLeave(guard);
  onBeforeRouteUpdate(guard);

  /** Reload or closing the tab: the browser asks; the draft goes out meanwhile. */
  function onBeforeUnload(event: BeforeUnloadEvent): void {
    if (!unsaved()) return;
    drafts.sendOnLeave();
    event.preventDefault();
    event.returnValue = '';
  }
  onMounted(() => window.addEventListener('beforeunload', onBeforeUnload));
  onBeforeUnmount(() => window.removeEventListener('beforeunload', onBeforeUnload));

  /** The draft's time as a person reads it: "14:02", or with the date when not today. */
  function when(iso: string): string {
    const date = new Date(iso);
    const time = date.toLocaleTimeString(undefined, { hour: '2-digit', minute: '2-digit' });
    return date.toDateString() === new Date().toDateString() ? time : `${date.toLocaleDateString()} ${time}`;
  }

  const offerText = computed(() => {
    const offer = drafts.offer.value;
    return offer ? `You have unsaved changes from ${when(offer.updatedAt)}` : '';
  });

  async function restoreDraft(): Promise<void> {
    drafts.restore();
    await nextTick();
    options.canvas.value?.focus();
  }

  /** The document the program page shows in its print sheet and title. */
  const doc = computed<Program>(() => editor.doc);

  watch(options.programId, () => void open());

  return {
    persistence,
    drafts,
    doc,
    dockTab,
    errorCount,
    followSimulation,
    messagesOpen,
    historyOpen,
    stOpen,
    saveOpen,
    keysOpen,
    leaving,
    offerText,
    open,
    openSave,
    saveVersion,
    submitSave,
    keepMine,
    openVersion,
    restoreVersion,
    answerLeave,
    restoreDraft,
    when,
  };
}
