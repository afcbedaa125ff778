/**
 * Contacts and coils, one table entry per variant: what it does on 0/1 values (the reference the
 * engine is tested against) and the WebAssembly the kernel emits for it. A variant that keeps a
 * memory from one scan to the next (an edge contact) says so with `edge`, and lowering gives it an
 * edge memory; so a new variant is one entry here (plus its name in the document schema).
 *
 * Bits are 0 or 1, never other values, so series is AND, parallel is OR and negation is `eqz`.
 * Emitters take plain numbers (no callbacks): the kernel calls one per element, thousands of
 * times per compile.
 */
import type { CoilVariant, ContactVariant } from '../ladder/schema';
import type { Code } from './wasm/code';
import { OP } from './wasm/opcodes';

/** Where a contact's emitter works: its edge memory (edge variants) and a scratch i32 local. */
export interface ContactEmit {
  readonly code: Code;
  /** Byte address of the edge memory; -1 for a variant without one. */
  readonly edge: number;
  readonly temp: number;
}

export interface ContactKind {
  /** Keeps the value it examined in the previous scan. */
  readonly edge: boolean;
  /**
   * What it passes, from the examined value `v` and, for edge kinds, the value `last` examined in
   * the previous scan (IEC 61131-3 clause 8.2.4 [memory for the sub-number]).
   */
  readonly passes: (v: number, last: number) => number;
  /** The stack holds the power on its left, then the examined value; leave the power on its right. */
  readonly emit: (e: ContactEmit) => void;
}

/** The edge memory takes the examined value, kept in the scratch local by the variant's emitter. */
function rememberValue({ code, edge, temp }: ContactEmit): void {
  code.op(OP.i32And);
  code.storeBase();
  code.get(temp);
  code.endStoreCell(edge);
}

export const CONTACT_KINDS = {
  /** NO passes when TRUE. */
  no: {
    edge: false,
    passes: (v) => v,
    emit: ({ code }) => code.op(OP.i32And),
  },
  /** NC passes when FALSE. */
  nc: {
    edge: false,
    passes: (v) => v ^ 1,
    emit: ({ code }) => {
      code.op(OP.i32Eqz);
      code.op(OP.i32And);
    },
  },
  /** Rising edge: passes for one scan when the value goes FALSE → TRUE. */
  rising: {
    edge: true,
    passes: (v, last) => v & (last ^ 1),
    emit: (e) => {
      const { code } = e;
      code.tee(e.temp);
      code.loadCell(e.edge);
      code.op(OP.i32Eqz);
      code.op(OP.i32And);
      rememberValue(e);
    },
  },
  /** Falling edge: passes for one scan when the value goes TRUE → FALSE. */
  falling: {
    edge: true,
    passes: (v, last) => (v ^ 1) & last,
    emit: (e) => {
      const { code } = e;
      code.tee(e.temp);
      code.op(OP.i32Eqz);
      code.loadCell(e.edge);
      code.op(OP.i32And);
      rememberValue(e);
    },
  },
} as const satisfies Record<ContactVariant, ContactKind>;

/**
 * Where a coil's emitter works. It pushes the value the coil leaves in its variable; the kernel
 * stores it (unless the bit is forced) and, for a variant with `edge`, then stores the power into
 * the edge memory.
 */
export interface CoilEmit {
  readonly code: Code;
  /** The i32 local holding the power on the coil's left (0/1). */
  readonly power: number;
  /** Byte address of the variable (its value before this write is there). */
  readonly bit: number;
  /** Byte address of the edge memory: the power on its left in the previous scan; -1 without. */
  readonly edge: number;
}

export interface CoilKind {
  /** Keeps the power on its left in the previous scan (a transition-sensing coil does). */
  readonly edge: boolean;
  /**
   * The value the coil leaves in its variable, from the power `p` on its left, the variable's
   * `old` value and, with `edge`, the power `last` of the previous scan (IEC 61131-3 clause 8.2.5
   * [memory for the sub-number]).
   */
  readonly writes: (p: number, old: number, last: number) => number;
  readonly emit: (e: CoilEmit) => void;
}

export const COIL_KINDS = {
  /** Writes the power. */
  coil: {
    edge: false,
    writes: (p) => p,
    emit: ({ code, power }) => code.get(power),
  },
  /** Writes NOT the power. */
  negated: {
    edge: false,
    writes: (p) => p ^ 1,
    emit: ({ code, power }) => {
      code.get(power);
      code.op(OP.i32Eqz);
    },
  },
  /** Sets the variable on power, otherwise leaves it. */
  set: {
    edge: false,
    writes: (p, old) => p | old,
    emit: ({ code, power, bit }) => {
      code.get(power);
      code.loadCell(bit);
      code.op(OP.i32Or);
    },
  },
  /** Clears the variable on power, otherwise leaves it. */
  reset: {
    edge: false,
    writes: (p, old) => old & (p ^ 1),
    emit: ({ code, power, bit }) => {
      code.loadCell(bit);
      code.get(power);
      code.op(OP.i32Eqz);
      code.op(OP.i32And);
    },
  },
  /**
   * Positive transition-sensing coil -(P)-: its variable is TRUE for the one evaluation in which
   * the power on its left went FALSE → TRUE, FALSE otherwise (IEC 61131-3, LD coils
   * [memory for the table number]).
   */
  positive: {
    edge: true,
    writes: (p, _old, last) => p & (last ^ 1),
    emit: ({ code, power, edge }) => {
      code.get(power);
      code.loadCell(edge);
      code.op(OP.i32Eqz);
      code.op(OP.i32And);
    },
  },
  /** Negative transition-sensing coil -(N)-: TRUE for one evaluation when the power went TRUE → FALSE. */
  negative: {
    edge: true,
    writes: (p, _old, last) => (p ^ 1) & last,
    emit: ({ code, power, edge }) => {
      code.get(power);
      code.op(OP.i32Eqz);
      code.loadCell(edge);
      code.op(OP.i32And);
    },
  },
} as const satisfies Record<CoilVariant, CoilKind>;

/** The contact variants by number: a plan's node table holds the number (`PlanNodes`). */
export const CONTACT_VARIANTS = Object.keys(CONTACT_KINDS) as ContactVariant[];
/** The coil variants by number. */
export const COIL_VARIANTS = Object.keys(COIL_KINDS) as CoilVariant[];

/** Each variant's number, the other way round. */
export const CONTACT_VARIANT_NUMBER = Object.fromEntries(CONTACT_VARIANTS.map((v, i) => [v, i])) as Record<ContactVariant, number>;
export const COIL_VARIANT_NUMBER = Object.fromEntries(COIL_VARIANTS.map((v, i) => [v, i])) as Record<CoilVariant, number>;
