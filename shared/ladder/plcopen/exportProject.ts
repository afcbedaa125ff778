/**
 * A Rungwright program → a complete PLCopen TC6 XML 2.01 `project` with one program POU and an LD
 * body ("PLCopen TC6 XML Formats for IEC 61131-3, Version 2.01": project, fileHeader,
 * contentHeader, types, instances are all required).
 */
import { formatAddress, parseAddress, sameAddress, type Address } from '../addresses';
import type { Program } from '../schema';
import { elementsOfProgram } from '../walk';
import {
  COMPANY_NAME,
  DEFAULT_CREATION_DATE_TIME,
  POU_NAME,
  PRODUCT_NAME,
  PRODUCT_VERSION,
  TASK_INTERVAL,
  TC6_NAMESPACE,
} from './constants';
import { exportLdBody } from './exportBody';
import { formattedText, rungwrightAddData } from './formatted';
import { buildXmlDocument, el, text, type XmlElement } from './xmlTree';

/** Options of `exportPlcopen`. */
export interface ExportPlcopenOptions {
  /**
   * ISO 8601 date and time for `fileHeader/@creationDateTime`, e.g. `new Date().toISOString()`
   * from the caller: `shared/` reads no clock. Default `1970-01-01T00:00:00Z`.
   */
  now?: string;
}

/** xsd:dateTime, the type of `creationDateTime`. */
const DATE_TIME = /^-?\d{4,}-\d{2}-\d{2}T\d{2}:\d{2}:\d{2}(\.\d+)?(Z|[+-]\d{2}:\d{2})?$/;

/**
 * Write a program as PLCopen TC6 XML 2.01. Every element gets a `localId` and a `position` on a
 * simple grid; Rungwright's rung and element ids ride along in `addData`, tag comments in
 * `documentation`, so `importPlcopen` gives the same program back.
 *
 * Throws a `RangeError` only for a programming mistake: a `now` that is not an ISO date-time.
 */
export function exportPlcopen(program: Program, options: ExportPlcopenOptions = {}): string {
  const now = options.now ?? DEFAULT_CREATION_DATE_TIME;
  if (!DATE_TIME.test(now)) throw new RangeError(`exportPlcopen: now must be an ISO 8601 date-time, got "${now}"`);

  const contentChildren: XmlElement[] = [];
  if (program.description !== '') contentChildren.push(el('Comment', {}, [text(program.description)]));
  contentChildren.push(coordinateInfo());

  const project = el('project', { xmlns: TC6_NAMESPACE }, [
    el('fileHeader', {
      companyName: COMPANY_NAME,
      productName: PRODUCT_NAME,
      productVersion: PRODUCT_VERSION,
      creationDateTime: now,
    }),
    el('contentHeader', { name: program.title }, contentChildren),
    el('types', {}, [el('dataTypes'), el('pous', {}, [programPou(program)])]),
    el('instances', {}, [el('configurations', {}, [configuration()])]),
  ]);
  return buildXmlDocument(project);
}

/** Drawing scale of each graphical language; 1:1, our grid is already in file units. */
function coordinateInfo(): XmlElement {
  const scaling = (): XmlElement => el('scaling', { x: 1, y: 1 });
  return el('coordinateInfo', {}, [el('fbd', {}, [scaling()]), el('ld', {}, [scaling()]), el('sfc', {}, [scaling()])]);
}

function programPou(program: Program): XmlElement {
  const { variables, retained } = interfaceVariables(program);
  // Retained tags go in a list of their own: TC6 marks retention on the list (`retain="true"`).
  const interfaceChildren = [
    ...(variables.length === 0 ? [] : [el('localVars', {}, variables)]),
    ...(retained.length === 0 ? [] : [el('localVars', { retain: 'true' }, retained)]),
  ];
  return el('pou', { name: POU_NAME, pouType: 'program' }, [
    el('interface', {}, interfaceChildren),
    el('body', {}, [el('LD', {}, exportLdBody(program.rungs))]),
  ]);
}

/**
 * The POU's local variables (retained tags apart): one BOOL per tag (its address as `address`, its comment as
 * `documentation`), one per block instance (`<derived name="TON"/>`), and one per memory bit the
 * rungs use without a tag, so another tool finds every variable declared.
 */
function interfaceVariables(program: Program): { variables: XmlElement[]; retained: XmlElement[] } {
  const names = new Set<string>(program.tags.map((tag) => tag.name.toUpperCase()));
  const tagVariable = (tag: Program['tags'][number]): XmlElement =>
    el('variable', { name: tag.name, address: tag.address }, [
      boolType(),
      ...(tag.comment === '' ? [] : [formattedText('documentation', tag.comment)]),
    ]);
  const tagVariables = program.tags.filter((tag) => tag.retain !== true).map(tagVariable);
  const retained = program.tags.filter((tag) => tag.retain === true).map(tagVariable);

  const instances = new Map<string, string>();
  for (const { element } of elementsOfProgram(program)) {
    if (element.kind === 'block' && element.instance !== '' && !instances.has(element.instance)) {
      instances.set(element.instance, element.type);
    }
  }
  const instanceVariables = [...instances].map(([name, type]) => {
    names.add(name.toUpperCase());
    return el('variable', { name }, [el('type', {}, [el('derived', { name: type })])]);
  });

  const memoryVariables = untaggedMemoryBits(program).map((address) => {
    const name = unusedName(`MX${address.index}`, names);
    return el('variable', { name, address: formatAddress(address) }, [
      boolType(),
      rungwrightAddData('untagged', { address: formatAddress(address) }),
      formattedText('documentation', 'memory bit used without a tag'),
    ]);
  });
  return { variables: [...tagVariables, ...instanceVariables, ...memoryVariables], retained };
}

function boolType(): XmlElement {
  return el('type', {}, [el('BOOL')]);
}

/** Memory bits (`%MX…`) that operands name directly and no tag names, in first-use order. */
function untaggedMemoryBits(program: Program): Address[] {
  const tagged = program.tags.map((tag) => parseAddress(tag.address)).flatMap((r) => (r.ok ? [r.value] : []));
  const found: Address[] = [];
  for (const { element } of elementsOfProgram(program)) {
    const operands = element.kind === 'block' ? Object.values(element.inputs) : [element.operand];
    for (const operand of operands) {
      const parsed = parseAddress(operand);
      if (!parsed.ok || parsed.value.area !== 'M') continue;
      const address = parsed.value;
      if (tagged.some((t) => sameAddress(t, address)) || found.some((f) => sameAddress(f, address))) continue;
      found.push(address);
    }
  }
  return found;
}

/** `base`, or `base_2`, `base_3`… when taken (IEC identifiers are case-insensitive). */
function unusedName(base: string, taken: Set<string>): string {
  let name = base;
  for (let n = 2; taken.has(name.toUpperCase()); n += 1) name = `${base}_${n}`;
  taken.add(name.toUpperCase());
  return name;
}

/** The schema requires `instances/configurations`; one resource runs the program cyclically. */
function configuration(): XmlElement {
  return el('configuration', { name: 'Config' }, [
    el('resource', { name: 'Resource' }, [
      el('task', { name: 'MainTask', interval: TASK_INTERVAL, priority: 0 }, [
        el('pouInstance', { name: 'MainInstance', typeName: POU_NAME }),
      ]),
    ]),
  ]);
}
