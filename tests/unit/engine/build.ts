/**
 * Small builders for test programs. Each `programBuilder()` numbers its own ids, so tests stay
 * independent of each other.
 */
import type { Block, BlockType, Coil, CoilVariant, Contact, ContactVariant, NetworkNode, Parallel, Program, Series, Tag } from '@shared/ladder/schema';
import { compile } from '@shared/engine';
import type { Plan } from '@shared/engine';

export interface ProgramBuilder {
  no(operand: string): Contact;
  nc(operand: string): Contact;
  contact(variant: ContactVariant, operand: string): Contact;
  coil(operand: string, variant?: CoilVariant): Coil;
  block(type: BlockType, instance: string, inputs?: Record<string, string>): Block;
  series(...items: NetworkNode[]): Series;
  parallel(...branches: NetworkNode[]): Parallel;
  /** A rung: its items in series from the left rail. */
  rung(...items: NetworkNode[]): Program['rungs'][number];
  program(rungs: Program['rungs'], tags?: Tag[]): Program;
}

export function programBuilder(): ProgramBuilder {
  let next = 0;
  const id = (prefix: string): string => `${prefix}${(next += 1)}`;
  const builder: ProgramBuilder = {
    no: (operand) => builder.contact('no', operand),
    nc: (operand) => builder.contact('nc', operand),
    contact: (variant, operand) => ({ kind: 'contact', id: id('e'), variant, operand }),
    coil: (operand, variant = 'coil') => ({ kind: 'coil', id: id('e'), variant, operand }),
    block: (type, instance, inputs = {}) => ({ kind: 'block', id: id('b'), type, instance, inputs }),
    series: (...items) => ({ kind: 'series', id: id('s'), items }),
    parallel: (...branches) => ({ kind: 'parallel', id: id('p'), branches }),
    rung: (...items) => ({ id: id('r'), comment: '', network: builder.series(...items) }),
    program: (rungs, tags = []) => ({
      format: 'rungwright.program',
      version: 1,
      title: 'test program',
      description: '',
      tags,
      rungs,
    }),
  };
  return builder;
}

/** Compile or fail the test with the diagnostics. */
export function planOf(program: Program): Plan {
  const result = compile(program);
  if (!result.ok) throw new Error(`compile failed: ${result.diagnostics.map((d) => d.message).join('; ')}`);
  return result.plan;
}
