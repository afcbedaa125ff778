/**
 * The elements of a PLCopen `LD` body → typed records, refusing what a Rungwright rung cannot hold
 * with a message that names the element and its `localId`. Nothing here looks at topology; see
 * `topology.ts`.
 */
import { BLOCK_SPECS } from '../blocks';
import { fail, ok, type Result } from '../result';
import type { BlockType, CoilVariant, ContactVariant } from '../schema';
import { readFormattedText, readRungwrightAddData } from './formatted';
import {
  badConnection,
  documentationOf,
  readBoolean,
  readElementIds,
  readLocalId,
  readModifier,
  readWires,
  readY,
  variableText,
  type Wire,
} from './readParts';
import { child, childrenNamed, elementChildren, localName, textContent, type XmlElement } from './xmlTree';

/** Wires are read in readParts.ts; the records below hold them. */
export type { Wire };

interface Placed {
  localId: number;
  /** Vertical position, only to order rungs and branches (0 when the file gives none). */
  y: number;
  /** How messages name the element: `contact (localId 3)`. */
  label: string;
}

/** A contact, coil or block: the elements power flows through. */
export type PowerElement = ContactRecord | CoilRecord | BlockRecord;

export interface ContactRecord extends Placed {
  kind: 'contact';
  variant: ContactVariant;
  operand: string;
  inputs: Wire[];
  comment: string | undefined;
}

export interface CoilRecord extends Placed {
  kind: 'coil';
  variant: CoilVariant;
  operand: string;
  inputs: Wire[];
  comment: string | undefined;
}

export interface BlockRecord extends Placed {
  kind: 'block';
  type: BlockType;
  instance: string;
  /** Wires into the power-flow input (IN, CU, CLK, S1, S). */
  inputs: Wire[];
  /** Wires into every other input, by formal parameter, in the order of the standard. */
  operandInputs: Array<{ param: string; wires: Wire[] }>;
  comment: string | undefined;
}

export interface InVariableRecord extends Placed {
  kind: 'inVariable';
  expression: string;
}

export interface RailRecord extends Placed {
  kind: 'leftRail' | 'rightRail';
  /** Right rail only: what reaches it. */
  inputs: Wire[];
  /** Left rail written by Rungwright: the rung id, and the Rungwright id of each element by localId. */
  rungId: string | undefined;
  elementIds: ReadonlyMap<number, string>;
}

export interface CommentRecord extends Placed {
  kind: 'comment';
  text: string;
  rungId: string | undefined;
}

export type BodyRecord = PowerElement | InVariableRecord | RailRecord | CommentRecord;

/** Why each TC6 body element a rung cannot hold is refused; the message follows the label. */
const UNSUPPORTED: Record<string, string> = {
  jump: 'is not supported: Rungwright rungs have no jumps; every rung runs on every scan',
  label: 'is not supported: Rungwright rungs have no labels or jumps',
  return: 'is not supported: a Rungwright program runs every rung on every scan, so it has no early return',
  connector: 'is not supported: draw the wire itself instead of a connector and continuation',
  continuation: 'is not supported: draw the wire itself instead of a connector and continuation',
  outVariable: 'is not supported: use a coil to write a bit; block outputs are read as operands such as T1.ET',
  inOutVariable: 'is not supported: Rungwright rungs have no in-out variables',
  actionBlock: 'is not supported: action blocks belong to SFC, which Rungwright does not read',
  vendorElement: 'is not supported: it is specific to the tool that wrote the file',
  error: 'is not supported: the file marks an error here; fix it in the tool that wrote the file',
};

/** Read every element of an LD body. */
export function readLdBody(ld: XmlElement): Result<BodyRecord[]> {
  const records: BodyRecord[] = [];
  const seen = new Map<number, string>();
  for (const [index, element] of elementChildren(ld).entries()) {
    const name = localName(element);
    const localId = readLocalId(element, index);
    if (!localId.ok) return localId;
    const label = `${name} (localId ${localId.value})`;
    const earlier = seen.get(localId.value);
    if (earlier !== undefined) return fail(`${label} has the same localId as ${earlier}; every localId must be unique`);
    seen.set(localId.value, label);

    const reason = UNSUPPORTED[name];
    if (reason !== undefined) return fail(`${label} ${reason}`);
    const placed: Placed = { localId: localId.value, y: readY(element), label };
    const record = readRecord(name, element, placed);
    if (!record.ok) return record;
    records.push(record.value);
  }
  return ok(records);
}

function readRecord(name: string, element: XmlElement, placed: Placed): Result<BodyRecord> {
  switch (name) {
    case 'contact':
      return readContact(element, placed);
    case 'coil':
      return readCoil(element, placed);
    case 'block':
      return readBlock(element, placed);
    case 'inVariable':
      return readInVariable(element, placed);
    case 'leftPowerRail': {
      const data = readRungwrightAddData(element, 'rung');
      return ok({ ...placed, kind: 'leftRail', inputs: [], rungId: data?.rung, elementIds: readElementIds(data?.elements) });
    }
    case 'rightPowerRail': {
      const broken = badConnection(element, placed.label);
      if (broken) return fail(broken);
      const inputs = childrenNamed(element, 'connectionPointIn').flatMap(readWires);
      return ok({ ...placed, kind: 'rightRail', inputs, rungId: undefined, elementIds: new Map() });
    }
    case 'comment':
      return ok({ ...placed, kind: 'comment', text: readFormattedText(child(element, 'content')), rungId: readRungwrightAddData(element, 'rung')?.rung });
    default:
      return fail(`${placed.label} is not supported: it is not an element of an IEC 61131-3 ladder diagram that Rungwright knows`);
  }
}

function readContact(element: XmlElement, placed: Placed): Result<ContactRecord> {
  const broken = badConnection(element, placed.label);
  if (broken) return fail(broken);
  const negated = readBoolean(element, 'negated', placed.label);
  if (!negated.ok) return negated;
  const edge = readModifier(element, 'edge', ['rising', 'falling'] as const, placed.label);
  if (!edge.ok) return edge;
  const storage = element.attrs.storage?.trim();
  if (storage !== undefined && storage !== 'none') {
    return fail(`${placed.label} with storage="${storage}" is not supported: a contact only reads its variable`);
  }
  if (negated.value && edge.value !== 'none') {
    return fail(`${placed.label} is both negated and edge="${edge.value}", which is not supported: Rungwright has NO, NC, rising-edge and falling-edge contacts`);
  }
  const variant: ContactVariant = edge.value !== 'none' ? edge.value : negated.value ? 'nc' : 'no';
  return ok({
    ...placed,
    kind: 'contact',
    variant,
    operand: variableText(element),
    inputs: readWires(child(element, 'connectionPointIn')),
    comment: documentationOf(element),
  });
}

function readCoil(element: XmlElement, placed: Placed): Result<CoilRecord> {
  const broken = badConnection(element, placed.label);
  if (broken) return fail(broken);
  const negated = readBoolean(element, 'negated', placed.label);
  if (!negated.ok) return negated;
  const edge = readModifier(element, 'edge', ['rising', 'falling'] as const, placed.label);
  if (!edge.ok) return edge;
  if (edge.value !== 'none') {
    return fail(`${placed.label} with edge="${edge.value}" is not supported: Rungwright has coil, negated coil, set coil and reset coil`);
  }
  const storage = readModifier(element, 'storage', ['set', 'reset'] as const, placed.label);
  if (!storage.ok) return storage;
  if (negated.value && storage.value !== 'none') {
    return fail(`${placed.label} is both negated and storage="${storage.value}", which is not supported: Rungwright has coil, negated coil, set coil and reset coil`);
  }
  const variant: CoilVariant = storage.value !== 'none' ? storage.value : negated.value ? 'negated' : 'coil';
  return ok({
    ...placed,
    kind: 'coil',
    variant,
    operand: variableText(element),
    inputs: readWires(child(element, 'connectionPointIn')),
    comment: documentationOf(element),
  });
}

function isBlockType(name: string): name is BlockType {
  return Object.prototype.hasOwnProperty.call(BLOCK_SPECS, name);
}

function readBlock(element: XmlElement, placed: Placed): Result<BlockRecord> {
  const typeName = element.attrs.typeName?.trim() ?? '';
  if (!isBlockType(typeName)) {
    const known = Object.keys(BLOCK_SPECS).join(', ');
    return fail(`block "${typeName}" (localId ${placed.localId}) is not supported: Rungwright has the standard blocks ${known}`);
  }
  const instance = element.attrs.instanceName?.trim() ?? '';
  const label = `block ${typeName}${instance ? ` "${instance}"` : ''} (localId ${placed.localId})`;
  const broken = badConnection(element, label);
  if (broken) return fail(broken);
  const spec = BLOCK_SPECS[typeName];

  const inOut = child(element, 'inOutVariables');
  if (inOut !== undefined && childrenNamed(inOut, 'variable').length > 0) {
    return fail(`${label} has in-out variables, which the standard ${typeName} does not have`);
  }
  const pins = [
    ...childrenNamed(child(element, 'inputVariables') ?? element, 'variable').map((v) => ({ v, side: 'input' as const })),
    ...childrenNamed(child(element, 'outputVariables') ?? element, 'variable').map((v) => ({ v, side: 'output' as const })),
  ];
  const wiresByParam = new Map<string, Wire[]>();
  for (const { v, side } of pins) {
    const param = v.attrs.formalParameter?.trim() ?? '';
    const declared = side === 'input' ? spec.inputs : spec.outputs;
    if (!declared.some((p) => p.name === param)) {
      return fail(`${label} has no ${side} "${param}": ${typeName} has ${side}s ${declared.map((p) => p.name).join(', ')}`);
    }
    for (const modifier of ['negated', 'edge', 'storage'] as const) {
      const value = v.attrs[modifier]?.trim();
      if (value !== undefined && value !== 'none' && value !== 'false' && value !== '0') {
        return fail(`${label}: ${modifier}="${value}" on ${side} ${param} is not supported; put a contact or coil with that modifier in the rung instead`);
      }
    }
    if (side === 'input') wiresByParam.set(param, readWires(child(v, 'connectionPointIn')));
  }
  const operandInputs = spec.inputs
    .filter((p) => p.name !== spec.powerIn && wiresByParam.has(p.name))
    .map((p) => ({ param: p.name, wires: wiresByParam.get(p.name) ?? [] }));
  return ok({
    ...placed,
    label,
    kind: 'block',
    type: typeName,
    instance,
    inputs: wiresByParam.get(spec.powerIn) ?? [],
    operandInputs,
    comment: documentationOf(element),
  });
}

function readInVariable(element: XmlElement, placed: Placed): Result<InVariableRecord> {
  const negated = readBoolean(element, 'negated', placed.label);
  if (!negated.ok) return negated;
  if (negated.value) return fail(`${placed.label} is negated, which is not supported: write the negated value as the operand instead`);
  const expression = child(element, 'expression');
  return ok({ ...placed, kind: 'inVariable', expression: expression === undefined ? '' : textContent(expression).trim() });
}
