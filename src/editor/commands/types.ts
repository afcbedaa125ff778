/**
 * The shape of an editor command (STYLE.md point 4): every gesture — toolbar button, palette item,
 * key press, context-menu entry — is one named command with a label, its shortcuts, a test of
 * whether it can run now, and `perform`. Document commands are pure: `perform` returns the next
 * document and selection, and the editor store commits it to the history in one place. Commands
 * that act on the view (zoom, save, export) call the `effects` they are given.
 */
import type { Element, Program, Rung } from '@shared/ladder/schema';
import type { ProgramLayout } from '../layoutTypes';
import type { Selection } from '../selection';

/** What copy and cut keep: elements (pasted in series at a slot) or whole rungs. */
export type Clipboard = { kind: 'elements'; elements: readonly Element[] } | { kind: 'rungs'; rungs: readonly Rung[] };

/** What a command reads. */
export interface EditorState {
  doc: Program;
  selection: Selection;
  clipboard: Clipboard | null;
  /** An old version opened for reading: every document command is disabled. */
  readOnly: boolean;
  layout: ProgramLayout;
}

/** What a command changes; fields left out stay as they were. */
export interface CommandResult {
  doc?: Program;
  selection?: Selection;
  clipboard?: Clipboard | null;
  /** Merge with the previous history entry of the same key (see `history.commit`). */
  coalesceKey?: string;
}

/** The view-side actions commands may trigger; the workbench supplies them, tests fake them. */
export interface EditorEffects {
  undo(): void;
  redo(): void;
  save(): void;
  zoomBy(factor: number): void;
  zoomReset(): void;
  fitToView(): void;
  toggleTextForm(): void;
  showStructuredText(): void;
  exportPng(): void;
  print(): void;
  /** Move keyboard focus to the inspector's first field (Enter on a selection). */
  editSelection(): void;
  editRungComment(rungId: string): void;
  toggleMessages(): void;
  /** Open the version history. */
  showHistory(): void;
  /** Open the keyboard sheet (every command and panel key, by the area it acts in). */
  showKeys(): void;
}

/** Every command's name. */
export type CommandName =
  | 'insert-element'
  | 'delete-selection'
  | 'wrap-in-parallel'
  | 'add-branch-below'
  | 'move-element-left'
  | 'move-element-right'
  | 'select-left'
  | 'select-right'
  | 'select-up'
  | 'select-down'
  | 'select-all'
  | 'clear-selection'
  | 'add-rung'
  | 'insert-rung-above'
  | 'duplicate-rung'
  | 'move-rung-up'
  | 'move-rung-down'
  | 'delete-rung'
  | 'edit-rung-comment'
  | 'copy'
  | 'cut'
  | 'paste'
  | 'undo'
  | 'redo'
  | 'save'
  | 'zoom-in'
  | 'zoom-out'
  | 'zoom-reset'
  | 'fit-to-view'
  | 'toggle-text-form'
  | 'show-structured-text'
  | 'export-png'
  | 'print'
  | 'edit-selection'
  | 'toggle-messages'
  | 'show-history'
  | 'show-keys';

/** Where commands are offered, for grouping in toolbar and menus. */
export type CommandGroup = 'element' | 'rung' | 'clipboard' | 'history' | 'view' | 'file' | 'selection';

/**
 * Where a command's keys act: `editor` keys only while the rungs or the palette have the keyboard
 * focus (so a letter typed elsewhere never edits the program); `page` keys anywhere on the
 * workbench except inside a text field (Ctrl/Cmd+S even there). The field panel's own keys act
 * only while the panel has the focus (`src/simulation/panelKeys.ts`).
 */
export type CommandArea = 'editor' | 'page';

/** The extra argument some commands take (the palette item key for `insert-element`). */
export interface CommandArgs {
  item?: string;
}

export interface Command {
  name: CommandName;
  label: string;
  group: CommandGroup;
  /** Key chords, e.g. `Mod+Z` (Mod = Ctrl, or Cmd on a Mac), `Shift+Mod+Z`, `Delete`, `Alt+ArrowLeft`. */
  shortcuts: readonly string[];
  /** True for commands that change the document (refused on a read-only version). */
  edits: boolean;
  /** Where its keys act; `editor` when absent. */
  area?: CommandArea;
  enabled(state: EditorState, args?: CommandArgs): boolean;
  perform(state: EditorState, effects: EditorEffects, args?: CommandArgs): CommandResult | void;
}
