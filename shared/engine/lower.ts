/**
 * Lowering a validated program onto the plan: every operand resolved to an index or a constant,
 * block instances numbered, edge memories and power-flow slots allocated in document order.
 *
 * Validation (`validateProgram`) is the place where a student's mistakes are explained; this pass
 * re-checks what the engine relies on, so a gap in validation becomes a located diagnostic here,
 * never an exception or a wrong run.
 */
import { addressInRange, formatAddress, type AddressSpace } from '../ladder/addresses';
import { BLOCK_SPECS, blockOutput, operandInputs, type BlockParam, type ParamType } from '../ladder/blocks';
import { buildSymbolTable, operandKey, resolveOperand, symbolKey, type Operand, type SymbolTable } from '../ladder/operands';
import type { Block, Coil, Contact, NetworkNode, Program } from '../ladder/schema';
import { engineDiagnostic, type Diagnostic } from './diagnostic';
import { COIL_KINDS, CONTACT_KINDS } from './elements';
import { bitLayout, type BitLayout, type Plan, type PlanBlockInput, type PlanEdge, type PlanInstance } from './plan';
import type { PlanNode, PlanSeries, PlanSource } from './plan';

/** The outcome of lowering: a plan, or the diagnostics that stopped it. */
export type LowerResult = { ok: true; plan: Plan } | { ok: false; diagnostics: Diagnostic[] };

interface Lowering {
  readonly space: AddressSpace;
  readonly layout: BitLayout;
  readonly symbols: SymbolTable;
  readonly instanceIndex: Map<string, number>;
  readonly instances: PlanInstance[];
  readonly calledInstances: Set<number>;
  readonly edges: PlanEdge[];
  readonly flowIds: string[];
  readonly diagnostics: Diagnostic[];
  rungId: string;
  elementCount: number;
}

/** Lower a program that validation passed. Never throws for anything in the document. */
export function lowerProgram(program: Program, space: AddressSpace): LowerResult {
  const symbols = buildSymbolTable(program);
  const context: Lowering = {
    space,
    layout: bitLayout(space),
    symbols,
    instanceIndex: new Map(),
    instances: [],
    calledInstances: new Set(),
    edges: [],
    flowIds: [],
    diagnostics: [],
    rungId: '',
    elementCount: 0,
  };
  for (const [key, type] of symbols.instances) {
    context.instanceIndex.set(key, context.instances.length);
    context.instances.push({ name: symbols.spellings.get(key) ?? key, key, type });
  }
  const flowIndex = new Map<string, number>();
  const rungs = program.rungs.map((rung) => {
    context.rungId = rung.id;
    const network = lowerNode(rung.network, [], context) as PlanSeries;
    flowIndex.set(rung.id, network.flow);
    return { id: rung.id, network };
  });
  if (context.diagnostics.length > 0) return { ok: false, diagnostics: context.diagnostics };
  context.flowIds.forEach((id, index) => {
    if (!flowIndex.has(id)) flowIndex.set(id, index);
  });
  return {
    ok: true,
    plan: {
      program,
      space,
      layout: context.layout,
      symbols,
      rungs,
      instances: context.instances,
      edges: context.edges,
      flowIds: context.flowIds,
      flowIndex,
      elementCount: context.elementCount,
    },
  };
}

function lowerNode(node: NetworkNode, path: number[], context: Lowering): PlanNode {
  const flow = context.flowIds.length;
  context.flowIds.push(node.id);
  switch (node.kind) {
    case 'series':
      return { op: 'series', id: node.id, flow, items: node.items.map((item, i) => lowerNode(item, [...path, i], context)) };
    case 'parallel':
      return {
        op: 'parallel',
        id: node.id,
        flow,
        branches: node.branches.map((branch, i) => lowerNode(branch, [...path, i], context)),
      };
    case 'contact':
      context.elementCount += 1;
      return lowerContact(node, flow, path, context);
    case 'coil':
      context.elementCount += 1;
      return lowerCoil(node, flow, path, context);
    case 'block':
      context.elementCount += 1;
      return lowerBlock(node, flow, path, context);
  }
}

const UNUSABLE: PlanSource = { kind: 'constant', value: 0 };

function lowerContact(contact: Contact, flow: number, path: number[], context: Lowering): PlanNode {
  const report = (message: string): void => {
    context.diagnostics.push(engineDiagnostic(context.rungId, path, contact.id, contact.operand.trim(), message));
  };
  const resolved = resolveOperand(contact.operand, context.symbols);
  let source = UNUSABLE;
  let edge = -1;
  if (!resolved.ok) report(resolved.error);
  else {
    source = sourceFor(resolved.value, 'BOOL', context, report) ?? UNUSABLE;
    if (CONTACT_KINDS[contact.variant].edge) {
      edge = context.edges.length;
      context.edges.push({ elementId: contact.id, operand: operandKey(resolved.value) });
    }
  }
  return { op: 'contact', id: contact.id, flow, variant: contact.variant, source, edge };
}

function lowerCoil(coil: Coil, flow: number, path: number[], context: Lowering): PlanNode {
  const report = (message: string): void => {
    context.diagnostics.push(engineDiagnostic(context.rungId, path, coil.id, coil.operand.trim(), message));
  };
  const resolved = resolveOperand(coil.operand, context.symbols);
  let bit = -1;
  let edge = -1;
  if (!resolved.ok) report(resolved.error);
  else if (resolved.value.kind !== 'bit') report(`a coil writes a bit (%QX or %MX); "${coil.operand.trim()}" is not one`);
  else if (resolved.value.address.area === 'I') {
    report(`a coil cannot write the input ${formatAddress(resolved.value.address)}: inputs come from the field`);
  } else {
    const range = addressInRange(resolved.value.address, context.space);
    if (range !== null) report(range);
    else bit = bitIndex(resolved.value, context.layout);
    if (COIL_KINDS[coil.variant].edge) {
      edge = context.edges.length;
      context.edges.push({ elementId: coil.id, operand: operandKey(resolved.value) });
    }
  }
  return { op: 'coil', id: coil.id, flow, variant: coil.variant, bit, edge };
}

function lowerBlock(block: Block, flow: number, path: number[], context: Lowering): PlanNode {
  const report = (message: string, field?: string): void => {
    context.diagnostics.push(engineDiagnostic(context.rungId, path, block.id, block.instance.trim(), message, field));
  };
  const spec = BLOCK_SPECS[block.type];
  const key = symbolKey(block.instance);
  const instance = context.instanceIndex.get(key) ?? -1;
  if (instance < 0) report(`the ${block.type} block needs an instance name, e.g. ${block.type.startsWith('T') ? 'T1' : 'C1'}`);
  else if (context.instances[instance]!.type !== block.type) {
    report(`"${block.instance}" is already a ${context.instances[instance]!.type}; give this ${block.type} another name`);
  }
  const chargesTime = instance >= 0 && !context.calledInstances.has(instance);
  if (instance >= 0) context.calledInstances.add(instance);
  const inputs = operandInputs(block.type).map((param) => lowerBlockInput(block, param, context, report));
  return {
    op: 'block',
    id: block.id,
    flow,
    type: block.type,
    instance,
    powerIn: spec.powerIn,
    powerOut: spec.powerOut,
    inputs,
    chargesTime,
  };
}

function lowerBlockInput(
  block: Block,
  param: BlockParam,
  context: Lowering,
  report: (message: string, field?: string) => void,
): PlanBlockInput {
  const given = Object.entries(block.inputs).find(([name]) => name.toUpperCase() === param.name)?.[1] ?? '';
  const required = (BLOCK_SPECS[block.type].required as readonly string[]).includes(param.name);
  if (given.trim() === '') {
    if (required) report(`${block.instance || block.type}.${param.name} needs a value`, param.name);
    return { name: param.name, type: param.type, source: UNUSABLE };
  }
  const resolved = resolveOperand(given, context.symbols);
  if (!resolved.ok) {
    report(`${param.name}: ${resolved.error}`, param.name);
    return { name: param.name, type: param.type, source: UNUSABLE };
  }
  const source = sourceFor(resolved.value, param.type, context, (message) => report(`${param.name}: ${message}`, param.name));
  return { name: param.name, type: param.type, source: source ?? UNUSABLE };
}

const TYPE_NOUNS = {
  BOOL: 'a TRUE/FALSE value (a bit, a tag, a block output such as T1.Q, or TRUE/FALSE)',
  TIME: 'a duration (e.g. T#2s, or a timer output such as T1.ET)',
  INT: 'a whole number (e.g. 3, or a counter output such as C1.CV)',
} as const satisfies Record<ParamType, string>;

const CONSTANT_TYPES = { bool: 'BOOL', time: 'TIME', int: 'INT' } as const;

/** Map an operand to a source of the wanted type, or report why it does not fit. */
function sourceFor(
  operand: Operand,
  wanted: ParamType,
  context: Lowering,
  report: (message: string) => void,
): PlanSource | null {
  const mismatch = (): null => {
    report(`expected ${TYPE_NOUNS[wanted]}`);
    return null;
  };
  switch (operand.kind) {
    case 'bit': {
      if (wanted !== 'BOOL') return mismatch();
      const range = addressInRange(operand.address, context.space);
      if (range !== null) {
        report(range);
        return null;
      }
      return { kind: 'bit', bit: bitIndex(operand, context.layout) };
    }
    case 'member': {
      const instance = context.instanceIndex.get(operand.instance);
      const output = instance === undefined ? undefined : blockOutput(context.instances[instance]!.type, operand.member);
      if (instance === undefined || output === undefined) {
        report(`"${operand.instance}.${operand.member}" is not an output of a block in this program`);
        return null;
      }
      if (output.type !== wanted) return mismatch();
      return { kind: 'member', instance, member: output.name, type: output.type };
    }
    case 'bool':
    case 'time':
    case 'int': {
      if (CONSTANT_TYPES[operand.kind] !== wanted) return mismatch();
      const value = operand.kind === 'bool' ? (operand.value ? 1 : 0) : operand.kind === 'time' ? operand.ms : operand.value;
      return { kind: 'constant', value };
    }
  }
}

/** Position of an address in the bit image. */
export function bitIndex(operand: Extract<Operand, { kind: 'bit' }>, layout: BitLayout): number {
  const { area, index } = operand.address;
  const base = area === 'I' ? layout.inputs : area === 'Q' ? layout.outputs : layout.memory;
  return base + index - 1;
}
