/**
 * Loading and saving the program on the workbench: the head version into the editor, saves based
 * on the version the edit started from, and the 409 conflict when someone saved first (reload
 * theirs, or keep mine as a new version on top of theirs).
 */
import { ref, shallowRef } from 'vue';
// From the schemas' own file, not the `@shared/api` index, which would build every API schema
// (the labs' too) before the workbench's first paint; see `src/api/client.ts`.
import { VersionConflictDetailsSchema, type VersionSummary } from '@shared/api/programs';
import { parseProgram } from '@shared/ladder/restore';
import type { Program } from '@shared/ladder/schema';
import { api } from '@/api/instance';
import { ApiFailure, describeFailure } from '@/api/http';
import { useEditorStore } from '@/stores/editor';

export type LoadState = 'loading' | 'ready' | 'failed';

export function usePersistence(programId: () => string) {
  const editor = useEditorStore();
  const state = ref<LoadState>('loading');
  const loadError = ref('');
  const baseVersion = ref(0);
  /** The program's newest version as last seen (a draft is offered back only when newer than it). */
  const head = shallowRef<VersionSummary | null>(null);
  const title = ref('');
  const saving = ref(false);
  /** Set when a save met a newer head: what the server has now. */
  const conflict = shallowRef<VersionSummary | null>(null);
  /** A version opened read-only: its number; the working copy waits in `workingCopy`. */
  const viewingVersion = ref<number | null>(null);
  const workingCopy = shallowRef<{ doc: Program; saved: boolean } | null>(null);

  function documentFrom(raw: unknown): Program {
    const parsed = parseProgram(raw);
    if (!parsed.ok) throw new Error(`This program's saved document cannot be opened: ${parsed.error}. An earlier version can be opened or restored from History.`);
    return parsed.value;
  }

  async function load(): Promise<void> {
    state.value = 'loading';
    try {
      const detail = await api.getProgram(programId());
      const doc = documentFrom(detail.head.document);
      title.value = detail.program.title;
      baseVersion.value = detail.head.number;
      head.value = { number: detail.head.number, message: detail.head.message, authorId: detail.head.authorId, createdAt: detail.head.createdAt };
      viewingVersion.value = null;
      workingCopy.value = null;
      editor.load(doc);
      state.value = 'ready';
    } catch (error) {
      loadError.value = describeFailure(error);
      state.value = 'failed';
    }
  }

  /** Save the document as a new version; on 409 keep the head for the conflict dialog. */
  async function save(message: string, base = baseVersion.value): Promise<'saved' | 'conflict' | string> {
    saving.value = true;
    const doc = editor.doc;
    try {
      const version = await api.saveVersion(programId(), { baseVersion: base, document: doc, message });
      baseVersion.value = version.number;
      head.value = { number: version.number, message: version.message, authorId: version.authorId, createdAt: version.createdAt };
      editor.markSaved(doc);
      conflict.value = null;
      return 'saved';
    } catch (error) {
      if (error instanceof ApiFailure && error.code === 'version_conflict') {
        const details = VersionConflictDetailsSchema.safeParse(error.details);
        conflict.value = details.success ? details.data.head : { number: base + 1, message: '', authorId: '', createdAt: '' };
        return 'conflict';
      }
      return describeFailure(error);
    } finally {
      saving.value = false;
    }
  }

  /** Conflict: keep my document, saved as a new version on top of the head that moved on. */
  async function keepMine(message: string): Promise<'saved' | 'conflict' | string> {
    const head = conflict.value;
    if (!head) return 'saved';
    return save(message || `Kept my changes over version ${head.number}`, head.number);
  }

  /** Conflict: drop my changes and load the head. */
  async function reloadTheirs(): Promise<void> {
    conflict.value = null;
    await load();
  }

  /** Open an old version read-only; the working copy is kept to come back to. */
  async function openVersion(n: number): Promise<void> {
    const version = await api.getVersion(programId(), n);
    if (viewingVersion.value === null) workingCopy.value = { doc: editor.doc, saved: !editor.dirty };
    viewingVersion.value = n;
    editor.load(documentFrom(version.document), { readOnly: true });
  }

  /** Leave the old version and return to the working copy as it was. */
  function closeVersion(): void {
    const copy = workingCopy.value;
    viewingVersion.value = null;
    workingCopy.value = null;
    if (copy) {
      editor.load(copy.doc);
      if (!copy.saved) editor.markUnsaved();
    }
  }

  async function restore(n: number): Promise<string | null> {
    try {
      await api.restoreVersion(programId(), { version: n, baseVersion: baseVersion.value, message: `Restored version ${n}` });
      await load();
      return null;
    } catch (error) {
      return describeFailure(error);
    }
  }

  return { state, loadError, baseVersion, head, title, saving, conflict, viewingVersion, load, save, keepMine, reloadTheirs, openVersion, closeVersion, restore };
}
