/**
 * Lowering a validated program onto the plan: every operand resolved to an index or a constant,
 * block instances numbered, edge memories and power-flow slots allocated in document order.
 *
 * Validation (`validateProgram`) is the place where a student's mistakes are explained; this pass
 * re-checks what the engine relies on, so a gap in validation becomes a located diagnostic here,
 * never an exception or a wrong run. It runs on every edit while a program runs, so it resolves
 * each distinct operand text once and builds a node's path only to report a problem.
 */
import { addressInRange, formatAddress, type AddressSpace } from '../ladder/addresses';
import { BLOCK_SPECS, blockOutput, operandInputs, type BlockParam, type ParamType } from '../ladder/blocks';
import { buildSymbolTable, operandKey, operandResolutions, resolveOperand, symbolKey, type Operand, type SymbolTable } from '../ladder/operands';
import type { Result } from '../ladder/result';
import type { Block, Coil, Contact, NetworkNode, Program } from '../ladder/schema';
import { engineDiagnostic, type Diagnostic } from './diagnostic';
import { COIL_KINDS, COIL_VARIANT_NUMBER, CONTACT_KINDS, CONTACT_VARIANT_NUMBER } from './elements';
import { bitLayout, NODE_OP, NODE_STRIDE, rungsFromNodes, type BitLayout, type Plan, type PlanBlockInput, type PlanEdge, type PlanInstance } from './plan';
import type { PlanBlock, PlanNodes, PlanOp, PlanRung, PlanSource } from './plan';

/** What a contact's operand text reads: a source, or the message that says why it cannot. */
interface ContactOperand {
  readonly source: PlanSource | string;
  /** The source's index in the plan's `sources`; -1 when it did not resolve. */
  readonly index: number;
  /** The operand's canonical text, for an edge memory (null when it did not resolve). */
  readonly key: string | null;
}

/** What a coil's operand text writes: a bit, or the message that says why it cannot. */
interface CoilOperand {
  readonly bit: number | string;
  /** The operand's canonical text, for an edge memory (null when it is no writable bit). */
  readonly key: string | null;
}

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
  /** Operand text → its resolution, once per distinct text (shared with validation, see `operandResolutions`). */
  readonly resolved: Map<string, Result<Operand>>;
  /** Operand text → what a contact with it reads (or why it cannot), once per distinct text. */
  readonly contactOperands: Map<string, ContactOperand>;
  /** Operand text → the bit a coil with it writes (or why it cannot), once per distinct text. */
  readonly coilOperands: Map<string, CoilOperand>;
  /** Index path of the node being lowered (copied only into a diagnostic). */
  readonly path: number[];
  rungId: string;
  elementCount: number;
  readonly nodeCounts: Record<PlanOp, number>;
  /** The node table being written (see `PlanNodes`), replaced by one twice as long when full. */
  data: Int32Array;
  readonly sources: PlanSource[];
  readonly blocks: PlanBlock[];
}

/** Nodes the node table first has room for, per rung (generated 1,000-rung programs have 13-18; it grows when a program has more). */
const NODES_PER_RUNG_GUESS = 20;

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
    resolved: operandResolutions(symbols),
    contactOperands: new Map(),
    coilOperands: new Map(),
    path: [],
    rungId: '',
    elementCount: 0,
    nodeCounts: { series: 0, parallel: 0, contact: 0, coil: 0, block: 0 },
    data: new Int32Array(NODE_STRIDE * Math.max(256, NODES_PER_RUNG_GUESS * program.rungs.length)),
    sources: [],
    blocks: [],
  };
  for (const [key, type] of symbols.instances) {
    context.instanceIndex.set(key, context.instances.length);
    context.instances.push({ name: symbols.spellings.get(key) ?? key, key, type });
  }
  const rootFlows = new Int32Array(program.rungs.length);
  const rungElements = new Int32Array(program.rungs.length);
  for (let r = 0; r < program.rungs.length; r += 1) {
    const rung = program.rungs[r]!;
    const before = context.elementCount;
    context.rungId = rung.id;
    rootFlows[r] = context.flowIds.length;
    lowerNode(rung.network, context);
    rungElements[r] = context.elementCount - before;
  }
  if (context.diagnostics.length > 0) return { ok: false, diagnostics: context.diagnostics };
  const { flowIds, sources, blocks } = context;
  // A copy of the part written: the plan keeps no spare room.
  const nodes: PlanNodes = { data: context.data.slice(0, NODE_STRIDE * flowIds.length), roots: rootFlows, elements: rungElements };
  // Only a live view looks nodes up by id, and only the tests and the reference interpreter walk
  // the rungs as objects: each is built on its first use, not on every compile.
  let flowIndex: Map<string, number> | null = null;
  let rungs: PlanRung[] | null = null;
  const indexFlows = (): Map<string, number> => {
    const index = new Map<string, number>();
    for (let r = 0; r < rootFlows.length; r += 1) index.set(program.rungs[r]!.id, rootFlows[r]!);
    for (let at = 0; at < flowIds.length; at += 1) if (!index.has(flowIds[at]!)) index.set(flowIds[at]!, at);
    return index;
  };
  return {
    ok: true,
    plan: {
      program,
      space,
      layout: context.layout,
      symbols,
      get rungs() {
        return (rungs ??= rungsFromNodes(program.rungs, nodes, flowIds, sources, blocks));
      },
      nodes,
      sources,
      blocks,
      instances: context.instances,
      edges: context.edges,
      flowIds,
      get flowIndex() {
        return (flowIndex ??= indexFlows());
      },
      elementCount: context.elementCount,
      nodeCounts: context.nodeCounts,
    },
  };
}

function lowerChildren(children: readonly NetworkNode[], context: Lowering): void {
  const { path } = context;
  for (let i = 0; i < children.length; i += 1) {
    path.push(i);
    lowerNode(children[i]!, context);
    path.pop();
  }
}

/** Write node `at` of the node table (see `PlanNodes`). */
function putNode(context: Lowering, at: number, op: number, a: number, b: number, edge: number): void {
  let { data } = context;
  const base = NODE_STRIDE * at;
  if (base + NODE_STRIDE > data.length) {
    const grown = new Int32Array(2 * data.length);
    grown.set(data);
    context.data = data = grown;
  }
  data[base] = op;
  data[base + 1] = a;
  data[base + 2] = b;
  data[base + 3] = edge;
}

function lowerNode(node: NetworkNode, context: Lowering): void {
  const flow = context.flowIds.length;
  context.flowIds.push(node.id);
  const { nodeCounts } = context;
  switch (node.kind) {
    case 'series':
      nodeCounts.series += 1;
      putNode(context, flow, NODE_OP.series, node.items.length, 0, -1);
      lowerChildren(node.items, context);
      return;
    case 'parallel':
      nodeCounts.parallel += 1;
      putNode(context, flow, NODE_OP.parallel, node.branches.length, 0, -1);
      lowerChildren(node.branches, context);
      return;
    case 'contact':
      nodeCounts.contact += 1;
      context.elementCount += 1;
      lowerContact(node, flow, context);
      return;
    case 'coil':
      nodeCounts.coil += 1;
      context.elementCount += 1;
      lowerCoil(node, flow, context);
      return;
    case 'block':
      nodeCounts.block += 1;
      context.elementCount += 1;
      putNode(context, flow, NODE_OP.block, context.blocks.length, 0, -1);
      context.blocks.push(lowerBlock(node, flow, context));
  }
}

/** Report a problem with the element being lowered. */
function report(context: Lowering, element: Contact | Coil | Block, message: string, field?: string): void {
  const operand = element.kind === 'block' ? element.instance.trim() : element.operand.trim();
  context.diagnostics.push(engineDiagnostic(context.rungId, [...context.path], element.id, operand, message, field));
}

function resolve(text: string, context: Lowering): Result<Operand> {
  let resolved = context.resolved.get(text);
  if (resolved === undefined) {
    resolved = resolveOperand(text, context.symbols);
    context.resolved.set(text, resolved);
  }
  return resolved;
}

const UNUSABLE: PlanSource = { kind: 'constant', value: 0 };

/** What a contact with this operand text reads, with its index in the plan's sources. */
function contactOperand(text: string, context: Lowering): ContactOperand {
  const resolved = resolve(text, context);
  if (!resolved.ok) return { source: resolved.error, index: -1, key: null };
  const source = sourceFor(resolved.value, 'BOOL', context);
  const key = operandKey(resolved.value);
  if (typeof source === 'string') return { source, index: -1, key };
  context.sources.push(source);
  return { source, index: context.sources.length - 1, key };
}

function lowerContact(contact: Contact, flow: number, context: Lowering): void {
  let known = context.contactOperands.get(contact.operand);
  if (known === undefined) {
    known = contactOperand(contact.operand, context);
    context.contactOperands.set(contact.operand, known);
  }
  let edge = -1;
  if (typeof known.source === 'string') report(context, contact, known.source);
  if (known.key !== null && CONTACT_KINDS[contact.variant].edge) {
    edge = context.edges.length;
    context.edges.push({ elementId: contact.id, operand: known.key });
  }
  putNode(context, flow, NODE_OP.contact, CONTACT_VARIANT_NUMBER[contact.variant], known.index, edge);
}

function lowerCoil(coil: Coil, flow: number, context: Lowering): void {
  let known = context.coilOperands.get(coil.operand);
  if (known === undefined) {
    known = coilOperand(coil.operand, context);
    context.coilOperands.set(coil.operand, known);
  }
  let bit = -1;
  let edge = -1;
  if (typeof known.bit === 'string') report(context, coil, known.bit);
  else bit = known.bit;
  if (known.key !== null && COIL_KINDS[coil.variant].edge) {
    edge = context.edges.length;
    context.edges.push({ elementId: coil.id, operand: known.key });
  }
  putNode(context, flow, NODE_OP.coil, COIL_VARIANT_NUMBER[coil.variant], bit, edge);
}

/** The bit a coil's operand text writes, or why it cannot; a bit out of range still has its edge key. */
function coilOperand(text: string, context: Lowering): CoilOperand {
  const resolved = resolve(text, context);
  if (!resolved.ok) return { bit: resolved.error, key: null };
  const operand = resolved.value;
  if (operand.kind !== 'bit') return { bit: `a coil writes a bit (%QX or %MX); "${text.trim()}" is not one`, key: null };
  if (operand.address.area === 'I') {
    return { bit: `a coil cannot write the input ${formatAddress(operand.address)}: inputs come from the field`, key: null };
  }
  const range = addressInRange(operand.address, context.space);
  return { bit: range ?? bitIndex(operand, context.layout), key: operandKey(operand) };
}

function lowerBlock(block: Block, flow: number, context: Lowering): PlanBlock {
  const spec = BLOCK_SPECS[block.type];
  const key = symbolKey(block.instance);
  const instance = context.instanceIndex.get(key) ?? -1;
  if (instance < 0) report(context, block, `the ${block.type} block needs an instance name, e.g. ${block.type.startsWith('T') ? 'T1' : 'C1'}`);
  else if (context.instances[instance]!.type !== block.type) {
    report(context, block, `"${block.instance}" is already a ${context.instances[instance]!.type}; give this ${block.type} another name`);
  }
  const chargesTime = instance >= 0 && !context.calledInstances.has(instance);
  if (instance >= 0) context.calledInstances.add(instance);
  const inputs = operandInputs(block.type).map((param) => lowerBlockInput(block, param, context));
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

function lowerBlockInput(block: Block, param: BlockParam, context: Lowering): PlanBlockInput {
  const given = Object.entries(block.inputs).find(([name]) => name.toUpperCase() === param.name)?.[1] ?? '';
  const required = (BLOCK_SPECS[block.type].required as readonly string[]).includes(param.name);
  if (given.trim() === '') {
    if (required) report(context, block, `${block.instance || block.type}.${param.name} needs a value`, param.name);
    return { name: param.name, type: param.type, source: UNUSABLE };
  }
  const resolved = resolve(given, context);
  if (!resolved.ok) {
    report(context, block, `${param.name}: ${resolved.error}`, param.name);
    return { name: param.name, type: param.type, source: UNUSABLE };
  }
  const source = sourceFor(resolved.value, param.type, context);
  if (typeof source === 'string') {
    report(context, block, `${param.name}: ${source}`, param.name);
    return { name: param.name, type: param.type, source: UNUSABLE };
  }
  return { name: param.name, type: param.type, source };
}

const TYPE_NOUNS = {
  BOOL: 'a TRUE/FALSE value (a bit, a tag, a block output such as T1.Q, or TRUE/FALSE)',
  TIME: 'a duration (e.g. T#2s, or a timer output such as T1.ET)',
  INT: 'a whole number (e.g. 3, or a counter output such as C1.CV)',
} as const satisfies Record<ParamType, string>;

const CONSTANT_TYPES = { bool: 'BOOL', time: 'TIME', int: 'INT' } as const;

/** Map an operand to a source of the wanted type, or say why it does not fit. */
function sourceFor(operand: Operand, wanted: ParamType, context: Lowering): PlanSource | string {
  const mismatch = (): string => `expected ${TYPE_NOUNS[wanted]}`;
  switch (operand.kind) {
    case 'bit': {
      if (wanted !== 'BOOL') return mismatch();
      const range = addressInRange(operand.address, context.space);
      if (range !== null) return range;
      return { kind: 'bit', bit: bitIndex(operand, context.layout) };
    }
    case 'member': {
      const instance = context.instanceIndex.get(operand.instance);
      const output = instance === undefined ? undefined : blockOutput(context.instances[instance]!.type, operand.member);
      if (instance === undefined || output === undefined) return `"${operand.instance}.${operand.member}" is not an output of a block in this program`;
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
