/**
 * The program being edited: document, selection, history, clipboard and what the canvas shows.
 * A thin Pinia adapter (STYLE.md point 9) over the pure modules in `src/editor/`: every change goes
 * through `apply`, the one place that commits to the history; components read and dispatch.
 */
import { defineStore } from 'pinia';
import { computed, ref, shallowRef } from 'vue';
import type { Program } from '@shared/ladder/schema';
import type { PanelLayout } from '@shared/field/layout';
import { DEFAULT_ADDRESS_SPACE, type AddressSpace } from '@shared/ladder/addresses';
import { createEmptyProgram } from '@shared/ladder/restore';
import { validateProgram } from '@shared/ladder/validate';
import { allIds } from '@shared/ladder/walk';
import { commandForKey, isEnabled, runCommand, type KeyChord } from '@/editor/commands/registry';
import type { Clipboard, CommandArgs, CommandName, CommandResult, EditorEffects, EditorState } from '@/editor/commands/types';
import { canRedo, canUndo, commit, createHistory, redo as redoHistory, undo as undoHistory, withSelection } from '@/editor/history';
import { layoutProgram } from '@/editor/layout';
import { editPastLimits } from '@/editor/documentLimits';
import type { ProgramLayout } from '@/editor/layoutTypes';
import { NO_SELECTION, pruneSelection, sameSlot, type Selection } from '@/editor/selection';
import { rungTextMap } from '@/editor/textForm';
import { isBlank, panelAddressSpace } from '@/editor/addressSpace';

/** Effects that do nothing, until the workbench supplies its own. */
function quietEffects(undo: () => void, redo: () => void): EditorEffects {
  const none = () => undefined;
  return {
    undo,
    redo,
    save: none,
    zoomBy: none,
    zoomReset: none,
    fitToView: none,
    toggleTextForm: none,
    showStructuredText: none,
    exportPng: none,
    print: none,
    editSelection: none,
    editRungComment: none,
    toggleMessages: none,
    showHistory: none,
    showKeys: none,
  };
}

/** Keep only the parts of a selection that still exist in the document and the drawing. */
export function reconcileSelection(selection: Selection, doc: Program, layout: ProgramLayout): Selection {
  const ids = new Set(allIds(doc));
  const pruned = pruneSelection(selection, (id) => ids.has(id));
  if (pruned.kind !== 'slot') return pruned;
  const rung = layout.rungs.find((r) => r.rungId === pruned.slot.rungId);
  return rung?.slots.some((s) => sameSlot(s.target, pruned.slot)) ? pruned : NO_SELECTION;
}

export const useEditorStore = defineStore('editor', () => {
  const history = shallowRef(createHistory<Program, Selection>(createEmptyProgram(), NO_SELECTION));
  const clipboard = shallowRef<Clipboard | null>(null);
  const readOnly = ref(false);
  const showTextForm = ref(false);
  /** Counts `load` calls: what was worked out for one opened document is not used for the next. */
  const opened = ref(0);
  /** The last edit refused for passing a document size limit, with why (`at` tells repeats apart). */
  const refusedEdit = shallowRef<{ message: string; at: number } | null>(null);
  /** The document as last saved or loaded: the editor is dirty while the present differs. */
  const savedDoc = shallowRef<Program | null>(history.value.present.doc);

  /**
   * The field panel the program runs on (the lab's, or the default), and its address space: the
   * editor validates against the very space the simulation compiles against, so an address the
   * panel has is never flagged out of range (nor one it lacks accepted).
   */
  const panel = shallowRef<PanelLayout | null>(null);
  const space = computed<AddressSpace>(() => (panel.value ? panelAddressSpace(panel.value) : DEFAULT_ADDRESS_SPACE));

  const doc = computed(() => history.value.present.doc);
  const selection = computed(() => history.value.present.selection);
  const rungText = computed(() => (showTextForm.value ? rungTextMap(doc.value) : undefined));
  const layout = computed(() => layoutProgram(doc.value, rungText.value));
  /** Nothing drawn yet (every rung empty): a new program, not a broken one. */
  const blank = computed(() => isBlank(doc.value));
  /** Every problem of the document on the panel in use (validated once per document and space). */
  const problems = computed(() => validateProgram(doc.value, space.value));
  /**
   * What the messages show: the problems, except that a program with nothing drawn yet is not
   * told its empty rung is an error before the student has started.
   */
  const diagnostics = computed(() => (blank.value ? problems.value.filter((d) => d.code !== 'empty-rung') : problems.value));
  const dirty = computed(() => doc.value !== savedDoc.value);
  const undoable = computed(() => canUndo(history.value));
  const redoable = computed(() => canRedo(history.value));

  let effects: EditorEffects = quietEffects(undo, redo);

  /** Start editing a document afresh (loaded from the server or a new program). */
  function load(program: Program, options: { readOnly?: boolean } = {}): void {
    opened.value += 1;
    history.value = createHistory(program, NO_SELECTION);
    savedDoc.value = program;
    readOnly.value = options.readOnly ?? false;
  }

  /** Validate against this panel's address space from now on (the panel the simulation runs); null: the default panel's. */
  function usePanel(next: PanelLayout | null): void {
    panel.value = next;
  }

  /** The document was saved as it is now. */
  function markSaved(program: Program = doc.value): void {
    savedDoc.value = program;
  }

  /** The document differs from what the server holds (a working copy brought back after viewing a version). */
  function markUnsaved(): void {
    savedDoc.value = null;
  }

  function state(): EditorState {
    return { doc: doc.value, selection: selection.value, clipboard: clipboard.value, readOnly: readOnly.value, layout: layout.value };
  }

  /** Commit a command's result: the one place history is written. */
  function apply(result: CommandResult): void {
    if (result.clipboard !== undefined) clipboard.value = result.clipboard;
    const nextDoc = result.doc ?? doc.value;
    let nextSelection = result.selection ?? selection.value;
    if (nextDoc !== doc.value) {
      if (readOnly.value) return;
      const pastLimits = editPastLimits(nextDoc);
      if (pastLimits) {
        refusedEdit.value = { message: pastLimits, at: (refusedEdit.value?.at ?? 0) + 1 };
        return;
      }
      nextSelection = reconcileSelection(nextSelection, nextDoc, layoutProgram(nextDoc));
      history.value = commit(history.value, nextDoc, nextSelection, result.coalesceKey ?? null);
    } else if (nextSelection !== selection.value) {
      history.value = withSelection(history.value, nextSelection);
    }
  }

  /** Run a command by name; false when it was disabled. */
  function dispatch(name: CommandName, args?: CommandArgs): boolean {
    if (!isEnabled(name, state(), args)) return false;
    const result = runCommand(name, state(), effects, args);
    if (result) apply(result);
    return true;
  }

  function enabled(name: CommandName, args?: CommandArgs): boolean {
    return isEnabled(name, state(), args);
  }

  /** Handle a key press on the canvas; true when a command took it. */
  function handleKey(chord: KeyChord): boolean {
    const found = commandForKey(chord);
    if (!found || !isEnabled(found.name, state(), found.args)) return false;
    const result = runCommand(found.name, state(), effects, found.args);
    if (result) apply(result);
    return true;
  }

  /** A pure edit from a form (inspector, tag table); `coalesceKey` merges a burst of typing. */
  function edit(change: (program: Program) => Program, coalesceKey?: string): void {
    apply({ doc: change(doc.value), coalesceKey });
  }

  function select(next: Selection): void {
    apply({ selection: next });
  }

  function undo(): void {
    history.value = undoHistory(history.value);
  }

  function redo(): void {
    history.value = redoHistory(history.value);
  }

  function setEffects(next: Partial<EditorEffects>): void {
    effects = { ...quietEffects(undo, redo), ...next };
  }

  function toggleTextForm(): void {
    showTextForm.value = !showTextForm.value;
  }

  return {
    doc,
    selection,
    clipboard,
    readOnly,
    opened,
    refusedEdit,
    showTextForm,
    layout,
    panel,
    space,
    blank,
    problems,
    diagnostics,
    dirty,
    undoable,
    redoable,
    load,
    usePanel,
    markSaved,
    markUnsaved,
    apply,
    dispatch,
    enabled,
    handleKey,
    edit,
    select,
    undo,
    redo,
    setEffects,
    toggleTextForm,
  };
});
