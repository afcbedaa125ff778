/**
 * Drafts: the document on screen kept on the server as the user's draft a few seconds after the
 * last edit (never as a version), so a closed tab or a crashed browser loses at most those
 * seconds. When a program is opened and the server holds a draft newer than its head, the draft
 * is offered back ("Restore" or "Discard"); until the offer is answered nothing overwrites it.
 * A saved version clears the draft on the server; undoing back to the saved document discards it.
 */
import { onBeforeUnmount, ref, shallowRef, watch, type Ref } from 'vue';
import type { Draft } from '@shared/api/drafts';
import { parseProgram } from '@shared/ladder/restore';
import type { Program } from '@shared/ladder/schema';
import { draftsApi, type DraftsApi } from '@/api/drafts';
import { describeFailure } from '@/api/http';
import { useEditorStore } from '@/stores/editor';

/** Quiet time after the last edit before the draft is sent, ms. */
export const DRAFT_DELAY_MS = 3000;

/** A draft found on opening, waiting for the user's answer. */
export interface DraftOffer {
  doc: Program;
  baseVersion: number;
  /** When it was last kept (ISO). */
  updatedAt: string;
}

export interface DraftTimers {
  set(run: () => void, ms: number): unknown;
  clear(handle: unknown): void;
}

export interface DraftOptions {
  programId: () => string;
  /** The version the editor's document is based on (the persistence's; a restored draft sets it). */
  baseVersion: Ref<number>;
  /** False while nothing may be kept (a version opened read-only, the program not loaded). */
  active: () => boolean;
  api?: DraftsApi;
  timers?: DraftTimers;
}

const browserTimers: DraftTimers = { set: (run, ms) => setTimeout(run, ms), clear: (h) => clearTimeout(h as ReturnType<typeof setTimeout>) };

export function useDrafts(options: DraftOptions) {
  const editor = useEditorStore();
  const api = options.api ?? draftsApi;
  const timers = options.timers ?? browserTimers;
  const offer = shallowRef<DraftOffer | null>(null);
  /** When the server last kept the document on screen (ISO), or null. */
  const keptAt = ref<string | null>(null);
  /** The last autosave that failed, in words ('' when fine). */
  const problem = ref('');
  /** The document the server holds as the draft (to skip sending it twice). */
  let sentDoc: Program | null = null;
  /** Whether the server may hold a draft of this program from us (so undo-to-saved discards it). */
  let serverHasDraft = false;
  let timer: unknown = null;

  function cancel(): void {
    if (timer !== null) timers.clear(timer);
    timer = null;
  }

  function canKeep(): boolean {
    return options.active() && !editor.readOnly && offer.value === null;
  }

  /** Send the document on screen now (a pending autosave, the leave guard). */
  async function flush(): Promise<void> {
    cancel();
    if (!canKeep() || !editor.dirty) return;
    const doc = editor.doc;
    if (doc === sentDoc) return;
    try {
      const kept = await api.save(options.programId(), { baseVersion: options.baseVersion.value, document: doc });
      sentDoc = doc;
      serverHasDraft = true;
      keptAt.value = kept?.updatedAt ?? null;
      problem.value = '';
    } catch (error) {
      problem.value = `The draft could not be kept: ${describeFailure(error)}`;
    }
  }

  watch(
    () => [editor.doc, editor.dirty] as const,
    ([, dirty]) => {
      if (!canKeep()) return;
      cancel();
      if (dirty) timer = timers.set(() => void flush(), DRAFT_DELAY_MS);
      else if (serverHasDraft) void discardOnServer();
    },
  );

  async function discardOnServer(): Promise<void> {
    serverHasDraft = false;
    sentDoc = null;
    keptAt.value = null;
    try {
      await api.discard(options.programId());
    } catch {
      // A draft left behind is offered on the next opening only if newer than the head; nothing is lost.
    }
  }

  /**
   * After the program is loaded: look for a draft newer than the head (`headCreatedAt`). One that
   * is older, or that no longer parses, is dropped; an equal document needs no offer.
   */
  async function check(headCreatedAt: string, headDoc: Program): Promise<void> {
    offer.value = null;
    keptAt.value = null;
    sentDoc = null;
    let draft: Draft | null;
    try {
      draft = await api.get(options.programId());
    } catch {
      return;
    }
    serverHasDraft = draft !== null;
    if (!draft) return;
    const parsed = parseProgram(draft.document);
    const newer = Date.parse(draft.updatedAt) > Date.parse(headCreatedAt);
    if (!parsed.ok || !newer || JSON.stringify(parsed.value) === JSON.stringify(headDoc)) {
      await discardOnServer();
      return;
    }
    offer.value = { doc: parsed.value, baseVersion: draft.baseVersion, updatedAt: draft.updatedAt };
  }

  /** Put the offered draft on screen as an edit of the head (one undo step back to it), based on its own version. */
  function restore(): void {
    const found = offer.value;
    if (!found) return;
    offer.value = null;
    options.baseVersion.value = found.baseVersion;
    editor.edit(() => found.doc);
    sentDoc = found.doc;
    keptAt.value = found.updatedAt;
  }

  async function discard(): Promise<void> {
    offer.value = null;
    await discardOnServer();
  }

  /** A version was saved: the server dropped the draft with it. */
  function saved(): void {
    cancel();
    serverHasDraft = false;
    sentDoc = null;
    keptAt.value = null;
  }

  /** The page is being hidden or closed: send what is unsent without waiting for an answer. */
  function sendOnLeave(): void {
    if (!canKeep() || !editor.dirty || editor.doc === sentDoc) return;
    cancel();
    api.sendOnLeave(options.programId(), { baseVersion: options.baseVersion.value, document: editor.doc });
    sentDoc = editor.doc;
    serverHasDraft = true;
  }

  function onVisibility(): void {
    if (document.visibilityState === 'hidden') sendOnLeave();
  }
  if (typeof window !== 'undefined') {
    window.addEventListener('pagehide', sendOnLeave);
    document.addEventListener('visibilitychange', onVisibility);
  }
  onBeforeUnmount(() => {
    cancel();
    if (typeof window !== 'undefined') {
      window.removeEventListener('pagehide', sendOnLeave);
      document.removeEventListener('visibilitychange', onVisibility);
    }
  });

  return { offer, keptAt, problem, check, restore, discard, flush, saved, sendOnLeave };
}
