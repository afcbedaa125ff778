/**
 * What the engine compiles is built from the plan's numbers and a fixed instruction set, never
 * from text a user typed: each module is decoded here section by section and instruction by
 * instruction (WebAssembly Core Specification 2.0, chapter 5 "Binary Format") and checked
 * against that set.
 */
import { describe, expect, it } from 'vitest';
import fc from 'fast-check';
import { compile } from '@shared/engine';
import { kernelModule, moduleBytesBound } from '@shared/engine/kernel';
import { stateLayout } from '@shared/engine/stateLayout';
import { OP } from '@shared/engine/wasm/opcodes';
import { BENCH_SPACE, benchProgram } from '../../perf/engine-programs';
import { planOf, programBuilder } from './build';
import { randomProgram } from './oracle/randomProgram';

class Reader {
  at = 0;
  constructor(readonly bytes: Uint8Array) {}
  byte(): number {
    if (this.at >= this.bytes.length) throw new Error('module ends early');
    return this.bytes[this.at++]!;
  }
  u32(): number {
    let result = 0;
    let shift = 0;
    for (;;) {
      const b = this.byte();
      result += (b & 0x7f) * 2 ** shift;
      shift += 7;
      if ((b & 0x80) === 0) return result;
    }
  }
  name(): string {
    const n = this.u32();
    return String.fromCharCode(...this.bytes.subarray(this.at, (this.at += n)));
  }
}

interface Decoded {
  sections: number[];
  imports: string[];
  exports: string[];
  types: string[];
  opcodes: Set<number>;
  localTypes: Set<number>;
}

const MEMORY_ACCESS = new Set<number>([OP.i32Load, OP.f64Load, OP.i32Store, OP.f64Store]);
const LOCAL = new Set<number>([OP.localGet, OP.localSet, OP.localTee]);

function decode(bytes: Uint8Array): Decoded {
  const r = new Reader(bytes);
  const header = Array.from(bytes.subarray(0, 8));
  expect(header).toEqual([0x00, 0x61, 0x73, 0x6d, 1, 0, 0, 0]);
  r.at = 8;
  const decoded: Decoded = { sections: [], imports: [], exports: [], types: [], opcodes: new Set(), localTypes: new Set() };
  while (r.at < bytes.length) {
    const id = r.byte();
    const size = r.u32();
    const end = r.at + size;
    decoded.sections.push(id);
    if (id === 1) {
      for (let n = r.u32(); n > 0; n -= 1) {
        const form = r.byte();
        const params = Array.from({ length: r.u32() }, () => r.byte());
        const results = Array.from({ length: r.u32() }, () => r.byte());
        decoded.types.push(`${form}:${params.join()}->${results.join()}`);
      }
    } else if (id === 2) {
      for (let n = r.u32(); n > 0; n -= 1) {
        const module = r.name();
        const field = r.name();
        const kind = r.byte();
        const flags = r.byte();
        const limits = [r.u32(), ...(flags === 1 ? [r.u32()] : [])];
        decoded.imports.push(`${module}.${field}:${kind}:${limits.length}`);
      }
    } else if (id === 7) {
      for (let n = r.u32(); n > 0; n -= 1) {
        const field = r.name();
        const kind = r.byte();
        r.u32();
        decoded.exports.push(`${field}:${kind}`);
      }
    } else if (id === 10) {
      for (let n = r.u32(); n > 0; n -= 1) {
        const bodyEnd = r.u32() + r.at;
        for (let groups = r.u32(); groups > 0; groups -= 1) {
          r.u32();
          decoded.localTypes.add(r.byte());
        }
        while (r.at < bodyEnd) {
          const op = r.byte();
          decoded.opcodes.add(op);
          if (op === OP.if) r.byte();
          else if (op === OP.call || LOCAL.has(op)) r.u32();
          else if (MEMORY_ACCESS.has(op)) {
            r.u32();
            r.u32();
          } else if (op === OP.i32Const) r.u32();
          else if (op === OP.f64Const) r.at += 8;
        }
        expect(r.at).toBe(bodyEnd);
      }
    }
    r.at = end;
  }
  return decoded;
}

function hostileProgram() {
  const b = programBuilder();
  const hostile = "x'); globalThis.pwned = 1; ('";
  return b.program(
    [
      { ...b.rung(b.no('Evil_Name'), b.block('TON', 'Payload_T', { PT: 'T#1s' }), b.coil('%QX1')), comment: hostile },
      b.rung({ ...b.no('Payload_T.Q'), comment: hostile }, b.block('CTUD', 'Payload_C', { PV: '3', CD: 'Evil_Name' }), b.coil('%MX1')),
      b.rung(b.contact('rising', 'Evil_Name'), b.parallel(b.coil('%MX2', 'set'), b.series(b.nc('%MX1'), b.coil('%MX3', 'reset')))),
    ],
    [{ name: 'Evil_Name', address: '%IX1', comment: hostile }],
  );
}

describe('a kernel module', () => {
  for (const [recordFlow, forces] of [[false, false], [false, true], [true, false], [true, true]] as const) {
    it(`holds only the fixed instruction set and the engine's own names${recordFlow ? ' (power-flow recording)' : ''}${forces ? ' (forces)' : ''}`, () => {
      const plan = planOf(hostileProgram());
      const bytes = kernelModule(plan, stateLayout(plan), { recordFlow, forces });
      const decoded = decode(bytes);
      // Types, imports, functions, exports, code: no start function, no tables, no data.
      expect(decoded.sections).toEqual([1, 2, 3, 7, 10]);
      expect(decoded.types).toEqual(['96:124->']);
      expect(decoded.imports).toEqual(['env.m:2:2']);
      expect(decoded.exports).toEqual(['scan:0']);
      const allowed = new Set<number>(Object.values(OP));
      expect([...decoded.opcodes].filter((op) => !allowed.has(op))).toEqual([]);
      expect([...decoded.localTypes].sort()).toEqual([0x7c, 0x7f]);
      const text = new TextDecoder('latin1').decode(bytes);
      for (const typed of ['Evil', 'Payload', 'pwned', 'globalThis', ...plan.program.rungs.map((r) => r.id)]) expect(text).not.toContain(typed);
    });
  }

  it('is the same bytes for the same plan', () => {
    const plan = planOf(hostileProgram());
    expect(kernelModule(plan, stateLayout(plan), { recordFlow: false, forces: true })).toEqual(kernelModule(planOf(hostileProgram()), stateLayout(plan), { recordFlow: false, forces: true }));
  });
});

describe('the size bound of a module', () => {
  it('is above the real size of the variants', () => {
    const plans = [planOf(hostileProgram()), ...(['series', 'parallel'] as const).map((shape) => {
      const compiled = compile(benchProgram(shape, 300, 5).program, { space: BENCH_SPACE });
      if (!compiled.ok) throw new Error(compiled.diagnostics[0]!.message);
      return compiled.plan;
    })];
    fc.assert(fc.property(randomProgram, (doc) => { plans.push(planOf(doc)); }), { numRuns: 100, seed: 3 });
    for (const plan of plans) {
      const bound = moduleBytesBound(plan);
      // Forces only add instructions, so the variant with them is the larger of each pair.
      for (const recordFlow of [false, true]) expect(kernelModule(plan, stateLayout(plan), { recordFlow, forces: true }).length).toBeLessThanOrEqual(bound);
    }
  }, 60_000);

  it('refuses to compile a program past it, with a message', () => {
    const b = programBuilder();
    // Within the document's size limits (100 rungs of 200 nodes: the root series and 199 up/down
    // counters, 20,000 nodes), yet well past 8 MB of WebAssembly.
    let n = 0;
    const rung = () => b.rung(...Array.from({ length: 199 }, () => b.block('CTUD', `C${n++}`, { PV: '3', CD: '%IX2', R: '%IX3', LD: '%IX4' })));
    const result = compile(b.program(Array.from({ length: 100 }, () => rung())));
    expect(result.ok).toBe(false);
    expect(result.diagnostics.at(-1)!.message).toMatch(/too large to run: 19900 elements in 100 rungs/);
  }, 60_000);
});
