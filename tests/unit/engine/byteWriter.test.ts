import { describe, expect, it } from 'vitest';
import { ByteWriter } from '@shared/engine/wasm/byteWriter';

/** Unsigned LEB128 as WebAssembly Core Specification 2.0, section 5.2.2 defines it: 7 bits a byte, low first, high bit = more. */
function leb(value: number): number[] {
  const out: number[] = [];
  let v = value;
  do {
    const low = v % 128;
    v = Math.floor(v / 128);
    out.push(v === 0 ? low : low | 0x80);
  } while (v !== 0);
  return out;
}

const written = (write: (w: ByteWriter) => void): number[] => {
  const w = new ByteWriter();
  write(w);
  return [...w.toBytes()];
};

// Each side of every byte-count boundary, the short path's end (2^21) and the largest u32.
const VALUES = [0, 1, 127, 128, 300, 16383, 16384, 65536, 2 ** 21 - 1, 2 ** 21, 2 ** 28 - 1, 2 ** 28, 2 ** 32 - 1];

describe('ByteWriter', () => {
  it('writes unsigned LEB128 on both sides of each length boundary', () => {
    for (const value of VALUES) expect(written((w) => w.u32(value)), String(value)).toEqual(leb(value));
  });

  it('writes a constant-address access as i32.const 0, the opcode, its alignment and the offset in LEB128', () => {
    for (const offset of VALUES) expect(written((w) => w.access(0x28, 2, offset)), String(offset)).toEqual([0x41, 0, 0x28, 2, ...leb(offset)]);
  });

  it('refuses what is no u32', () => {
    for (const bad of [-1, 0.5, 2 ** 32, Number.NaN]) expect(() => new ByteWriter().u32(bad), String(bad)).toThrow(RangeError);
  });

  it('copies earlier output on request', () => {
    const w = new ByteWriter();
    w.pair(1, 2);
    const start = w.length;
    w.u32(300);
    const copy = w.since(start);
    w.appendCopy(copy);
    expect([...w.toBytes()]).toEqual([1, 2, ...leb(300), ...leb(300)]);
  });
});
