/**
 * Random programs that compile, for comparing the engine with the reference interpreter: every
 * contact variant, coil variant and block type, nested branches, blocks called from several
 * rungs, block inputs taken from other blocks' outputs (including the called instance's own), and
 * outputs on parallel branches.
 */
import fc from 'fast-check';
import type { BlockType, CoilVariant, ContactVariant, NetworkNode, Program } from '@shared/ladder/schema';
import { programBuilder, type ProgramBuilder } from '../build';

/** One instance name per block type (two calls of a type share the instance). */
const INSTANCE = {
  TON: 'TA',
  TOF: 'TB',
  TP: 'TC',
  CTU: 'CA',
  CTD: 'CB',
  CTUD: 'CC',
  R_TRIG: 'RA',
  F_TRIG: 'FA',
  SR: 'SA',
  RS: 'SB',
} as const satisfies Record<BlockType, string>;

const BOOL_MEMBERS = ['TA.Q', 'TB.Q', 'TC.Q', 'CA.Q', 'CB.Q', 'CC.QU', 'CC.QD', 'RA.Q', 'FA.Q', 'SA.Q1', 'SB.Q1'];
const TYPES = Object.keys(INSTANCE) as BlockType[];

type Shape =
  | { contact: ContactVariant; operand: string }
  | { series: Shape[] }
  | { parallel: Shape[] };

interface RungShape {
  condition: Shape[];
  block: { type: BlockType; inputs: Record<string, string> } | null;
  coils: Array<{ variant: CoilVariant; operand: string; guard: Shape | null }>;
}

const bit = fc.oneof(
  fc.integer({ min: 1, max: 8 }).map((i) => `%IX${i}`),
  fc.integer({ min: 1, max: 6 }).map((i) => `%QX${i}`),
  fc.integer({ min: 1, max: 8 }).map((i) => `%MX${i}`),
);

/** Bits, block outputs (only those of blocks the program calls: see `usable`), constants. */
const operand = fc.oneof({ weight: 6, arbitrary: bit }, { weight: 2, arbitrary: fc.constantFrom(...BOOL_MEMBERS) }, { weight: 1, arbitrary: fc.constantFrom('TRUE', 'FALSE') });

const contact: fc.Arbitrary<Shape> = fc.record({
  contact: fc.constantFrom<ContactVariant>('no', 'no', 'nc', 'nc', 'rising', 'falling'),
  operand,
});

const shape: fc.Arbitrary<Shape> = fc.letrec<{ node: Shape }>((tie) => ({
  node: fc.oneof(
    { depthSize: 'small', withCrossShrink: true },
    contact,
    fc.record({ series: fc.array(tie('node'), { minLength: 1, maxLength: 3 }) }),
    fc.record({ parallel: fc.array(tie('node'), { minLength: 2, maxLength: 3 }) }),
  ),
})).node;

const time = fc.oneof(fc.integer({ min: 0, max: 60 }).map((n) => `T#${n * 10}ms`), fc.constantFrom('TA.ET', 'TB.ET', 'TC.ET'));
const count = fc.oneof(fc.integer({ min: -2, max: 6 }).map(String), fc.constantFrom('CA.CV', 'CB.CV', 'CC.CV'));

const blockInputs: Record<BlockType, fc.Arbitrary<Record<string, string>>> = {
  TON: fc.record({ PT: time }),
  TOF: fc.record({ PT: time }),
  TP: fc.record({ PT: time }),
  CTU: fc.record({ PV: count, R: bit }),
  CTD: fc.record({ PV: count, LD: bit }),
  CTUD: fc.record({ PV: count, CD: operand, R: bit, LD: bit }),
  R_TRIG: fc.constant({}),
  F_TRIG: fc.constant({}),
  SR: fc.record({ R: operand }),
  RS: fc.record({ R1: operand }),
};

const block = fc.constantFrom(...TYPES).chain((type) => blockInputs[type].map((inputs) => ({ type, inputs })));

const writable = fc.oneof(fc.integer({ min: 1, max: 6 }).map((i) => `%QX${i}`), fc.integer({ min: 1, max: 8 }).map((i) => `%MX${i}`));

const coil = fc.record({
  variant: fc.constantFrom<CoilVariant>('coil', 'coil', 'negated', 'set', 'reset'),
  operand: writable,
  guard: fc.option(contact, { freq: 2 }),
});

const rung: fc.Arbitrary<RungShape> = fc.record({
  condition: fc.array(shape, { minLength: 1, maxLength: 4 }),
  block: fc.option(block, { freq: 2 }),
  coils: fc.array(coil, { minLength: 1, maxLength: 2 }),
});

function toNode(s: Shape, b: ProgramBuilder): NetworkNode {
  if ('contact' in s) return b.contact(s.contact, s.operand);
  if ('series' in s) return b.series(...s.series.map((x) => toNode(x, b)));
  return b.parallel(...s.parallel.map((x) => toNode(x, b)));
}

/** Members of blocks the program never calls would not compile: map them to a value of the same type instead. */
function usable(text: string, called: ReadonlySet<string>): string {
  const [instance, member] = text.split('.');
  if (member === undefined || called.has(instance!)) return text;
  return member === 'ET' ? 'T#50ms' : member === 'CV' ? '2' : '%MX1';
}

function fixShape(s: Shape, called: ReadonlySet<string>): Shape {
  if ('contact' in s) return { ...s, operand: usable(s.operand, called) };
  if ('series' in s) return { series: s.series.map((x) => fixShape(x, called)) };
  return { parallel: s.parallel.map((x) => fixShape(x, called)) };
}

function toProgram(rungs: RungShape[]): Program {
  const b = programBuilder();
  const called = new Set(rungs.flatMap((r) => (r.block ? [INSTANCE[r.block.type]] : [])));
  return b.program(
    rungs.map((r) => {
      const items = r.condition.map((s) => toNode(fixShape(s, called), b));
      if (r.block) {
        const inputs = Object.fromEntries(Object.entries(r.block.inputs).map(([k, v]) => [k, usable(v, called)]));
        items.push(b.block(r.block.type, INSTANCE[r.block.type], inputs));
      }
      const coils = r.coils.map((c) => (c.guard ? b.series(toNode(fixShape(c.guard, called), b), b.coil(c.operand, c.variant)) : b.coil(c.operand, c.variant)));
      items.push(coils.length === 1 && !('items' in coils[0]!) ? coils[0]! : b.parallel(...coils));
      return b.rung(...items);
    }),
  );
}

/** A program of 1 to 6 random rungs. */
export const randomProgram: fc.Arbitrary<Program> = fc.array(rung, { minLength: 1, maxLength: 6 }).map(toProgram);
