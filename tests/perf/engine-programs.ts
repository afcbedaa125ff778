/**
 * The engine benchmark's generated programs and their hand-written baselines.
 *
 * Two shapes, seeded so each run benchmarks the same text: `series` (rungs of 9-12 contacts in a
 * row, now and then a two-way branch) and `parallel` (rungs of 3-4 branches, some nested, and some
 * ending in two coils). Both have every 10th rung with a timer (TON, TOF, TP) or counter (CTU,
 * CTD, CTUD), about 6 % edge contacts and about 15 % set/reset coils.
 *
 * The baseline is the same logic written the way a careful person writes fast JavaScript by hand:
 * typed arrays for the bit image, edge memories and block states, bitwise `&`, `|`, `^ 1` (no
 * short-circuit, no booleans), presets inlined, one function per 50 rungs (a much longer function
 * is never optimised by the JavaScript engine). It is emitted as TypeScript source, written to a
 * file and imported, exactly as if someone had typed it.
 */
import type { AddressSpace } from '@shared/ladder/addresses';
import type { BlockType, CoilVariant, NetworkNode, Program } from '@shared/ladder/schema';
import { programBuilder } from '../unit/engine/build';

export type ProgramShape = 'series' | 'parallel';

/** A wide panel, so each rung can write a memory bit of its own (modulo 1024). */
export const BENCH_SPACE: AddressSpace = { inputs: 16, outputs: 16, memory: 1024 };

/** mulberry32: a small seeded generator (public-domain algorithm). */
function seeded(seed: number): () => number {
  let a = seed >>> 0;
  return () => {
    a = (a + 0x6d2b79f5) >>> 0;
    let t = a;
    t = Math.imul(t ^ (t >>> 15), t | 1);
    t ^= t + Math.imul(t ^ (t >>> 7), t | 61);
    return ((t ^ (t >>> 14)) >>> 0) / 4294967296;
  };
}

/** A block instance as the baseline keeps it: index `k` into its state arrays. */
export interface BaselineBlock {
  name: string;
  type: BlockType;
  k: number;
}

export interface BenchProgram {
  program: Program;
  /** TypeScript source exporting `createBaselineState()` and `baselineScan(s, field, dt)`. */
  baselineSource: string;
  blocks: BaselineBlock[];
  edgeCount: number;
}

const TIMERS = ['TON', 'TOF', 'TP'] as const;
const COUNTERS = ['CTU', 'CTD', 'CTUD'] as const;
const RUNGS_PER_FUNCTION = 50;

interface Part {
  node: NetworkNode;
  /** The baseline's expression for the power this part passes, given `left`. */
  code: (left: string) => string;
}

/** Generate a program of `rungCount` rungs of `shape` and its baseline. Same arguments, same text. */
export function benchProgram(shape: ProgramShape, rungCount: number, seed = 20260401): BenchProgram {
  const random = seeded(seed + (shape === 'series' ? 0 : 7919) + rungCount);
  const pick = <T>(items: readonly T[]): T => items[Math.floor(random() * items.length)]!;
  const b = programBuilder();
  const rungs: Program['rungs'] = [];
  const baselineRungs: string[] = [];
  const blocks: BaselineBlock[] = [];
  let edgeCount = 0;
  const span = Math.min(BENCH_SPACE.memory, rungCount);

  /** A bit an element reads: an input, an output, or a memory bit written by a nearby rung. */
  const bit = (rung: number): { address: string; code: string } => {
    const roll = random();
    if (roll < 0.4) {
      const i = Math.floor(random() * BENCH_SPACE.inputs);
      return { address: `%IX${i + 1}`, code: `I[${i}]` };
    }
    if (roll < 0.5) {
      const i = Math.floor(random() * BENCH_SPACE.outputs);
      return { address: `%QX${i + 1}`, code: `Q[${i}]` };
    }
    const near = rung - 1 - Math.floor(random() * 40);
    const i = ((near % span) + span) % span;
    return { address: `%MX${i + 1}`, code: `M[${i}]` };
  };

  /** A contact; edge contacts add their statements to `pre` (edge memories in document order). */
  const contact = (rung: number, pre: string[]): Part => {
    if (blocks.length > 0 && random() < 0.05) {
      const block = pick(blocks);
      const member = block.type === 'CTUD' ? 'QU' : 'Q';
      const array = 'BQ';
      const nc = random() < 0.5;
      const node = nc ? b.nc(`${block.name}.${member}`) : b.no(`${block.name}.${member}`);
      return { node, code: (left) => `${left} & ${nc ? `(${array}[${block.k}] ^ 1)` : `${array}[${block.k}]`}` };
    }
    const ref = bit(rung);
    const roll = random();
    if (roll < 0.06) {
      const e = edgeCount++;
      const rising = roll < 0.03;
      pre.push(`const v${e} = ${ref.code}; const x${e} = ${rising ? `v${e} & (E[${e}] ^ 1)` : `(v${e} ^ 1) & E[${e}]`}; E[${e}] = v${e};`);
      return { node: b.contact(rising ? 'rising' : 'falling', ref.address), code: (left) => `${left} & x${e}` };
    }
    if (roll < 0.35) return { node: b.nc(ref.address), code: (left) => `${left} & (${ref.code} ^ 1)` };
    return { node: b.no(ref.address), code: (left) => `${left} & ${ref.code}` };
  };

  const series = (parts: Part[]): Part => ({
    node: parts.length === 1 ? parts[0]!.node : b.series(...parts.map((p) => p.node)),
    code: (left) => parts.reduce((acc, p) => p.code(acc), left),
  });

  // left & (a | b), as a person writes it; the same as (left & a) | (left & b), which the engine solves.
  const parallel = (branches: Part[]): Part => ({
    node: b.parallel(...branches.map((p) => p.node)),
    code: (left) => `${left} & (${branches.map((p) => p.code('1').replace(/^1 & /, '')).join(' | ')})`,
  });

  const contacts = (rung: number, n: number, pre: string[]): Part[] => Array.from({ length: n }, () => contact(rung, pre));

  /** The rung's condition, left to right; edge statements in document order. */
  const condition = (rung: number, pre: string[]): Part[] => {
    if (shape === 'series') {
      const n = 9 + Math.floor(random() * 4);
      const parts = contacts(rung, Math.floor(n / 2), pre);
      if (random() < 0.3) parts.push(parallel([contact(rung, pre), contact(rung, pre)]));
      parts.push(...contacts(rung, n - parts.length, pre));
      return parts;
    }
    const branch = (): Part => {
      if (random() < 0.25) return series([contact(rung, pre), parallel([contact(rung, pre), series(contacts(rung, 2, pre))])]);
      return series(contacts(rung, 1 + Math.floor(random() * 2), pre));
    };
    const lead = contact(rung, pre);
    const wide = parallel(Array.from({ length: 3 + Math.floor(random() * 2) }, branch));
    return [lead, wide, contact(rung, pre)];
  };

  const coilVariant = (): CoilVariant => {
    const roll = random();
    return roll < 0.78 ? 'coil' : roll < 0.85 ? 'negated' : roll < 0.925 ? 'set' : 'reset';
  };

  /** A coil writing `%MX<index+1>` (or an output every 25th rung) and the baseline statement. */
  const coil = (rung: number, index: number): { node: NetworkNode; write: (p: string) => string } => {
    const output = rung % 25 === 0;
    const i = output ? (rung / 25) % BENCH_SPACE.outputs : index % BENCH_SPACE.memory;
    const address = output ? `%QX${i + 1}` : `%MX${i + 1}`;
    const ref = output ? `Q[${i}]` : `M[${i}]`;
    const variant = coilVariant();
    const write = {
      coil: (p: string) => `${ref} = ${p};`,
      negated: (p: string) => `${ref} = ${p} ^ 1;`,
      set: (p: string) => `${ref} |= ${p};`,
      reset: (p: string) => `${ref} &= ${p} ^ 1;`,
    }[variant];
    return { node: b.coil(address, variant), write };
  };

  /** The coils ending a rung: one, or (parallel shape, now and then) two on parallel branches, the second behind a contact. */
  const outputs = (rung: number, pre: string[]): { nodes: NetworkNode[]; lines: (p: string) => string[] } => {
    const first = coil(rung, rung);
    if (shape === 'series' || random() < 0.7) return { nodes: [first.node], lines: (p) => [first.write(p)] };
    const second = coil(rung + 1, rung + 512);
    const guard = contact(rung, pre);
    return {
      nodes: [b.parallel(first.node, b.series(guard.node, second.node))],
      lines: (p) => [first.write(p), second.write(`(${guard.code(p)})`)],
    };
  };

  for (let r = 0; r < rungCount; r += 1) {
    const pre: string[] = [];
    const cond = condition(r, pre);
    const power = cond.reduce((acc, part) => part.code(acc), '1').replace(/^1 & /, '');
    if (r % 10 === 5) {
      const isTimer = random() < 0.5;
      const type: BlockType = isTimer ? pick(TIMERS) : pick(COUNTERS);
      const k = blocks.length;
      const name = `${isTimer ? 'T' : 'C'}${k + 1}`;
      const lines = [...pre, `const p = ${power};`];
      let node: NetworkNode;
      if (isTimer) {
        const pt = 10 * (5 + Math.floor(random() * 50));
        node = b.block(type, name, { PT: `T#${pt}ms` });
        lines.push(TIMER_CODE[type as (typeof TIMERS)[number]](k, pt));
      } else {
        const pv = 2 + Math.floor(random() * 8);
        const reset = bit(r);
        const load = bit(r);
        const down = bit(r);
        const inputs: Record<string, string> =
          type === 'CTU' ? { PV: String(pv), R: reset.address } : type === 'CTD' ? { PV: String(pv), LD: load.address } : { PV: String(pv), CD: down.address, R: reset.address, LD: load.address };
        node = b.block(type, name, inputs);
        lines.push(COUNTER_CODE[type as (typeof COUNTERS)[number]](k, pv, { reset: reset.code, load: load.code, down: down.code }));
      }
      blocks.push({ name, type, k });
      const out = outputs(r, lines);
      rungs.push(b.rung(...cond.map((part) => part.node), node, ...out.nodes));
      baselineRungs.push([...lines, `const q = BQ[${k}];`, ...out.lines('q')].join('\n    '));
    } else {
      const out = outputs(r, pre);
      rungs.push(b.rung(...cond.map((part) => part.node), ...out.nodes));
      baselineRungs.push([...pre, `const p = ${power};`, ...out.lines('p')].join('\n    '));
    }
  }
  return { program: b.program(rungs), baselineSource: baselineSource(baselineRungs, blocks.length, edgeCount), blocks, edgeCount };
}

/** Timers over BQ (Q), BN (ET, ms) and BL (IN at the last call, TP). */
const TIMER_CODE = {
  TON: (k: number, pt: number) =>
    `if (p) { const et = Math.min(BN[${k}] + dt, ${pt}); BN[${k}] = et; BQ[${k}] = et >= ${pt} ? 1 : 0; } else { BN[${k}] = 0; BQ[${k}] = 0; }`,
  TOF: (k: number, pt: number) =>
    `if (p) { BN[${k}] = 0; BQ[${k}] = 1; } else if (BQ[${k}]) { const et = Math.min(BN[${k}] + dt, ${pt}); BN[${k}] = et; BQ[${k}] = et < ${pt} ? 1 : 0; }`,
  TP: (k: number, pt: number) =>
    `if ((BQ[${k}] ^ 1) & p & (BL[${k}] ^ 1)) { BQ[${k}] = 1; BN[${k}] = Math.min(dt, ${pt}); } ` +
    `else if (BQ[${k}]) { const et = Math.min(BN[${k}] + dt, ${pt}); BN[${k}] = et; BQ[${k}] = et < ${pt} ? 1 : 0; } ` +
    `else if (p === 0) { BN[${k}] = 0; } BL[${k}] = p;`,
} as const;

interface CounterInputs {
  reset: string;
  load: string;
  down: string;
}

/** Counters over BQ (Q or QU), BN (CV), BL (CU or CD at the last call), BD (QD) and BM (CD at the last call, CTUD). */
const COUNTER_CODE = {
  CTU: (k: number, pv: number, x: CounterInputs) =>
    `const up = p & (BL[${k}] ^ 1); BL[${k}] = p; if (${x.reset}) BN[${k}] = 0; else if (up & (BN[${k}] < 32767 ? 1 : 0)) BN[${k}] += 1; BQ[${k}] = BN[${k}] >= ${pv} ? 1 : 0;`,
  CTD: (k: number, pv: number, x: CounterInputs) =>
    `const down = p & (BL[${k}] ^ 1); BL[${k}] = p; if (${x.load}) BN[${k}] = ${pv}; else if (down & (BN[${k}] > -32768 ? 1 : 0)) BN[${k}] -= 1; BQ[${k}] = BN[${k}] <= 0 ? 1 : 0;`,
  CTUD: (k: number, pv: number, x: CounterInputs) =>
    `const cd = ${x.down}; const up = p & (BL[${k}] ^ 1); const down = cd & (BM[${k}] ^ 1); BL[${k}] = p; BM[${k}] = cd; ` +
    `if (${x.reset}) BN[${k}] = 0; else if (${x.load}) BN[${k}] = ${pv}; ` +
    `else if (up & (down ^ 1)) { if (BN[${k}] < 32767) BN[${k}] += 1; } else if (down & (up ^ 1) & (BN[${k}] > -32768 ? 1 : 0)) BN[${k}] -= 1; ` +
    `BQ[${k}] = BN[${k}] >= ${pv} ? 1 : 0; BD[${k}] = BN[${k}] <= 0 ? 1 : 0;`,
} as const;

function baselineSource(rungs: string[], blockCount: number, edgeCount: number): string {
  const functions: string[] = [];
  for (let start = 0; start < rungs.length; start += RUNGS_PER_FUNCTION) {
    const body = rungs
      .slice(start, start + RUNGS_PER_FUNCTION)
      .map((rung) => `  {\n    ${rung}\n  }`)
      .join('\n');
    functions.push(`function part${functions.length}(s: BaselineState, dt: number): void {\n  const { I, Q, M, E, BQ, BD, BL, BM, BN } = s;\n  void I; void Q; void M; void E; void BQ; void BD; void BL; void BM; void BN; void dt;\n${body}\n}`);
  }
  const { inputs, outputs, memory } = BENCH_SPACE;
  return `// Generated by tests/perf/engine-programs.ts: a hand-written-style baseline for the engine benchmark.
/* eslint-disable */
export interface BaselineState {
  I: Uint8Array; Q: Uint8Array; M: Uint8Array; E: Uint8Array;
  BQ: Uint8Array; BD: Uint8Array; BL: Uint8Array; BM: Uint8Array; BN: Int32Array;
  outputImage: Uint8Array;
}
export function createBaselineState(): BaselineState {
  const n = ${Math.max(blockCount, 1)};
  return {
    I: new Uint8Array(${inputs}), Q: new Uint8Array(${outputs}), M: new Uint8Array(${memory}), E: new Uint8Array(${Math.max(edgeCount, 1)}),
    BQ: new Uint8Array(n), BD: new Uint8Array(n), BL: new Uint8Array(n), BM: new Uint8Array(n), BN: new Int32Array(n),
    outputImage: new Uint8Array(${outputs}),
  };
}
${functions.join('\n')}
export function baselineScan(s: BaselineState, field: readonly boolean[], dt: number): void {
  const I = s.I;
  for (let i = 0; i < ${inputs}; i += 1) I[i] = field[i] ? 1 : 0;
${functions.map((_, i) => `  part${i}(s, dt);`).join('\n')}
  const Q = s.Q, out = s.outputImage;
  for (let i = 0; i < ${outputs}; i += 1) out[i] = Q[i]!;
}
`;
}
