/**
 * Validation: everything wrong with a program, as located diagnostics a student understands.
 * Nothing is thrown; an empty list means the engine can run the program.
 *
 * Rung shape rule (checked in `shape.ts`): a rung network is a series; coils (and a final block)
 * sit at the end, either as the last items of the root series or as a final parallel whose
 * branches each end in coils ("a rung may drive several outputs in parallel"); blocks may also sit
 * in the middle of a series, where power flow passes through their Q/QU/Q1. No contact follows a
 * coil, no branch is empty.
 *
 * The tag table checks are in `validateTags.ts`. Here: operands of contacts, coils and block
 * inputs, block instances, and outputs written by plain coils in two rungs. Diagnostics come tag
 * table first, then rung by rung (shape, then elements left to right).
 */
import { addressInRange, DEFAULT_ADDRESS_SPACE, formatAddress, type AddressSpace } from './addresses';
import { BLOCK_SPECS, blockOutput, type BlockSpec, type ParamType } from './blocks';
import { createDiagnostic, type Diagnostic, type DiagnosticCode } from './diagnostics';
import {
  buildSymbolTable,
  IDENTIFIER,
  operandResolutions,
  resolveOperand,
  symbolKey,
  type Operand,
  type SymbolTable,
} from './operands';
import type { Result } from './result';
import type { Block, Coil, Contact, NetworkNode, Program } from './schema';
import { reportRungShape } from './shape';
import { looksLikeTimeLiteral } from './time';
import { nameProblem, validateTags } from './validateTags';

/** A bit a plain coil writes: its canonical address, and how to name it in a message. */
interface Written {
  address: string;
  shown: string;
}

/**
 * The state of one validation. It runs on every edit of a running program, so a program without
 * mistakes costs no allocation per element: the place of the element being checked is one object
 * whose `path` the walk pushes and pops (`createDiagnostic` copies it), and what an operand text
 * was found to be is kept per distinct text (a long program repeats a few hundred texts thousands
 * of times).
 */
interface Context {
  readonly symbols: SymbolTable;
  readonly space: AddressSpace;
  readonly found: Diagnostic[];
  /** Each distinct operand text resolved once (shared with lowering, see `operandResolutions`). */
  readonly resolved: Map<string, Result<Operand>>;
  /** Contact operand texts already found to be usable (a bit in range). */
  readonly goodContacts: Set<string>;
  /** Coil operand texts already found to be writable, with the bit each writes. */
  readonly coilTargets: Map<string, Written>;
  /** The element being checked. */
  readonly place: Place;
  /** 1-based number of the rung being checked. */
  rungNumber: number;
  /** The first call of each block instance, by symbol key. */
  readonly firstInstance: Map<string, { type: Block['type']; rung: number }>;
  /** The rung whose plain coil last wrote each address. */
  readonly lastWriter: Map<string, number>;
}

interface Place {
  rungId: string;
  path: number[];
  elementId: string;
  field?: string;
}

/** The place of the element being checked, naming one of its fields. */
const fieldOf = (place: Place, field: string): Place => ({ ...place, field });

/** Which code a failed resolution gets, from the shape of the text. */
function resolveErrorCode(text: string, symbols: SymbolTable): DiagnosticCode {
  const source = text.trim();
  if (source.startsWith('%')) return 'address-invalid';
  if (looksLikeTimeLiteral(source)) return 'operand-invalid';
  if (IDENTIFIER.test(source)) {
    const key = symbolKey(source);
    return symbols.instances.has(key) || symbols.invalidTags.has(key) ? 'operand-invalid' : 'unknown-tag';
  }
  if (/^[A-Za-z_][A-Za-z0-9_]*\./.test(source)) return 'unknown-member';
  return 'operand-invalid';
}

/** Resolve an operand, reporting failures and out-of-range addresses; null when unusable. */
function resolveAt(text: string, place: Place, ctx: Context): Operand | null {
  let resolved = ctx.resolved.get(text);
  if (resolved === undefined) {
    resolved = resolveOperand(text, ctx.symbols);
    ctx.resolved.set(text, resolved);
  }
  if (!resolved.ok) {
    ctx.found.push(createDiagnostic(resolveErrorCode(text, ctx.symbols), { operand: text.trim(), reason: resolved.error }, place));
    return null;
  }
  if (resolved.value.kind === 'bit') {
    const range = addressInRange(resolved.value.address, ctx.space);
    if (range !== null) {
      const reason = resolved.value.tag !== undefined ? `tag "${resolved.value.tag}": ${range}` : range;
      ctx.found.push(createDiagnostic('address-out-of-range', { operand: text.trim(), reason }, place));
      return null;
    }
  }
  return resolved.value;
}

/** The IEC type a resolved operand has, and how to say it. */
function typeOf(operand: Operand, symbols: SymbolTable): { type: ParamType; said: string } {
  switch (operand.kind) {
    case 'bit':
    case 'bool':
      return { type: 'BOOL', said: 'a bit' };
    case 'time':
      return { type: 'TIME', said: 'a duration' };
    case 'int':
      return { type: 'INT', said: 'a number' };
    case 'member': {
      const blockType = symbols.instances.get(operand.instance);
      const param = blockType !== undefined ? blockOutput(blockType, operand.member) : undefined;
      const type = param?.type ?? 'BOOL';
      return { type, said: type === 'BOOL' ? 'a bit' : type === 'TIME' ? 'a duration (a TIME output)' : 'a number (an INT output)' };
    }
  }
}

function shownOperand(text: string, operand: Operand): string {
  return operand.kind === 'bit' && operand.tag !== undefined
    ? `${operand.tag} (${formatAddress(operand.address)})`
    : text.trim();
}

function checkContact(contact: Contact, ctx: Context): void {
  if (ctx.goodContacts.has(contact.operand)) return;
  const { place } = ctx;
  if (contact.operand.trim() === '') {
    ctx.found.push(createDiagnostic('operand-missing', { what: 'contact' }, place));
    return;
  }
  const operand = resolveAt(contact.operand, place, ctx);
  if (operand === null) return;
  const { type, said } = typeOf(operand, ctx.symbols);
  if (type !== 'BOOL') ctx.found.push(createDiagnostic('contact-not-bool', { operand: contact.operand.trim(), type: said }, place));
  else ctx.goodContacts.add(contact.operand);
}

/** A writable bit a plain coil writes, as its canonical address, or null. */
function checkCoil(coil: Coil, ctx: Context): Written | null {
  const known = ctx.coilTargets.get(coil.operand);
  if (known !== undefined) return known;
  const { place } = ctx;
  if (coil.operand.trim() === '') {
    ctx.found.push(createDiagnostic('operand-missing', { what: 'coil' }, place));
    return null;
  }
  const operand = resolveAt(coil.operand, place, ctx);
  if (operand === null) return null;
  const text = coil.operand.trim();
  if (operand.kind === 'member') {
    ctx.found.push(createDiagnostic('coil-not-writable', { operand: text, what: 'a block output, which only its block writes' }, place));
    return null;
  }
  if (operand.kind !== 'bit') {
    ctx.found.push(createDiagnostic('coil-not-writable', { operand: text, what: 'a constant' }, place));
    return null;
  }
  if (operand.address.area === 'I') {
    ctx.found.push(createDiagnostic('coil-on-input', { operand: text, address: formatAddress(operand.address) }, place));
    return null;
  }
  const written: Written = { address: formatAddress(operand.address), shown: shownOperand(coil.operand, operand) };
  ctx.coilTargets.set(coil.operand, written);
  return written;
}

function checkBlockInput(block: Block, spec: BlockSpec, input: string, text: string, place: Place, ctx: Context): void {
  const name = block.instance.trim() || block.type;
  const param = spec.inputs.find((p) => p.name === input)!;
  const isTimer = param.type === 'TIME';
  const missingCode = isTimer ? 'timer-preset-missing' : 'counter-preset-missing';
  const wrongCode = isTimer ? 'timer-preset-not-time' : 'counter-preset-not-int';
  if (text.trim() === '') {
    if (spec.required.includes(input)) ctx.found.push(createDiagnostic(missingCode, { name }, place));
    return;
  }
  // A tag always names a bit, so a name there can never be a preset: say what a preset is instead.
  if (param.type !== 'BOOL' && IDENTIFIER.test(text.trim())) {
    ctx.found.push(createDiagnostic(wrongCode, { name, operand: text.trim() }, place));
    return;
  }
  const operand = resolveAt(text, place, ctx);
  if (operand === null) return;
  const { type } = typeOf(operand, ctx.symbols);
  if (param.type === 'BOOL') {
    if (type !== 'BOOL') ctx.found.push(createDiagnostic('block-input-not-bool', { name, input, operand: text.trim() }, place));
    return;
  }
  if (type !== param.type) {
    ctx.found.push(createDiagnostic(wrongCode, { name, operand: text.trim() }, place));
    return;
  }
  if (operand.kind === 'time' && operand.ms < 0) {
    ctx.found.push(createDiagnostic('timer-preset-negative', { name, operand: text.trim() }, place));
  }
}

function checkBlock(block: Block, ctx: Context): void {
  const { place } = ctx;
  const spec: BlockSpec = BLOCK_SPECS[block.type];
  const name = block.instance.trim();
  if (name === '') {
    ctx.found.push(createDiagnostic('instance-missing', { type: block.type }, fieldOf(place, 'instance')));
  } else {
    const problem = nameProblem(name);
    if (problem !== null) ctx.found.push(createDiagnostic('instance-bad-name', { name, reason: problem }, fieldOf(place, 'instance')));
  }
  const inputNames = spec.inputs.map((p) => p.name);
  for (const input of Object.keys(block.inputs)) {
    const at = fieldOf(place, input);
    if (input === spec.powerIn) {
      if (block.inputs[input]!.trim() !== '') ctx.found.push(createDiagnostic('block-input-power-flow', { name: name || block.type, input }, at));
    } else if (!inputNames.includes(input) && block.inputs[input]!.trim() !== '') {
      const inputs = inputNames.filter((n) => n !== spec.powerIn).join(', ');
      ctx.found.push(createDiagnostic('block-input-unknown', { name: name || block.type, type: block.type, input, inputs }, at));
    }
  }
  for (const param of spec.inputs) {
    if (param.name === spec.powerIn) continue;
    checkBlockInput(block, spec, param.name, block.inputs[param.name] ?? '', fieldOf(place, param.name), ctx);
  }
}

/**
 * Results already worked out, per document object and address space. Documents are immutable
 * (every edit makes a new object), so the same object always validates the same: the editor's
 * validation of an edit and the engine's compile of that same document then cost one validation,
 * not two. Entries go with their document (a WeakMap); results are frozen, as they are shared.
 */
const validated = new WeakMap<Program, Map<string, readonly Diagnostic[]>>();
const spaceKey = (space: AddressSpace): string => `${space.inputs}/${space.outputs}/${space.memory}`;

/** Validate a program against a panel's address space (once per document object and space; see `validated`). */
export function validateProgram(program: Program, space: AddressSpace = DEFAULT_ADDRESS_SPACE): Diagnostic[] {
  const key = spaceKey(space);
  let bySpace = validated.get(program);
  const known = bySpace?.get(key);
  if (known !== undefined) return known as Diagnostic[];
  const found = Object.freeze(findProblems(program, space));
  if (bySpace === undefined) validated.set(program, (bySpace = new Map()));
  bySpace.set(key, found);
  return found as Diagnostic[];
}

function findProblems(program: Program, space: AddressSpace): Diagnostic[] {
  const symbols = buildSymbolTable(program);
  const ctx: Context = {
    symbols,
    space,
    found: validateTags(program.tags, space),
    resolved: operandResolutions(symbols),
    goodContacts: new Set(),
    coilTargets: new Map(),
    place: { rungId: '', path: [], elementId: '' },
    rungNumber: 0,
    firstInstance: new Map(),
    lastWriter: new Map(),
  };
  const { rungs } = program;
  for (let r = 0; r < rungs.length; r += 1) {
    const rung = rungs[r]!;
    reportRungShape(rung, ctx.found);
    ctx.place.rungId = rung.id;
    ctx.rungNumber = r + 1;
    checkChildren(rung.network.items, ctx);
  }
  return ctx.found;
}

/** Check the elements below a node's children, left to right (branches top to bottom). */
function checkChildren(children: readonly NetworkNode[], ctx: Context): void {
  const { path } = ctx.place;
  for (let i = 0; i < children.length; i += 1) {
    path.push(i);
    checkNode(children[i]!, ctx);
    path.pop();
  }
}

function checkNode(node: NetworkNode, ctx: Context): void {
  switch (node.kind) {
    case 'series':
      checkChildren(node.items, ctx);
      return;
    case 'parallel':
      checkChildren(node.branches, ctx);
      return;
    case 'contact':
      ctx.place.elementId = node.id;
      checkContact(node, ctx);
      return;
    case 'block':
      ctx.place.elementId = node.id;
      checkBlock(node, ctx);
      checkInstanceUse(node, ctx);
      return;
    case 'coil': {
      ctx.place.elementId = node.id;
      const written = checkCoil(node, ctx);
      // Coils that write every scan (the transition-sensing ones too) clash with each other; set and reset do not.
      if (written === null || node.variant === 'set' || node.variant === 'reset') return;
      const { lastWriter, rungNumber } = ctx;
      // An earlier rung's write clashes; another write in this same rung is left alone.
      const previous = lastWriter.get(written.address);
      if (previous !== undefined && previous !== rungNumber) {
        ctx.found.push(createDiagnostic('duplicate-coil', { operand: written.shown, otherRung: previous, thisRung: rungNumber }, ctx.place));
      }
      lastWriter.set(written.address, rungNumber);
    }
  }
}

function checkInstanceUse(block: Block, ctx: Context): void {
  const name = block.instance.trim();
  if (name === '') return;
  const key = symbolKey(name);
  const at = fieldOf(ctx.place, 'instance');
  const first = ctx.firstInstance.get(key);
  if (first === undefined) {
    ctx.firstInstance.set(key, { type: block.type, rung: ctx.rungNumber });
    if (ctx.symbols.tags.has(key) || ctx.symbols.invalidTags.has(key)) ctx.found.push(createDiagnostic('name-clash', { name }, at));
    return;
  }
  if (first.type !== block.type) {
    ctx.found.push(
      createDiagnostic('instance-type-conflict', { name, type: block.type, firstType: first.type, firstRung: first.rung }, at),
    );
  } else {
    ctx.found.push(createDiagnostic('instance-called-twice', { name, firstRung: first.rung }, at));
  }
}
