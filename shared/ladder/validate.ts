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
  resolveOperand,
  symbolKey,
  type Operand,
  type SymbolTable,
} from './operands';
import type { Result } from './result';
import type { Block, Coil, Contact, Program, Rung } from './schema';
import { checkRungShape } from './shape';
import { looksLikeTimeLiteral } from './time';
import { nameProblem, validateTags } from './validateTags';
import { elementsOf } from './walk';

interface Context {
  symbols: SymbolTable;
  space: AddressSpace;
  found: Diagnostic[];
  /** Each distinct operand text resolved once (a long program repeats a few hundred texts thousands of times). */
  resolved: Map<string, Result<Operand>>;
}

interface Place {
  rungId: string;
  path: number[];
  elementId: string;
  field?: string;
}

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

function checkContact(contact: Contact, place: Place, ctx: Context): void {
  if (contact.operand.trim() === '') {
    ctx.found.push(createDiagnostic('operand-missing', { what: 'contact' }, place));
    return;
  }
  const operand = resolveAt(contact.operand, place, ctx);
  if (operand === null) return;
  const { type, said } = typeOf(operand, ctx.symbols);
  if (type !== 'BOOL') ctx.found.push(createDiagnostic('contact-not-bool', { operand: contact.operand.trim(), type: said }, place));
}

/** A writable bit a plain coil writes, as its canonical address, or null. */
function checkCoil(coil: Coil, place: Place, ctx: Context): { address: string; shown: string } | null {
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
  return { address: formatAddress(operand.address), shown: shownOperand(coil.operand, operand) };
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

function checkBlock(block: Block, place: Place, ctx: Context): void {
  const spec: BlockSpec = BLOCK_SPECS[block.type];
  const name = block.instance.trim();
  if (name === '') {
    ctx.found.push(createDiagnostic('instance-missing', { type: block.type }, { ...place, field: 'instance' }));
  } else {
    const problem = nameProblem(name);
    if (problem !== null) ctx.found.push(createDiagnostic('instance-bad-name', { name, reason: problem }, { ...place, field: 'instance' }));
  }
  const inputNames = spec.inputs.map((p) => p.name);
  for (const input of Object.keys(block.inputs)) {
    const at = { ...place, field: input };
    if (input === spec.powerIn) {
      if (block.inputs[input]!.trim() !== '') ctx.found.push(createDiagnostic('block-input-power-flow', { name: name || block.type, input }, at));
    } else if (!inputNames.includes(input) && block.inputs[input]!.trim() !== '') {
      const inputs = inputNames.filter((n) => n !== spec.powerIn).join(', ');
      ctx.found.push(createDiagnostic('block-input-unknown', { name: name || block.type, type: block.type, input, inputs }, at));
    }
  }
  for (const param of spec.inputs) {
    if (param.name === spec.powerIn) continue;
    checkBlockInput(block, spec, param.name, block.inputs[param.name] ?? '', { ...place, field: param.name }, ctx);
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
  const ctx: Context = { symbols, space, found: validateTags(program.tags, space), resolved: new Map() };
  const firstInstance = new Map<string, { type: Block['type']; rung: number }>();
  const lastWriter = new Map<string, number>();

  program.rungs.forEach((rung: Rung, rungIndex) => {
    ctx.found.push(...checkRungShape(rung));
    const rungNumber = rungIndex + 1;
    const writtenHere = new Set<string>();
    for (const { element, path } of elementsOf(rung)) {
      const place: Place = { rungId: rung.id, path, elementId: element.id };
      if (element.kind === 'contact') checkContact(element, place, ctx);
      else if (element.kind === 'block') {
        checkBlock(element, place, ctx);
        checkInstanceUse(element, rungNumber, place, ctx, firstInstance);
      } else {
        const written = checkCoil(element, place, ctx);
        if (written === null || (element.variant !== 'coil' && element.variant !== 'negated')) continue;
        const previous = lastWriter.get(written.address);
        if (previous !== undefined && previous !== rungNumber && !writtenHere.has(written.address)) {
          ctx.found.push(createDiagnostic('duplicate-coil', { operand: written.shown, otherRung: previous, thisRung: rungNumber }, place));
        }
        writtenHere.add(written.address);
        lastWriter.set(written.address, rungNumber);
      }
    }
  });
  return ctx.found;
}

function checkInstanceUse(
  block: Block,
  rungNumber: number,
  place: Place,
  ctx: Context,
  firstInstance: Map<string, { type: Block['type']; rung: number }>,
): void {
  const name = block.instance.trim();
  if (name === '') return;
  const key = symbolKey(name);
  const at = { ...place, field: 'instance' };
  const first = firstInstance.get(key);
  if (first === undefined) {
    firstInstance.set(key, { type: block.type, rung: rungNumber });
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
