/**
 * The benchmark's large case: a seeded, generated 1,000-rung program (about 10 elements a rung,
 * 10 % of rungs with a timer or counter) and, from the same description, a baseline written out as
 * ordinary TypeScript source over plain boolean arrays, the way a person would write the logic by
 * hand (short-circuit `&&`/`||`, timers and counters inline).
 *
 * The baseline is split into one function per 50 rungs, like the engine's own chunks: a single
 * 1,000-rung function is too long for the JavaScript engine to optimise, which would make the
 * baseline look slower than hand-written code is.
 */
import type { AddressSpace } from '@shared/ladder/addresses';
import type { Block, Coil, CoilVariant, Contact, NetworkNode, Program } from '@shared/ladder/schema';
import { programBuilder } from '../unit/engine/build';

/** A wide panel, so that each rung can write a bit of its own. */
export const GENERATED_SPACE: AddressSpace = { inputs: 16, outputs: 16, memory: 1024 };

/** mulberry32: a small seeded generator (public-domain algorithm), so the program is the same every run. */
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

export interface GeneratedCase {
  program: Program;
  /** TypeScript source of `export function baselineScan(s: BaselineState, field: boolean[], dt: number): void` and `createBaselineState()`. */
  baselineSource: string;
  elementCount: number;
}

type Area = 'I' | 'Q' | 'M';
interface BitRef {
  area: Area;
  index: number;
}

const TIMER_TYPES = ['TON', 'TOF', 'TP'] as const;
const COUNTER_TYPES = ['CTU', 'CTD'] as const;

/** Generate the program and its baseline. Same seed, same text. */
export function generateCase(rungCount = 1000, seed = 20260401): GeneratedCase {
  const random = seeded(seed);
  const pick = <T>(items: readonly T[]): T => items[Math.floor(random() * items.length)]!;
  const b = programBuilder();
  const rungs: Program['rungs'] = [];
  const baselineRungs: string[] = [];
  const blocks: Array<{ name: string; type: Block['type'] }> = [];
  let edgeCount = 0;
  let elementCount = 0;

  const bit = (rungIndex: number): BitRef => {
    const roll = random();
    if (roll < 0.4) return { area: 'I', index: 1 + Math.floor(random() * GENERATED_SPACE.inputs) };
    if (roll < 0.5) return { area: 'Q', index: 1 + Math.floor(random() * GENERATED_SPACE.outputs) };
    // Memory bits written by earlier rungs (this scan's value) or later ones (the previous scan's).
    const span = Math.min(GENERATED_SPACE.memory, rungCount);
    const near = rungIndex - 1 - Math.floor(random() * 40);
    return { area: 'M', index: 1 + ((near % span) + span) % span };
  };
  const address = (ref: BitRef): string => `%${ref.area}X${ref.index}`;
  const arrayRef = (ref: BitRef): string => `${ref.area === 'I' ? 'I' : ref.area === 'Q' ? 'Q' : 'M'}[${ref.index - 1}]`;

  /** A contact: its document element and the baseline's expression (statements for edge memories). */
  const contact = (rungIndex: number, pre: string[]): { node: Contact; code: string } => {
    elementCount += 1;
    if (blocks.length > 0 && random() < 0.05) {
      const block = pick(blocks);
      const negate = random() < 0.5;
      return {
        node: negate ? b.nc(`${block.name}.Q`) : b.no(`${block.name}.Q`),
        code: `${negate ? '!' : ''}${block.name}.q`,
      };
    }
    const ref = bit(rungIndex);
    const roll = random();
    if (roll < 0.06) {
      const e = edgeCount++;
      const rising = roll < 0.03;
      pre.push(`const v${e} = ${arrayRef(ref)}; const x${e} = ${rising ? `v${e} && !E[${e}]` : `!v${e} && E[${e}]`}; E[${e}] = v${e};`);
      return { node: b.contact(rising ? 'rising' : 'falling', address(ref)), code: `x${e}` };
    }
    if (roll < 0.35) return { node: b.nc(address(ref)), code: `!${arrayRef(ref)}` };
    return { node: b.no(address(ref)), code: arrayRef(ref) };
  };

  /** A series of `n` contacts. */
  const chain = (rungIndex: number, n: number, pre: string[]): { nodes: NetworkNode[]; code: string } => {
    const parts = Array.from({ length: n }, () => contact(rungIndex, pre));
    return { nodes: parts.map((p) => p.node), code: parts.map((p) => p.code).join(' && ') };
  };

  /** About 9 contacts: a lead, a parallel of 2–3 branches, a tail. */
  const condition = (rungIndex: number, pre: string[]): { nodes: NetworkNode[]; code: string } => {
    const lead = chain(rungIndex, 1 + Math.floor(random() * 2), pre);
    const branchCount = 2 + Math.floor(random() * 2);
    const branches = Array.from({ length: branchCount }, () => chain(rungIndex, 1 + Math.floor(random() * 2), pre));
    const used = lead.nodes.length + branches.reduce((n, x) => n + x.nodes.length, 0);
    const tail = chain(rungIndex, Math.max(1, 9 - used), pre);
    const parallel = b.parallel(...branches.map((x) => (x.nodes.length === 1 ? x.nodes[0]! : b.series(...x.nodes))));
    const code = `${lead.code} && (${branches.map((x) => `(${x.code})`).join(' || ')}) && ${tail.code}`;
    return { nodes: [...lead.nodes, parallel, ...tail.nodes], code };
  };

  const coilFor = (rungIndex: number): { node: Coil; write: (p: string) => string } => {
    elementCount += 1;
    const target: BitRef =
      rungIndex % 25 === 0
        ? { area: 'Q', index: 1 + ((rungIndex / 25) % GENERATED_SPACE.outputs) }
        : { area: 'M', index: 1 + (rungIndex % GENERATED_SPACE.memory) };
    const roll = random();
    const variant: CoilVariant = roll < 0.8 ? 'coil' : roll < 0.87 ? 'negated' : roll < 0.94 ? 'set' : 'reset';
    const ref = arrayRef(target);
    const write = {
      coil: (p: string) => `${ref} = ${p};`,
      negated: (p: string) => `${ref} = !(${p});`,
      set: (p: string) => `if (${p}) ${ref} = true;`,
      reset: (p: string) => `if (${p}) ${ref} = false;`,
    }[variant];
    return { node: b.coil(address(target), variant), write };
  };

  for (let r = 0; r < rungCount; r += 1) {
    const pre: string[] = [];
    const cond = condition(r, pre);
    const coil = coilFor(r);
    if (r % 10 === 5) {
      elementCount += 1;
      const isTimer = random() < 0.6;
      const type = isTimer ? pick(TIMER_TYPES) : pick(COUNTER_TYPES);
      const name = `${isTimer ? 'T' : 'C'}${blocks.length + 1}`;
      const lines: string[] = [...pre, `const p = ${cond.code};`, `const b = ${name};`];
      let block: Block;
      if (isTimer) {
        const pt = 10 * (5 + Math.floor(random() * 50));
        block = b.block(type, name, { PT: `T#${pt}ms` });
        lines.push(TIMER_CODE[type as (typeof TIMER_TYPES)[number]](pt));
      } else {
        const pv = 2 + Math.floor(random() * 8);
        const other = bit(r);
        block = b.block(type, name, type === 'CTU' ? { PV: String(pv), R: address(other) } : { PV: String(pv), LD: address(other) });
        lines.push(COUNTER_CODE[type as (typeof COUNTER_TYPES)[number]](pv, arrayRef(other)));
      }
      lines.push(coil.write('b.q'));
      blocks.push({ name, type });
      rungs.push(b.rung(...cond.nodes, block, coil.node));
      baselineRungs.push(lines.join('\n    '));
    } else {
      rungs.push(b.rung(...cond.nodes, coil.node));
      baselineRungs.push([...pre, coil.write(cond.code)].join('\n    '));
    }
  }
  return {
    program: b.program(rungs),
    baselineSource: baselineSource(baselineRungs, blocks, edgeCount),
    elementCount,
  };
}

const TIMER_CODE = {
  TON: (pt: number) =>
    `if (p) { b.et = Math.min(b.et + dt, ${pt}); b.q = b.et >= ${pt}; } else { b.et = 0; b.q = false; }`,
  TOF: (pt: number) =>
    `if (p) { b.et = 0; b.q = true; } else if (b.q) { b.et = Math.min(b.et + dt, ${pt}); b.q = b.et < ${pt}; }`,
  TP: (pt: number) =>
    `if (!b.q && p && !b.last) { b.q = true; b.et = Math.min(dt, ${pt}); } ` +
    `else if (b.q) { b.et = Math.min(b.et + dt, ${pt}); if (b.et >= ${pt}) b.q = false; } ` +
    `else if (!p) { b.et = 0; } b.last = p;`,
} as const;

const COUNTER_CODE = {
  CTU: (pv: number, reset: string) =>
    `if (${reset}) b.cv = 0; else if (p && !b.last && b.cv < 32767) b.cv += 1; b.last = p; b.q = b.cv >= ${pv};`,
  CTD: (pv: number, load: string) =>
    `if (${load}) b.cv = ${pv}; else if (p && !b.last && b.cv > -32768) b.cv -= 1; b.last = p; b.q = b.cv <= 0;`,
} as const;

const RUNGS_PER_FUNCTION = 50;

function baselineSource(rungs: string[], blocks: Array<{ name: string }>, edgeCount: number): string {
  const blockNames = blocks.map((x) => x.name);
  const stateFields = blockNames.map((name) => `  ${name}: Counter;`).join('\n');
  const initial = blockNames.map((name) => `    ${name}: { q: false, et: 0, cv: 0, last: false },`).join('\n');
  const destructure = blockNames.length > 0 ? `const { ${blockNames.join(', ')} } = s;` : '';
  const functions: string[] = [];
  for (let start = 0; start < rungs.length; start += RUNGS_PER_FUNCTION) {
    const body = rungs
      .slice(start, start + RUNGS_PER_FUNCTION)
      .map((rung, i) => `  // rung ${start + i + 1}\n  {\n    ${rung}\n  }`)
      .join('\n');
    functions.push(
      `function part${functions.length}(s: BaselineState, dt: number): void {\n` +
        `  const { I, Q, M, E } = s;\n  ${destructure}\n  void dt; void I; void Q; void M; void E;\n${body}\n}`,
    );
  }
  return `// Generated by tests/perf/engine-generated.ts: the baseline for the 1,000-rung benchmark.
/* eslint-disable */
interface Counter { q: boolean; et: number; cv: number; last: boolean }
export interface BaselineState {
  I: boolean[]; Q: boolean[]; M: boolean[]; E: boolean[]; outputImage: boolean[]; timeMs: number;
${stateFields}
}
export function createBaselineState(): BaselineState {
  return {
    I: new Array(${GENERATED_SPACE.inputs}).fill(false), Q: new Array(${GENERATED_SPACE.outputs}).fill(false),
    M: new Array(${GENERATED_SPACE.memory}).fill(false), E: new Array(${Math.max(edgeCount, 1)}).fill(false),
    outputImage: new Array(${GENERATED_SPACE.outputs}).fill(false), timeMs: 0,
${initial}
  };
}
${functions.join('\n')}
export function baselineScan(s: BaselineState, field: readonly boolean[], dt: number): void {
  for (let i = 0; i < ${GENERATED_SPACE.inputs}; i += 1) s.I[i] = field[i]!;
${functions.map((_, i) => `  part${i}(s, dt);`).join('\n')}
  for (let i = 0; i < ${GENERATED_SPACE.outputs}; i += 1) s.outputImage[i] = s.Q[i]!;
  s.timeMs += dt;
}
`;
}
