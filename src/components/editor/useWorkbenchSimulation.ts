/**
 * The editor and the simulation together, as the program page, the lab page and the review page
 * run them: the editor validates against the panel in use, and the simulation is given only
 * documents that compile on it. So the simulation never piles up "cannot run" notes while a
 * student types; instead `status` says, for the document on screen now, whether it compiles or
 * what its first error is (linked to its element). Until the first rung compiles the panel runs
 * an empty program, so its devices and the I/O table (every address, with the tags' names) are
 * there to look at.
 */
import { computed, watch, type ComputedRef } from 'vue';
import type { CheckScript } from '@shared/checks';
import type { PanelLayout } from '@shared/field/layout';
import { hasErrors, type Diagnostic } from '@shared/ladder/diagnostics';
import type { Program } from '@shared/ladder/schema';
import { validateProgram } from '@shared/ladder/validate';
import { useEditorStore } from '@/stores/editor';
import { useSimulationStore } from '@/stores/simulation';
import { replayTo, type ReplayOutcome } from '@/components/labs/replay';

/** What the simulation can say about the document on screen. */
export type WorkbenchStatus =
  | { kind: 'blank' }
  | { kind: 'compiles' }
  /** `held`: the panel still has the last version that compiled (not an empty program). */
  | { kind: 'error'; first: Diagnostic; count: number; held: boolean };

/** The program the panel runs while nothing of the document compiles: its tags, no rungs. */
function idleProgram(doc: Program, space: Parameters<typeof validateProgram>[1]): Program {
  const withTags: Program = { ...doc, rungs: [] };
  return hasErrors(validateProgram(withTags, space)) ? { ...withTags, tags: [] } : withTags;
}

export interface WorkbenchSimulation {
  /** The program to give the simulation: the document when it compiles, else the last one that did. */
  runnable: ComputedRef<Program>;
  status: ComputedRef<WorkbenchStatus>;
  /**
   * Replay a check script to one check on the document as it is now (it must compile), paused
   * there; null with the reason when it does not compile.
   */
  replay(script: CheckScript, stepNumber: number): ReplayOutcome | { error: string };
}

export function useWorkbenchSimulation(panel: () => PanelLayout): WorkbenchSimulation {
  const editor = useEditorStore();
  const simulation = useSimulationStore();
  watch(panel, (p) => editor.usePanel(p), { immediate: true });

  const compiles = computed(() => !hasErrors(editor.problems));
  let idle: { opened: number; tags: Program['tags']; program: Program } | null = null;
  const idleFor = (doc: Program): Program => {
    if (idle?.opened === editor.opened && idle.tags === doc.tags) return idle.program;
    idle = { opened: editor.opened, tags: doc.tags, program: idleProgram(doc, editor.space) };
    return idle.program;
  };

  let held: { opened: number; program: Program } | null = null;
  const runnable = computed<Program>(() => {
    const doc = editor.doc;
    if (!editor.blank && compiles.value) {
      held = { opened: editor.opened, program: doc };
      return doc;
    }
    if (!editor.blank && held?.opened === editor.opened) return held.program;
    return idleFor(doc);
  });

  const status = computed<WorkbenchStatus>(() => {
    if (editor.blank) return { kind: 'blank' };
    const errors = editor.problems.filter((d) => d.severity === 'error');
    const first = errors[0];
    if (!first) return { kind: 'compiles' };
    const program = runnable.value;
    return { kind: 'error', first, count: errors.length, held: program.rungs.length > 0 && program !== editor.doc };
  });

  function replay(script: CheckScript, stepNumber: number): ReplayOutcome | { error: string } {
    if (!compiles.value || editor.blank) return { error: 'The program on screen does not compile, so there is no run to show; the messages say what to fix.' };
    simulation.pause();
    simulation.load(editor.doc, { panel: panel(), scanMs: script.scanMs });
    return replayTo(
      {
        scanMs: script.scanMs,
        advance: (count) => {
          for (let i = 0; i < count; i += 1) simulation.step();
        },
        act: (id, action, args) => simulation.act(id, action, args),
      },
      script,
      stepNumber,
    );
  }

  return { runnable, status, replay };
}
