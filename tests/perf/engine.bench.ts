/**
 * `npm run bench engine`: scans per second of the engine against a hand-written baseline doing the
 * same logic over plain arrays, on (1) the 6-rung demo-like program and (2) a generated 1,000-rung
 * program. Both run the same seeded input sequence, and the bench first checks that they agree
 * scan for scan (a fast baseline that computes something else would prove nothing).
 *
 * Figures: medians over many samples after a warm-up; engine and baseline samples interleave so a
 * slow moment of the machine hits both alike.
 */
import { mkdirSync, writeFileSync } from 'node:fs';
import path from 'node:path';
import { fileURLToPath, pathToFileURL } from 'node:url';
import { compile, createRuntime, type Runtime } from '@shared/engine';
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

function engineSubject(program: Program, space: AddressSpace | undefined, patterns: boolean[][]): { subject: Subject; runtime: Runtime } {
  const compiled = compile(program, space ? { space } : {});
  if (!compiled.ok) throw new Error(`bench program does not compile: ${compiled.diagnostics[0]?.message}`);
  const runtime = createRuntime(compiled.plan, { scanMs: SCAN_MS });
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

/** Interleaved samples of µs per scan. */
function measure(engine: Subject, baseline: Subject, scansPerSample: number, samples: number, warmup: number) {
  let from = 0;
  const sample = (subject: Subject): number => {
    const start = performance.now();
    subject.run(from, scansPerSample);
    return ((performance.now() - start) * 1000) / scansPerSample;
  };
  for (let i = 0; i < warmup; i += 1) {
    sample(engine);
    sample(baseline);
    from += scansPerSample;
  }
  const engineUs: number[] = [];
  const baselineUs: number[] = [];
  for (let i = 0; i < samples; i += 1) {
    engineUs.push(sample(engine));
    baselineUs.push(sample(baseline));
    from += scansPerSample;
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

async function demoCase(): Promise<BenchCase> {
  const patterns = inputPatterns(8, 997, 7);
  const check = engineSubject(demoProgram(), undefined, patterns);
  checkAgreement('demo', check.subject, baselineSubject(demoBaselineState(), demoBaselineScan, patterns), 5000);
  const { subject, runtime } = engineSubject(demoProgram(), undefined, patterns);
  const baseline = baselineSubject(demoBaselineState(), demoBaselineScan, patterns);
  const result = measure(subject, baseline, 20_000, 61, 20);
  return figures('engine demo 6 rungs', result, { evaluator: runtime.evaluator, rungs: 6 });
}

async function generatedCase(): Promise<BenchCase> {
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
  const check = engineSubject(generated.program, GENERATED_SPACE, patterns);
  checkAgreement(
    'generated',
    check.subject,
    baselineSubject(baselineModule.createBaselineState(), baselineModule.baselineScan, patterns),
    3000,
  );
  const { subject, runtime } = engineSubject(generated.program, GENERATED_SPACE, patterns);
  const baseline = baselineSubject(baselineModule.createBaselineState(), baselineModule.baselineScan, patterns);
  const result = measure(subject, baseline, 400, 61, 20);
  return figures('engine generated 1000 rungs', result, {
    evaluator: runtime.evaluator,
    rungs: 1000,
    elements: runtime.plan.elementCount,
  });
}

export default async function (): Promise<BenchCase[]> {
  return [await demoCase(), await generatedCase()];
}
