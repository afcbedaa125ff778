/**
 * The engine benchmark inside a page (see engine-page.ts): the same cases and agreement check as
 * in Node (engine-cases.ts, engine-measure.ts). Node drives it step by step, reading the page's
 * main-thread CPU time between steps, so each step is one call here. The page is served under the
 * production Content Security Policy, so the engine compiles its WebAssembly exactly as it does in
 * the workbench.
 */
import { createRuntime, type Plan } from '@shared/engine';
import { agreementScans, caseProgram, caseSpecs, compileEdited, editedProgram, planFor, prepareCase, SCAN_MS, withinDocumentLimits, type BaselineModule, type PreparedCase } from './engine-cases';
import { checkAgreement } from './engine-measure';

export interface EnginePageApi {
  /** Generate (or take) the case's program, to compile in the next step. */
  load(id: string): void;
  /** Compile it (a step of its own, so its CPU time is measured alone); its element count. */
  compile(): number;
  /** Start a runtime on the compiled plan (created and not yet scanned). */
  createRuntime(): void;
  /** Its first scan (which compiles the code it runs). */
  firstScan(): void;
  /** Make edited copy `n` of the case's document (see `editedProgram`), to compile in the next step. */
  edit(id: string, n: number): void;
  /** Compile that copy to its first scan. */
  compileEdit(): void;
  /** Prepare the case on both sides and check they agree scan for scan. */
  prepare(id: string): void;
  run(side: 'engine' | 'baseline', from: number, n: number): void;
}

export function installEngineBench(modules: Readonly<Record<string, BaselineModule>>): void {
  let loaded: ReturnType<typeof caseProgram> | null = null;
  let within = false;
  let plan: Plan | null = null;
  let started: ReturnType<typeof createRuntime> | null = null;
  let prepared: PreparedCase | null = null;
  let edited: ReturnType<typeof editedProgram> | null = null;
  const spec = (id: string) => {
    const found = caseSpecs().find((s) => s.id === id);
    if (found === undefined) throw new Error(`no engine bench case ${id}`);
    return found;
  };
  const api: EnginePageApi = {
    load(id) {
      loaded = caseProgram(spec(id));
      within = withinDocumentLimits(loaded.program);
    },
    compile() {
      plan = planFor(loaded!.program, loaded!.space, within);
      return plan.elementCount;
    },
    createRuntime() {
      started = createRuntime(plan!, { scanMs: SCAN_MS });
    },
    firstScan() {
      started!.scan();
    },
    edit(id, n) {
      edited = editedProgram(spec(id), n);
    },
    compileEdit() {
      compileEdited(edited!, () => 0);
    },
    prepare(id) {
      const s = spec(id);
      prepared = prepareCase(s, modules[id] ?? null, () => performance.now());
      checkAgreement(id, agreementScans(s.rungs), prepared.engine, prepared.baseline);
    },
    run(side, from, n) {
      prepared![side].run(from, n);
    },
  };
  (globalThis as unknown as { engineBench: EnginePageApi }).engineBench = api;
  document.title = 'engine bench ready';
}
