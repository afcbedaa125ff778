/**
 * The WebAssembly instructions the engine emits, by their binary opcodes (WebAssembly Core
 * Specification 2.0, section 5.4 "Instructions"). Only this fixed set is ever written into a
 * module; nothing a user typed becomes an instruction.
 */
export const OP = {
  if: 0x04,
  else: 0x05,
  end: 0x0b,
  call: 0x10,
  drop: 0x1a,
  select: 0x1b,
  localGet: 0x20,
  localSet: 0x21,
  localTee: 0x22,
  i32Load: 0x28,
  f64Load: 0x2b,
  i32Store: 0x36,
  f64Store: 0x39,
  i32Const: 0x41,
  f64Const: 0x44,
  i32Eqz: 0x45,
  i32Ne: 0x47,
  f64Lt: 0x63,
  f64Gt: 0x64,
  f64Le: 0x65,
  f64Ge: 0x66,
  i32And: 0x71,
  i32Or: 0x72,
  i32Xor: 0x73,
  i32ShrU: 0x76,
  f64Trunc: 0x9d,
  f64Add: 0xa0,
  f64Sub: 0xa1,
  f64Min: 0xa4,
  f64Max: 0xa5,
} as const;

/** Value types (section 5.3.1). */
export const TYPE = { i32: 0x7f, f64: 0x7c, func: 0x60, void: 0x40 } as const;

/** Section ids (section 5.5.2). */
export const SECTION = { type: 1, import: 2, function: 3, export: 7, code: 10 } as const;

/** `align` immediates: log2 of the natural alignment of each access. */
export const ALIGN = { cell: 2, f64: 3 } as const;

/** Bytes of a cell: a bit, an edge memory, a force mask, a block's boolean, a flow record entry. */
export const CELL = 4;
