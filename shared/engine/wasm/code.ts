/**
 * One function body being written: instructions with the engine's addressing (every access is
 * `i32.const 0` plus a constant offset, so the address of each bit or field is fixed when the
 * code is emitted), structured `if`, and the function's locals. Bits and flags are i32 cells of
 * 4 bytes: Chromium 156 ran the same rungs 2.3 times faster over i32 loads than over byte loads
 * (measured; Node 20 about the same either way).
 *
 * Locals: parameter 0 is the scan period `dt` (f64); then a fixed set of scratch locals every
 * emitter may use (`I32_TEMPS` i32, `F64_TEMPS` f64), then one i32 per parallel nesting depth for
 * the power on the parallel's left.
 */
import { ByteWriter } from './byteWriter';
import { ALIGN, OP, TYPE } from './opcodes';

const I32_TEMPS = 10;
const F64_TEMPS = 4;

/** Parameter index of `dt`, the scan period in ms (f64). */
export const DT = 0;

export class Code {
  readonly out = new ByteWriter();
  private depths = 0;

  /** Local index of scratch i32 number `n` (0-based). */
  i32Temp(n: number): number {
    if (n < 0 || n >= I32_TEMPS) throw new RangeError(`wasm: no i32 scratch local ${n}`);
    return 1 + n;
  }

  f64Temp(n: number): number {
    if (n < 0 || n >= F64_TEMPS) throw new RangeError(`wasm: no f64 scratch local ${n}`);
    return 1 + I32_TEMPS + n;
  }

  /** The i32 local holding the power on the left of a parallel at nesting `depth`. */
  depthLocal(depth: number): number {
    if (depth + 1 > this.depths) this.depths = depth + 1;
    return 1 + I32_TEMPS + F64_TEMPS + depth;
  }

  op(code: number): void {
    this.out.byte(code);
  }

  i32(value: number): void {
    this.out.byte(OP.i32Const);
    this.out.s32(value);
  }

  f64(value: number): void {
    if (!Number.isFinite(value)) throw new RangeError(`wasm: bad constant ${String(value)}`);
    this.out.byte(OP.f64Const);
    this.out.f64(value);
  }

  // Locals are numbered below 128 (a few scratch ones and one per parallel nesting level, at most
  // 32), so an index is one LEB128 byte; `u32` checks that anyway for a larger one.
  get(local: number): void {
    if ((local & 0x7f) === local) this.out.pair(OP.localGet, local);
    else {
      this.out.byte(OP.localGet);
      this.out.u32(local);
    }
  }

  set(local: number): void {
    if ((local & 0x7f) === local) this.out.pair(OP.localSet, local);
    else {
      this.out.byte(OP.localSet);
      this.out.u32(local);
    }
  }

  tee(local: number): void {
    if ((local & 0x7f) === local) this.out.pair(OP.localTee, local);
    else {
      this.out.byte(OP.localTee);
      this.out.u32(local);
    }
  }

  /** Push the cell (an i32: 0 or 1 for a bit) at byte `address`. */
  loadCell(address: number): void {
    this.out.access(OP.i32Load, ALIGN.cell, address);
  }

  /** Push the double at byte `address` (8-aligned). */
  loadF64(address: number): void {
    this.out.access(OP.f64Load, ALIGN.f64, address);
  }

  /**
   * Stores in two halves, for the hot paths that must not allocate a closure per element: the
   * address base before the value, then the store itself.
   */
  storeBase(): void {
    this.out.pair(OP.i32Const, 0);
  }

  endStoreCell(address: number): void {
    this.out.pair(OP.i32Store, ALIGN.cell);
    this.out.u32(address);
  }

  /** Store the i32 `value` pushes into the cell at byte `address`. */
  storeCell(address: number, value: () => void): void {
    this.storeBase();
    value();
    this.endStoreCell(address);
  }

  storeF64(address: number, value: () => void): void {
    this.out.pair(OP.i32Const, 0);
    value();
    this.out.pair(OP.f64Store, ALIGN.f64);
    this.out.u32(address);
  }

  /** `if` on the i32 `condition` pushes, with an optional `else`; neither branch leaves a value. */
  when(condition: () => void, then: () => void, otherwise?: () => void): void {
    condition();
    this.out.pair(OP.if, TYPE.void);
    then();
    if (otherwise) {
      this.out.byte(OP.else);
      otherwise();
    }
    this.out.byte(OP.end);
  }

  call(fn: number): void {
    this.out.byte(OP.call);
    this.out.u32(fn);
  }

  /** The function's body as the code section wants it: size, local declarations, instructions, `end`. */
  finish(into: ByteWriter): void {
    const head = new ByteWriter();
    const groups: Array<[number, number]> = [
      [I32_TEMPS, TYPE.i32],
      [F64_TEMPS, TYPE.f64],
    ];
    if (this.depths > 0) groups.push([this.depths, TYPE.i32]);
    head.u32(groups.length);
    for (const [count, type] of groups) {
      head.u32(count);
      head.byte(type);
    }
    into.u32(head.length + this.out.length + 1);
    into.append(head);
    into.append(this.out);
    into.byte(OP.end);
  }
}
