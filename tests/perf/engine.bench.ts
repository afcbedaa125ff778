/**
 * `npm run bench engine`: scans per second of the engine against a hand-written baseline doing the
 * same logic over plain arrays, on (1) the 6-rung demo-like program and (2) a generated 1,000-rung
 * program. Both run the same seeded input sequence, and the bench first checks that they agree
 * scan for scan (a fast baseline that computes something else would prove nothing).
 *
 * Figures: medians over 101 samples after a warm-up. Each sample is timed in CPU time of this
 * process (`process.cpuUsage`), lasts about 3 ms on either side, and engine and baseline samples
 * interleave, so other work on the machine hits both alike.
 */
import { mkdirSync, writeFileSync } from 'node:fs';
import path from 'node:path';
import { fileURLToPath, pathToFileURL } from 'node:url';
import { compile, createRuntime, type EvaluatorKind, type Runtime } from '@shared/engine';
import type { AddressSpace } from '@shared/ladder/addresses';
import type { Program } from '@shared/ladder/schema';
import type { BenchCase } from './run';
import { median, round } from './stats';
import { demoBaselineScan, demoBaselineState, demoProgram } from './engine-demo';
import { GENERATED_SPACE, generateCase } from './engine-generated';

const SCAN_MS = 10;

/** Seeded input patterns: each held for a few scans, like buttons and sensors. */
function inputPatterns(inputs: number, count: number, seed: number): boolean[][] {
  let a = seed >>> 0;
  const next = (): number => {
    a = (Math.imul(a, 1664525) + 1013904223) >>> 0;
    return a / 4294967296;
  };
  const patterns: boolean[][] = [];
  let current = Array.from({ length: inputs }, () => next() < 0.5);
  for (let i = 0; i < count; i += 1) {
    if (i % 7 === 0) current = current.map((v) => (next() < 0.2 ? !v : v));
    patterns.push(current);
  }
  return patterns;
}

interface Subject {
  /** Run `n` scans starting at pattern `from`. */
  run(from: number, n: number): void;
  outputs(): boolean[];
}

function engineSubject(
  program: Program,
  space: AddressSpace | undefined,
  patterns: boolean[][],
  evaluator: EvaluatorKind = 'generated',
): { subject: Subject; runtime: Runtime } {
  const compiled = compile(program, space ? { space } : {});
  if (!compiled.ok) throw new Error(`bench program does not compile: ${compiled.diagnostics[0]?.message}`);
  const runtime = createRuntime(compiled.plan, { scanMs: SCAN_MS, evaluator });
  const outputs = compiled.plan.space.outputs;
  return {
    runtime,
    subject: {
      run(from, n) {
        for (let k = 0; k < n; k += 1) {
          const pattern = patterns[(from + k) % patterns.length]!;
          runtime.setInputs(pattern);
          runtime.scan();
        }
      },
      outputs: () => Array.from({ length: outputs }, (_, i) => runtime.getOutput(i + 1)),
    },
  };
}

function baselineSubject<S extends { outputImage: boolean[] }>(
  state: S,
  scan: (s: S, field: readonly boolean[], dt: number) => void,
  patterns: boolean[][],
): Subject {
  return {
    run(from, n) {
      for (let k = 0; k < n; k += 1) scan(state, patterns[(from + k) % patterns.length]!, SCAN_MS);
    },
    outputs: () => [...state.outputImage],
  };
}

/** Run both for `scans` scans comparing outputs after every one; throws at the first difference. */
function checkAgreement(name: string, a: Subject, b: Subject, scans: number): void {
  for (let k = 0; k < scans; k += 1) {
    a.run(k, 1);
    b.run(k, 1);
    const x = a.outputs().join();
    const y = b.outputs().join();
    if (x !== y) throw new Error(`${name}: engine and baseline disagree at scan ${k + 1}: ${x} vs ${y}`);
  }
}

/** CPU time of this process, µs: a busy machine (other processes) inflates neither side. */
function cpuMicros(): number {
  const usage = process.cpuUsage();
  return usage.user + usage.system;
}

/** Scans that take about `targetUs` of CPU time, so every sample is about as long on both sides. */
function calibrate(subject: Subject, targetUs: number): number {
  let n = 16;
  for (;;) {
    const start = cpuMicros();
    subject.run(0, n);
    const spent = cpuMicros() - start;
    if (spent >= targetUs / 4 || n > 50_000_000) return Math.max(1, Math.round((n * targetUs) / Math.max(spent, 1)));
    n *= 4;
  }
}

/** Interleaved samples of µs per scan, each about 3 ms of CPU time, after a warm-up. */
function measure(engine: Subject, baseline: Subject, samples: number, warmup: number) {
  const targetUs = 3000;
  let from = 0;
  const sample = (subject: Subject, n: number): number => {
    const start = cpuMicros();
    subject.run(from, n);
    return (cpuMicros() - start) / n;
  };
  for (let i = 0; i < warmup; i += 1) {
    sample(engine, 2000);
    sample(baseline, 2000);
    from += 2000;
  }
  const engineScans = calibrate(engine, targetUs);
  const baselineScans = calibrate(baseline, targetUs);
  const engineUs: number[] = [];
  const baselineUs: number[] = [];
  for (let i = 0; i < samples; i += 1) {
    engineUs.push(sample(engine, engineScans));
    baselineUs.push(sample(baseline, baselineScans));
    from += engineScans;
  }
  return { engineUs: median(engineUs), baselineUs: median(baselineUs) };
}

function figures(name: string, result: { engineUs: number; baselineUs: number }, extra: Record<string, string | number>): BenchCase {
  const scansPerSec = 1e6 / result.engineUs;
  const baselineScansPerSec = 1e6 / result.baselineUs;
  return {
    case: name,
    scansPerSec: Math.round(scansPerSec),
    baselineScansPerSec: Math.round(baselineScansPerSec),
    ratio: round(scansPerSec / baselineScansPerSec, 3),
    usPerScan: round(result.engineUs, 3),
    ...extra,
  };
}

async function demoCase(evaluator: EvaluatorKind): Promise<BenchCase> {
  const patterns = inputPatterns(8, 997, 7);
  // The agreement check runs its own pair, so the measured runtime is not the only one in the
  // process (as on a grading server, which runs many side by side).
  checkAgreement('demo', engineSubject(demoProgram(), undefined, patterns).subject, baselineSubject(demoBaselineState(), demoBaselineScan, patterns), 5000);
  const { subject, runtime } = engineSubject(demoProgram(), undefined, patterns, evaluator);
  const baseline = baselineSubject(demoBaselineState(), demoBaselineScan, patterns);
  const result = measure(subject, baseline, 101, 50);
  const name = evaluator === 'generated' ? 'engine demo 6 rungs' : 'engine demo 6 rungs, interpreter (no code generation)';
  return figures(name, result, { evaluator: runtime.evaluator, rungs: 6 });
}

async function generatedCase(evaluator: EvaluatorKind): Promise<BenchCase> {
  const generated = generateCase(1000);
  const here = path.dirname(fileURLToPath(import.meta.url));
  const dir = path.resolve(here, '../../.tmp/bench');
  mkdirSync(dir, { recursive: true });
  const file = path.join(dir, 'engine-baseline-1000.ts');
  writeFileSync(file, generated.baselineSource);
  type BaselineModule = {
    createBaselineState: () => { outputImage: boolean[] };
    baselineScan: (s: { outputImage: boolean[] }, field: readonly boolean[], dt: number) => void;
  };
  const baselineModule = (await import(pathToFileURL(file).href)) as BaselineModule;
  const patterns = inputPatterns(GENERATED_SPACE.inputs, 1009, 11);
  const fresh = () => ({
    engine: engineSubject(generated.program, GENERATED_SPACE, patterns, evaluator),
    baseline: baselineSubject(baselineModule.createBaselineState(), baselineModule.baselineScan, patterns),
  });
  const check = fresh();
  checkAgreement('generated', check.engine.subject, check.baseline, 3000);
  const measured = fresh();
  const { subject, runtime } = measured.engine;
  const baseline = measured.baseline;
  const result = measure(subject, baseline, 101, 10);
  const name = evaluator === 'generated' ? 'engine generated 1000 rungs' : 'engine generated 1000 rungs, interpreter (no code generation)';
  return figures(name, result, {
    evaluator: runtime.evaluator,
    rungs: 1000,
    elements: runtime.plan.elementCount,
  });
}

/**
 * The two cases the targets apply to (generated kernels, the default), then the same two on the
 * interpreter, the path taken where a Content Security Policy forbids code generation (figures for
 * information; no target).
 */
export default async function (): Promise<BenchCase[]> {
  return [await demoCase('generated'), await generatedCase('generated'), await demoCase('interpreter'), await generatedCase('interpreter')];
}
