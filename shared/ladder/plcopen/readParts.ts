/**
 * Small readers shared by the LD body reader: localIds, positions, connections, xsd:boolean and
 * modifier attributes, an element's variable and documentation.
 */
import { fail, ok, type Result } from '../result';
import { readFormattedText } from './formatted';
import { child, childrenNamed, localName, textContent, type XmlElement } from './xmlTree';

/** One `connection` of a `connectionPointIn`. */
export interface Wire {
  refLocalId: number;
  /** The source's output pin, when the source is a block. */
  formalParameter?: string;
}

/** `3=con1 4=coil2` → localId → id; malformed pairs are skipped (the ids are only a courtesy). */
export function readElementIds(text: string | undefined): Map<number, string> {
  const ids = new Map<number, string>();
  for (const pair of (text ?? '').split(/\s+/)) {
    const match = /^(\d{1,15})=(.+)$/.exec(pair);
    if (match) ids.set(Number(match[1]), match[2] as string);
  }
  return ids;
}

export function readLocalId(element: XmlElement, index: number): Result<number> {
  const value = element.attrs.localId;
  const name = localName(element);
  if (value === undefined) return fail(`${name} (element ${index + 1} of the LD body) has no localId; every element needs one`);
  if (!/^\s*\d{1,15}\s*$/.test(value)) return fail(`${name} (element ${index + 1} of the LD body) has localId "${value}", which is not a whole number`);
  return ok(Number(value));
}

export function readY(element: XmlElement): number {
  const y = Number(child(element, 'position')?.attrs.y);
  return Number.isFinite(y) ? y : 0;
}

/** The `connection`s of a `connectionPointIn`, in file order. */
export function readWires(point: XmlElement | undefined): Wire[] {
  if (point === undefined) return [];
  return childrenNamed(point, 'connection').flatMap((connection) => {
    const ref = connection.attrs.refLocalId?.trim();
    if (ref === undefined || !/^\d{1,15}$/.test(ref)) return [];
    const formalParameter = connection.attrs.formalParameter;
    return [{ refLocalId: Number(ref), ...(formalParameter ? { formalParameter } : {}) }];
  });
}

/** The `connectionPointIn`s of an element, a block's input pins included. */
function inputPoints(element: XmlElement): XmlElement[] {
  const pins = childrenNamed(child(element, 'inputVariables') ?? element, 'variable');
  return [...childrenNamed(element, 'connectionPointIn'), ...pins.flatMap((v) => childrenNamed(v, 'connectionPointIn'))];
}

/** The message for a connection whose refLocalId is missing or not a number, or `null`. */
export function badConnection(element: XmlElement, label: string): string | null {
  for (const point of inputPoints(element)) {
    for (const connection of childrenNamed(point, 'connection')) {
      const ref = connection.attrs.refLocalId;
      if (ref === undefined || !/^\s*\d{1,15}\s*$/.test(ref)) {
        return `${label} has a connection whose refLocalId ${ref === undefined ? 'is missing' : `"${ref}" is not a whole number`}`;
      }
    }
  }
  return null;
}

/** xsd:boolean: `true`, `false`, `1`, `0`. */
export function readBoolean(element: XmlElement, attribute: string, label: string): Result<boolean> {
  const value = element.attrs[attribute]?.trim();
  if (value === undefined || value === 'false' || value === '0') return ok(false);
  if (value === 'true' || value === '1') return ok(true);
  return fail(`${label} has ${attribute}="${value}"; it must be true or false`);
}

export function readModifier<T extends string>(element: XmlElement, attribute: string, allowed: readonly T[], label: string): Result<T | 'none'> {
  const value = element.attrs[attribute]?.trim() ?? 'none';
  if (value === 'none' || (allowed as readonly string[]).includes(value)) return ok(value as T | 'none');
  return fail(`${label} has ${attribute}="${value}"; it must be one of none, ${allowed.join(', ')}`);
}

export function variableText(element: XmlElement): string {
  const variable = child(element, 'variable');
  return variable === undefined ? '' : textContent(variable).trim();
}

export function documentationOf(element: XmlElement): string | undefined {
  const documentation = child(element, 'documentation');
  return documentation === undefined ? undefined : readFormattedText(documentation);
}

