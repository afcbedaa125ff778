/**
 * The interface of each IEC 61131-3 standard function block (clause 6.6.3.5, Tables 43–46): its
 * formal parameters, their types, and which input takes the rung's power flow and which output
 * passes it on. One table keyed by block type, so a new type that is not described fails to compile.
 */
import type { BlockType } from './schema';

export type ParamType = 'BOOL' | 'TIME' | 'INT';

export interface BlockParam {
  name: string;
  type: ParamType;
}

export interface BlockSpec {
  /** Inputs in the order of the standard's declaration. */
  inputs: readonly BlockParam[];
  outputs: readonly BlockParam[];
  /** The BOOL input wired to the rung on the left. */
  powerIn: string;
  /** The BOOL output that carries power flow on to the right. */
  powerOut: string;
  /** Inputs that must be given as operands (the preset of a timer or counter). */
  required: readonly string[];
  /** Short plain-language purpose, shown in the palette and inspector. */
  summary: string;
}

const bool = (name: string): BlockParam => ({ name, type: 'BOOL' });
const time = (name: string): BlockParam => ({ name, type: 'TIME' });
const int = (name: string): BlockParam => ({ name, type: 'INT' });

export const BLOCK_SPECS = {
  TON: {
    inputs: [bool('IN'), time('PT')],
    outputs: [bool('Q'), time('ET')],
    powerIn: 'IN',
    powerOut: 'Q',
    required: ['PT'],
    summary: 'On-delay timer: Q turns on once IN has been on for PT.',
  },
  TOF: {
    inputs: [bool('IN'), time('PT')],
    outputs: [bool('Q'), time('ET')],
    powerIn: 'IN',
    powerOut: 'Q',
    required: ['PT'],
    summary: 'Off-delay timer: Q stays on for PT after IN turns off.',
  },
  TP: {
    inputs: [bool('IN'), time('PT')],
    outputs: [bool('Q'), time('ET')],
    powerIn: 'IN',
    powerOut: 'Q',
    required: ['PT'],
    summary: 'Pulse timer: a rising edge on IN gives a pulse of length PT on Q.',
  },
  CTU: {
    inputs: [bool('CU'), bool('R'), int('PV')],
    outputs: [bool('Q'), int('CV')],
    powerIn: 'CU',
    powerOut: 'Q',
    required: ['PV'],
    summary: 'Up counter: each rising edge on CU adds 1; Q when CV ≥ PV; R clears.',
  },
  CTD: {
    inputs: [bool('CD'), bool('LD'), int('PV')],
    outputs: [bool('Q'), int('CV')],
    powerIn: 'CD',
    powerOut: 'Q',
    required: ['PV'],
    summary: 'Down counter: LD loads PV; each rising edge on CD subtracts 1; Q when CV ≤ 0.',
  },
  CTUD: {
    inputs: [bool('CU'), bool('CD'), bool('R'), bool('LD'), int('PV')],
    outputs: [bool('QU'), bool('QD'), int('CV')],
    powerIn: 'CU',
    powerOut: 'QU',
    required: ['PV'],
    summary: 'Up/down counter: CU adds, CD subtracts; QU when CV ≥ PV, QD when CV ≤ 0.',
  },
  R_TRIG: {
    inputs: [bool('CLK')],
    outputs: [bool('Q')],
    powerIn: 'CLK',
    powerOut: 'Q',
    required: [],
    summary: 'Rising edge: Q is on for one scan when CLK turns on.',
  },
  F_TRIG: {
    inputs: [bool('CLK')],
    outputs: [bool('Q')],
    powerIn: 'CLK',
    powerOut: 'Q',
    required: [],
    summary: 'Falling edge: Q is on for one scan when CLK turns off.',
  },
  SR: {
    inputs: [bool('S1'), bool('R')],
    outputs: [bool('Q1')],
    powerIn: 'S1',
    powerOut: 'Q1',
    required: [],
    summary: 'Set-dominant bistable: Q1 := S1 OR (NOT R AND Q1).',
  },
  RS: {
    inputs: [bool('S'), bool('R1')],
    outputs: [bool('Q1')],
    powerIn: 'S',
    powerOut: 'Q1',
    required: [],
    summary: 'Reset-dominant bistable: Q1 := NOT R1 AND (S OR Q1).',
  },
} as const satisfies Record<BlockType, BlockSpec>;

export const BLOCK_TYPES = Object.keys(BLOCK_SPECS) as BlockType[];

/** The inputs a student gives as operands: every input except the power-flow one. */
export function operandInputs(type: BlockType): readonly BlockParam[] {
  const spec: BlockSpec = BLOCK_SPECS[type];
  return spec.inputs.filter((p) => p.name !== spec.powerIn);
}

export function blockOutput(type: BlockType, member: string): BlockParam | undefined {
  const spec: BlockSpec = BLOCK_SPECS[type];
  return spec.outputs.find((p) => p.name === member);
}
