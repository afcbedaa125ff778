/**
 * The ladder program document: the one data model every part of Rungwright reads.
 *
 * Plain, serialisable, read-only JSON with stable string ids and a format version. The zod schemas
 * are the single definition; the TypeScript types are inferred from them. Layout on the canvas is
 * computed from the network, so no pixel position is ever stored here.
 */
import { z } from 'zod';

export const PROGRAM_FORMAT = 'rungwright.program';
export const PROGRAM_VERSION = 1;

/** A stable id: letters, digits, `_` and `-`, unique within the program. */
export const IdSchema = z
  .string()
  .min(1, 'an id cannot be empty')
  .max(64, 'an id is at most 64 characters')
  .regex(/^[A-Za-z0-9_-]+$/, 'an id uses only letters, digits, "_" and "-"');

/**
 * What a contact or a block input names: a direct address (`%IX1`, `%QX2`, `%MX10`), a block member
 * (`T1.Q`, `C1.CV`), a tag name, or a constant (`T#2s`, `3`, `TRUE`). Empty while the student has
 * not filled it in; validation reports that, the schema does not refuse it, so a half-drawn rung
 * can be saved.
 */
export const OperandSchema = z.string().max(64, 'an operand is at most 64 characters');

/** `| |` NO contact, `|/|` NC contact, `|P|` rising-edge contact, `|N|` falling-edge contact (IEC 61131-3). */
export const ContactVariantSchema = z.enum(['no', 'nc', 'rising', 'falling']);
/** `( )` coil, `(/)` negated coil, `(S)` set coil, `(R)` reset coil (IEC 61131-3). */
/** `positive` / `negative`: the transition-sensing coils -(P)- / -(N)- of IEC 61131-3. */
export const CoilVariantSchema = z.enum(['coil', 'negated', 'set', 'reset', 'positive', 'negative']);
/** IEC 61131-3 standard function blocks offered in the palette. */
export const BlockTypeSchema = z.enum(['TON', 'TOF', 'TP', 'CTU', 'CTD', 'CTUD', 'R_TRIG', 'F_TRIG', 'SR', 'RS']);

export const ContactSchema = z.object({
  kind: z.literal('contact'),
  id: IdSchema,
  variant: ContactVariantSchema,
  operand: OperandSchema,
  /** Free text shown below the element. */
  comment: z.string().max(500).optional(),
});

export const CoilSchema = z.object({
  kind: z.literal('coil'),
  id: IdSchema,
  variant: CoilVariantSchema,
  operand: OperandSchema,
  comment: z.string().max(500).optional(),
});

/**
 * A standard function block. Its power-flow input (IN, CU, CD, CLK, S1 or S — see `BLOCK_SPECS` in
 * `blocks.ts`) is wired to the rung on its left; every other input is an operand in `inputs`, keyed
 * by the formal parameter name (`PT`, `PV`, `R`, `LD`…). Its power-flow output (Q, QU or Q1) carries
 * on to the right, so a block can end a rung or feed coils; every output is also readable elsewhere
 * as `<instance>.<member>`.
 */
export const BlockSchema = z.object({
  kind: z.literal('block'),
  id: IdSchema,
  type: BlockTypeSchema,
  /** The instance name, e.g. `T1`; one instance is one piece of memory. */
  instance: z.string().max(32),
  inputs: z.record(z.string(), OperandSchema),
  comment: z.string().max(500).optional(),
});

export const ElementSchema = z.discriminatedUnion('kind', [ContactSchema, CoilSchema, BlockSchema]);

export type ContactVariant = z.infer<typeof ContactVariantSchema>;
export type CoilVariant = z.infer<typeof CoilVariantSchema>;
export type BlockType = z.infer<typeof BlockTypeSchema>;
export type Contact = z.infer<typeof ContactSchema>;
export type Coil = z.infer<typeof CoilSchema>;
export type Block = z.infer<typeof BlockSchema>;
export type Element = z.infer<typeof ElementSchema>;
export type ElementKind = Element['kind'];

/** Left to right: power flows through each item in turn. */
export interface Series {
  kind: 'series';
  id: string;
  items: NetworkNode[];
}

/** Top to bottom branches joined at both ends: the state on the right is the OR of the branches. */
export interface Parallel {
  kind: 'parallel';
  id: string;
  branches: NetworkNode[];
}

export type NetworkNode = Element | Series | Parallel;

/** A node schema that declares its `kind` values, so the union of nodes can pick it by `kind`. */
type KeyedNodeSchema<T> = z.ZodType<T> & z.core.$ZodTypeDiscriminable;

export const SeriesSchema: KeyedNodeSchema<Series> = z.lazy(() =>
  z.object({ kind: z.literal('series'), id: IdSchema, items: z.array(NetworkNodeSchema).max(200) }),
);

export const ParallelSchema: KeyedNodeSchema<Parallel> = z.lazy(() =>
  z.object({ kind: z.literal('parallel'), id: IdSchema, branches: z.array(NetworkNodeSchema).max(64) }),
);

/**
 * Picked by `kind`, not tried in turn: a plain union parsed a node against every option before
 * the one that fits, which made the schema most of a long program's load (three times the work
 * and the garbage on a 200-rung program, on the workbench's first paint and on every save).
 */
export const NetworkNodeSchema: z.ZodType<NetworkNode> = z.lazy(() =>
  z.discriminatedUnion('kind', [ContactSchema, CoilSchema, BlockSchema, SeriesSchema, ParallelSchema]),
);

export const RungSchema = z.object({
  id: IdSchema,
  comment: z.string().max(2000).default(''),
  /** Always a series at the root: contacts and branches, closing in coils or a block. */
  network: SeriesSchema,
});
export type Rung = z.infer<typeof RungSchema>;

/** A symbol: a name a student can use instead of an address. */
export const TagSchema = z.object({
  name: z
    .string()
    .min(1, 'a tag needs a name')
    .max(32, 'a tag name is at most 32 characters')
    .regex(/^[A-Za-z_][A-Za-z0-9_]*$/, 'a tag name starts with a letter or "_" and uses letters, digits and "_"'),
  address: z.string().max(16),
  comment: z.string().max(200).default(''),
  /**
   * The variable keeps its value through a power loss and a warm restart (IEC 61131-3 RETAIN);
   * absent means not retained. Meaningful for output and memory bits.
   */
  retain: z.boolean().optional(),
});
export type Tag = z.infer<typeof TagSchema>;

/**
 * How big a program may be, so that every tool that walks it (validation, layout, compile, export,
 * the zod schema itself, which recurses once per level) does bounded work. Checked by
 * `checkDocumentBounds` (`bounds.ts`) on the raw JSON before the schema runs, and by the editor
 * after every edit. A lab program uses a few levels and tens of elements per rung.
 */
export const DOCUMENT_LIMITS = {
  /** Series and parallel branches nested in one another; the rung's root series is level 1. */
  depth: 32,
  /** Network nodes (elements, series and parallel branches) in one rung. */
  nodesPerRung: 500,
  /**
   * Network nodes in the whole program. A 5,000-rung program of 15,000 nodes took 1.1–1.5 s of CPU
   * to export as PLCopen XML (tests/perf/health.bench.ts), against the worker's 5 s limit.
   */
  nodesPerProgram: 20_000,
} as const;

export const ProgramSchema = z.object({
  format: z.literal(PROGRAM_FORMAT),
  version: z.literal(PROGRAM_VERSION),
  title: z.string().max(200).default('Untitled program'),
  description: z.string().max(10_000).default(''),
  tags: z.array(TagSchema).max(500).default([]),
  rungs: z.array(RungSchema).max(5000),
});
export type Program = z.infer<typeof ProgramSchema>;

/** Index path from a rung's root series to a node: `[2, 0, 1]` = items[2].branches[0].items[1]. */
export type NodePath = readonly number[];
