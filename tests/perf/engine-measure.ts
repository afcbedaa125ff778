/**
 * How the engine benchmark measures, in Node and in the browser alike (no Node or DOM API here:
 * the clock is passed in). Engine and baseline run the same seeded input sequence; before any
 * timing, they must agree on the whole memory after every scan. Then both are warmed up until
 * their times settle (the JavaScript engine optimises hot code in the background, WebAssembly
 * included, and a large program takes a while), and timed in short interleaved samples whose
 * order alternates, so other work on a shared machine hits both alike. The figures are medians.
 */

/** Something that scans: `run(from, n)` runs `n` scans on input patterns `from`, `from + 1`, … */
export interface Subject {
  run(from: number, n: number): void;
}

/** A subject driven from outside its thread (a page driven from Node): each run is awaited. */
export interface RemoteSubject {
  run(from: number, n: number): void | Promise<void>;
}

/** The whole memory as both sides report it: 0/1 per bit and edge memory, block fields by instance. */
export interface MemoryImage {
  inputs: ArrayLike<number>;
  outputs: ArrayLike<number>;
  memory: ArrayLike<number>;
  edges: ArrayLike<number>;
  outputImage: ArrayLike<number>;
  instances: ReadonlyMap<string, Readonly<Record<string, boolean | number>>>;
}

/** Seeded input patterns: each held for 7 scans, about a fifth of the inputs changing between. */
export function inputPatterns(inputs: number, count: number, seed: number): boolean[][] {
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

function sameArray(what: string, a: ArrayLike<number>, b: ArrayLike<number>): string | null {
  if (a.length !== b.length) return `${what}: ${a.length} entries against ${b.length}`;
  for (let i = 0; i < a.length; i += 1) if (a[i] !== b[i]) return `${what}[${i}]: ${a[i]} against ${b[i]}`;
  return null;
}

/** The first difference between two memory images, or null. */
export function memoryDifference(engine: MemoryImage, baseline: MemoryImage): string | null {
  const arrays = ['inputs', 'outputs', 'memory', 'edges', 'outputImage'] as const;
  for (const key of arrays) {
    const difference = sameArray(key, engine[key], baseline[key]);
    if (difference !== null) return difference;
  }
  if (engine.instances.size !== baseline.instances.size) return `${engine.instances.size} block instances against ${baseline.instances.size}`;
  for (const [name, state] of engine.instances) {
    const other = baseline.instances.get(name);
    if (other === undefined) return `instance ${name} missing from the baseline`;
    const keys = Object.keys(state);
    if (keys.length !== Object.keys(other).length) return `${name}: fields ${keys.join()} against ${Object.keys(other).join()}`;
    for (const key of keys) if (state[key] !== other[key]) return `${name}.${key}: ${String(state[key])} against ${String(other[key])}`;
  }
  return null;
}

/** Run both scan by scan, comparing the whole memory after each; throws at the first difference. */
export function checkAgreement(name: string, scans: number, engine: Subject & { image(): MemoryImage }, baseline: Subject & { image(): MemoryImage }): void {
  for (let k = 0; k < scans; k += 1) {
    engine.run(k, 1);
    baseline.run(k, 1);
    const difference = memoryDifference(engine.image(), baseline.image());
    if (difference !== null) throw new Error(`${name}: engine and baseline disagree after scan ${k + 1}: ${difference}`);
  }
}

export interface Timing {
  /** Median µs per scan. */
  engineUs: number;
  baselineUs: number;
  samples: number;
  /** Time spent warming up, ms of the clock. */
  warmupMs: number;
}

const median = (values: readonly number[]): number => {
  const sorted = [...values].sort((a, b) => a - b);
  const mid = sorted.length >> 1;
  return sorted.length % 2 === 1 ? sorted[mid]! : (sorted[mid - 1]! + sorted[mid]!) / 2;
};

export interface MeasureOptions {
  /** Microseconds of CPU time now (of the process in Node, of the page's main thread in Chromium). */
  clock: () => number | Promise<number>;
  /** Length of one sample, µs of the clock. */
  sampleUs: number;
  samples: number;
  /**
   * Warm-up: at least this long, then until the last three rounds' times are within 3 % of each
   * other on both sides (at most `maxWarmupUs`). A long program needs long: its code is optimised
   * function by function in the background, each round a little faster until all are done.
   */
  minWarmupUs: number;
  maxWarmupUs: number;
}

/**
 * Scans that take about `targetUs`: the shortest of three runs of a count that takes a quarter
 * of it, so one interruption (a collection, a background compile counted in the process's CPU
 * time) does not shrink every sample after it.
 */
async function calibrate(subject: RemoteSubject, clock: MeasureOptions['clock'], targetUs: number, from: number): Promise<number> {
  const timed = async (n: number): Promise<number> => {
    const start = await clock();
    await subject.run(from, n);
    return (await clock()) - start;
  };
  let n = 16;
  while ((await timed(n)) < targetUs / 4 && n < 1 << 26) n *= 2;
  const spent = Math.min(await timed(n), await timed(n), await timed(n));
  return Math.max(16, Math.round((n * targetUs) / Math.max(spent, 1)));
}

/** Warm both up, then take interleaved samples of µs per scan. */
export async function measure(engine: RemoteSubject, baseline: RemoteSubject, options: MeasureOptions): Promise<Timing> {
  const { clock } = options;
  let from = 0;
  const sample = async (subject: RemoteSubject, n: number): Promise<number> => {
    const start = await clock();
    await subject.run(from, n);
    from += n;
    return ((await clock()) - start) / n;
  };
  const warmStart = await clock();
  const rounds: Array<[number, number]> = [];
  const settled = (): boolean => {
    if (rounds.length < 3) return false;
    const last = rounds.slice(-3);
    return [0, 1].every((side) => {
      const times = last.map((r) => r[side]!);
      return Math.max(...times) <= 1.03 * Math.min(...times);
    });
  };
  for (;;) {
    const engineScans = await calibrate(engine, clock, options.sampleUs * 10, from);
    const baselineScans = await calibrate(baseline, clock, options.sampleUs * 10, from);
    rounds.push([await sample(engine, engineScans), await sample(baseline, baselineScans)]);
    const spent = (await clock()) - warmStart;
    if ((spent >= options.minWarmupUs && settled()) || spent >= options.maxWarmupUs) break;
  }
  const warmupMs = ((await clock()) - warmStart) / 1000;
  const engineScans = await calibrate(engine, clock, options.sampleUs, from);
  const baselineScans = await calibrate(baseline, clock, options.sampleUs, from);
  const engineUs: number[] = [];
  const baselineUs: number[] = [];
  for (let i = 0; i < options.samples; i += 1) {
    if (i % 2 === 0) {
      engineUs.push(await sample(engine, engineScans));
      baselineUs.push(await sample(baseline, baselineScans));
    } else {
      baselineUs.push(await sample(baseline, baselineScans));
      engineUs.push(await sample(engine, engineScans));
    }
  }
  return { engineUs: median(engineUs), baselineUs: median(baselineUs), samples: options.samples, warmupMs };
}
