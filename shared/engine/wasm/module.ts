/**
 * A whole module in WebAssembly's binary format (WebAssembly Core Specification 2.0, section 5.5):
 * one function type `(f64) -> ()`, the memory imported as `env.m` (fixed size, so its buffer is
 * never replaced), the functions, and one exported function `scan`.
 */
import { ByteWriter } from './byteWriter';
import type { Code } from './code';
import { SECTION, TYPE } from './opcodes';

/** Bytes per WebAssembly memory page. */
export const PAGE_BYTES = 65536;

function section(out: ByteWriter, id: number, body: ByteWriter): void {
  out.byte(id);
  out.u32(body.length);
  out.append(body);
}

/**
 * Assemble `functions` (function `i` has index `i`), exporting `functions[exported]` as `scan`.
 * `pages` is the memory's fixed size.
 */
export function assembleModule(functions: readonly Code[], exported: number, pages: number): Uint8Array {
  const out = new ByteWriter();
  for (const b of [0x00, 0x61, 0x73, 0x6d, 0x01, 0x00, 0x00, 0x00]) out.byte(b);

  const types = new ByteWriter();
  types.u32(1);
  types.byte(TYPE.func);
  types.u32(1);
  types.byte(TYPE.f64);
  types.u32(0);
  section(out, SECTION.type, types);

  const imports = new ByteWriter();
  imports.u32(1);
  imports.name('env');
  imports.name('m');
  imports.byte(0x02); // memory
  imports.byte(0x01); // limits with a maximum
  imports.u32(pages);
  imports.u32(pages);
  section(out, SECTION.import, imports);

  const declared = new ByteWriter();
  declared.u32(functions.length);
  for (let i = 0; i < functions.length; i += 1) declared.u32(0);
  section(out, SECTION.function, declared);

  const exports = new ByteWriter();
  exports.u32(1);
  exports.name('scan');
  exports.byte(0x00); // a function
  exports.u32(exported);
  section(out, SECTION.export, exports);

  const bodies = new ByteWriter();
  bodies.u32(functions.length);
  for (const fn of functions) fn.finish(bodies);
  section(out, SECTION.code, bodies);
  return out.toBytes();
}
