/**
 * A growing byte buffer with the encodings WebAssembly's binary format uses (WebAssembly Core
 * Specification 2.0, section 5.2 "Values": unsigned and signed LEB128 integers, IEEE 754 doubles
 * little-endian). Writing is amortised O(1) per byte, so a module of a million bytes is built in
 * a few milliseconds.
 */
/** `i32.const` (WebAssembly Core Specification 2.0, section 5.4.7); see `opcodes.ts`. */
const OP_I32_CONST = 0x41;

/** Whether `value` is a whole number 0..2^32-1, what an unsigned LEB128 here may hold. */
const isU32 = (value: number): boolean => value >= 0 && value <= 0xffffffff && value === Math.floor(value);

/**
 * Write the u32 `value` at `at` as unsigned LEB128; the offset after it. One loop for every
 * length: with a branch per length, the first address past 2^14 (block and flow records lie
 * there) took a path the optimised code had never seen, and V8 threw that code away.
 */
function leb(bytes: Uint8Array, at: number, value: number): number {
  let v = value;
  while (v >= 0x80) {
    bytes[at++] = (v & 0x7f) | 0x80;
    v >>>= 7;
  }
  bytes[at++] = v;
  return at;
}

export class ByteWriter {
  private bytes = new Uint8Array(1024);
  private size = 0;
  private readonly scratch = new DataView(new ArrayBuffer(8));

  get length(): number {
    return this.size;
  }

  private room(n: number): void {
    if (this.size + n <= this.bytes.length) return;
    let capacity = this.bytes.length * 2;
    while (capacity < this.size + n) capacity *= 2;
    const grown = new Uint8Array(capacity);
    grown.set(this.bytes.subarray(0, this.size));
    this.bytes = grown;
  }

  byte(value: number): void {
    this.room(1);
    this.bytes[this.size++] = value;
  }

  /** Two bytes: an opcode and its one-byte immediate (most instructions written here). */
  pair(a: number, b: number): void {
    this.room(2);
    this.bytes[this.size++] = a;
    this.bytes[this.size++] = b;
  }

  /**
   * A memory access at a constant address, the engine's commonest instruction sequence:
   * `i32.const 0`, then `opcode align offset` with the offset as unsigned LEB128, in one call
   * (compiling a long program writes tens of thousands of these, much of it before the
   * JavaScript engine has optimised this code).
   */
  access(opcode: number, align: number, offset: number): void {
    if (!isU32(offset)) throw new RangeError(`wasm: bad u32 ${String(offset)}`);
    this.room(9);
    const bytes = this.bytes;
    const at = this.size;
    bytes[at] = OP_I32_CONST;
    bytes[at + 1] = 0;
    bytes[at + 2] = opcode;
    bytes[at + 3] = align;
    this.size = leb(bytes, at + 4, offset);
  }

  /** Unsigned LEB128 of a whole number 0..2^32-1. */
  u32(value: number): void {
    if (!isU32(value)) throw new RangeError(`wasm: bad u32 ${String(value)}`);
    this.room(5);
    this.size = leb(this.bytes, this.size, value);
  }

  /** Signed LEB128 of a 32-bit integer. */
  s32(value: number): void {
    if (!Number.isInteger(value) || value < -0x80000000 || value > 0x7fffffff) throw new RangeError(`wasm: bad s32 ${String(value)}`);
    this.room(5);
    let v = value | 0;
    for (;;) {
      const b = v & 0x7f;
      v >>= 7;
      const done = (v === 0 && (b & 0x40) === 0) || (v === -1 && (b & 0x40) !== 0);
      this.bytes[this.size++] = done ? b : b | 0x80;
      if (done) return;
    }
  }

  /** An IEEE 754 double, little-endian. */
  f64(value: number): void {
    this.room(8);
    this.scratch.setFloat64(0, value, true);
    for (let i = 0; i < 8; i += 1) this.bytes[this.size++] = this.scratch.getUint8(i);
  }

  /** A name: its UTF-8 length and bytes (names here are ASCII). */
  name(text: string): void {
    this.u32(text.length);
    for (let i = 0; i < text.length; i += 1) {
      const code = text.charCodeAt(i);
      if (code > 0x7e || code < 0x20) throw new RangeError('wasm: names here are printable ASCII');
      this.byte(code);
    }
  }

  /** Append another writer's bytes. */
  append(other: ByteWriter): void {
    this.room(other.size);
    this.bytes.set(other.bytes.subarray(0, other.size), this.size);
    this.size += other.size;
  }

  /** Append `bytes` (a copy of earlier output, see `since`). */
  appendCopy(bytes: Uint8Array): void {
    this.room(bytes.length);
    this.bytes.set(bytes, this.size);
    this.size += bytes.length;
  }

  /** A copy of the bytes written from offset `start` on. */
  since(start: number): Uint8Array {
    return this.bytes.slice(start, this.size);
  }

  /** A copy of the bytes written so far. */
  toBytes(): Uint8Array {
    return this.bytes.slice(0, this.size);
  }
}
