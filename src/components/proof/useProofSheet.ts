/**
 * The program's proof sheet as the Proof tab edits it: fetched when the tab first opens, each
 * edit applied at once on screen and sent to the server a few hundred ms after the last one (and
 * when the page is hidden or left, like drafts). Nothing is sent before the sheet has loaded, so a
 * failed load never overwrites what the server holds.
 */
import { onBeforeUnmount, ref, shallowRef, watch } from 'vue';
import type { ProofSheet } from '@shared/api/proof';
import { proofApi, type ProofApi } from '@/api/proof';
import { describeFailure } from '@/api/http';
import { EMPTY_SHEET, type SheetEdit } from './sheetModel';

/** Quiet time after the last edit before the sheet is sent, ms. */
export const SHEET_SAVE_DELAY_MS = 400;

export function useProofSheet(programId: () => string, api: ProofApi = proofApi) {
  const sheet = shallowRef<ProofSheet>(EMPTY_SHEET);
  const state = ref<'loading' | 'ready' | 'failed'>('loading');
  /** Why the sheet could not be loaded or kept, in words ('' when fine). */
  const problem = ref('');
  const saving = ref(false);
  let unsent = false;
  let timer: ReturnType<typeof setTimeout> | null = null;
  let loadedFor = '';

  async function load(): Promise<void> {
    const id = programId();
    loadedFor = id;
    state.value = 'loading';
    problem.value = '';
    unsent = false;
    try {
      const answer = await api.get(id);
      if (loadedFor !== id) return;
      sheet.value = answer.proof;
      state.value = 'ready';
    } catch (error) {
      if (loadedFor !== id) return;
      sheet.value = EMPTY_SHEET;
      state.value = 'failed';
      problem.value = `The proof sheet could not be loaded: ${describeFailure(error)}`;
    }
  }

  function cancel(): void {
    if (timer !== null) clearTimeout(timer);
    timer = null;
  }

  async function flush(): Promise<void> {
    cancel();
    if (!unsent || state.value !== 'ready') return;
    const id = loadedFor;
    const sent = sheet.value;
    unsent = false;
    saving.value = true;
    try {
      await api.save(id, sent);
      problem.value = '';
    } catch (error) {
      if (sheet.value === sent) unsent = true;
      problem.value = `The proof sheet could not be saved: ${describeFailure(error)}`;
    } finally {
      saving.value = false;
    }
  }

  /** Apply an edit from `sheetModel`; its error, if any, comes back for the caller to show. */
  function apply(edit: SheetEdit): string | null {
    if (!edit.ok) return edit.error;
    sheet.value = edit.sheet;
    if (state.value !== 'ready') return null;
    unsent = true;
    cancel();
    timer = setTimeout(() => void flush(), SHEET_SAVE_DELAY_MS);
    return null;
  }

  function sendOnLeave(): void {
    if (!unsent || state.value !== 'ready') return;
    cancel();
    unsent = false;
    api.sendOnLeave(loadedFor, sheet.value);
  }
  const onVisibility = (): void => {
    if (document.visibilityState === 'hidden') sendOnLeave();
  };

  watch(programId, () => {
    sendOnLeave();
    void load();
  }, { immediate: true });
  if (typeof window !== 'undefined') {
    window.addEventListener('pagehide', sendOnLeave);
    document.addEventListener('visibilitychange', onVisibility);
  }
  onBeforeUnmount(() => {
    // Leaving the workbench inside the app: the page stays, so an ordinary save can finish.
    if (unsent) void flush();
    if (typeof window !== 'undefined') {
      window.removeEventListener('pagehide', sendOnLeave);
      document.removeEventListener('visibilitychange', onVisibility);
    }
  });

  return { sheet, state, problem, saving, apply, flush, reload: load };
}
