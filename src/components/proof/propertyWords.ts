/**
 * A property in plain language, in the panel's own names: `{ "never": { "%QX1": true, "%QX2":
 * true } }` on the reversing conveyor reads "K1 and K2 are never commanded together". An output
 * address is named by the device it drives ("K1 is commanded"), an input by the device that feeds
 * it, the e-stop is "the e-stop" when the panel has one, and every output of the panel off at once
 * is "every output is off". Pure: the panel and the program's tags come in as arguments.
 */
import type { Expectation } from '@shared/checks';
import type { PanelLayout } from '@shared/field/layout';
import type { Condition, Property } from '@shared/proof';

/** What the words need to know about where the program runs. */
export interface WordContext {
  panel: PanelLayout;
  /** The program's tags (name → address), to name an address the way the program does when no device does. */
  tags?: readonly { name: string; address: string }[];
}

/** One `key: value` of a condition, split into who and what: "K1" + "is commanded". */
interface Term {
  subject: string;
  /** The state alone ("commanded", "closed", "pressed"), for "K1 and K2 are never commanded together". */
  state: string;
  /** A negative state ("not commanded"), which does not group with positive ones. */
  negative: boolean;
}

const isAddress = (key: string): boolean => /^%[IQM]X\d+$/.test(key);

/** The addresses of the panel's outputs that drive a device: what "every output" means on it. */
export function drivenOutputs(panel: PanelLayout): string[] {
  return panel.devices.filter((d) => d.drivenBy !== undefined).map((d) => d.drivenBy!);
}

function deviceName(panel: PanelLayout, id: string): string {
  const device = panel.devices.find((d) => d.id === id);
  if (device?.kind === 'estop' && panel.devices.filter((d) => d.kind === 'estop').length === 1) return 'the e-stop';
  return id;
}

function range(v: { min?: number; max?: number }): string {
  if (v.min !== undefined && v.max !== undefined) return `between ${v.min} and ${v.max}`;
  if (v.min !== undefined) return `at least ${v.min}`;
  if (v.max !== undefined) return `at most ${v.max}`;
  return 'any value';
}

function termOf(key: string, value: Expectation, ctx: WordContext): Term {
  const { panel } = ctx;
  if (isAddress(key) && typeof value === 'boolean') {
    const driven = panel.devices.find((d) => d.drivenBy === key);
    if (driven) return { subject: driven.id, state: value ? 'commanded' : 'not commanded', negative: !value };
    const fed = panel.devices.find((d) => d.feeds === key);
    const tag = ctx.tags?.find((t) => t.address === key);
    const subject = fed ? `input ${key} (${fed.id})` : tag ? `${tag.name} (${key})` : key;
    return { subject, state: value ? 'on' : 'off', negative: !value };
  }
  if (panel.devices.some((d) => d.id === key) && typeof value === 'string') {
    return { subject: deviceName(panel, key), state: value, negative: false };
  }
  if (typeof value === 'boolean') return { subject: key, state: value ? 'true' : 'false', negative: !value };
  if (typeof value === 'number') return { subject: key, state: `${value}`, negative: false };
  if (typeof value === 'string') return { subject: key, state: value, negative: false };
  return { subject: key, state: range(value), negative: false };
}

const joinAnd = (parts: readonly string[]): string =>
  parts.length <= 1 ? (parts[0] ?? '') : `${parts.slice(0, -1).join(', ')} and ${parts[parts.length - 1]}`;

/** "is" or "are" with a state, the state being a number needing "at", "is 3". */
function clause(term: Term): string {
  return `${term.subject} is ${term.state}`;
}

/** Every output the panel drives is named in `c`, each false: "every output is off". */
function everyOutputOff(c: Condition, panel: PanelLayout): boolean {
  const outputs = drivenOutputs(panel);
  return outputs.length > 1 && outputs.every((a) => c[a] === false) && Object.keys(c).every((k) => outputs.includes(k));
}

/** A condition as one clause: "K1 is closed and S2 is pressed". */
export function conditionWords(c: Condition, ctx: WordContext): string {
  if (everyOutputOff(c, ctx.panel)) return 'every output is off';
  const terms = Object.entries(c).map(([k, v]) => termOf(k, v, ctx));
  const first = terms[0];
  // Same state for every subject: "K1 and K2 are closed".
  if (first && terms.length > 1 && terms.every((t) => t.state === first.state)) return `${joinAnd(terms.map((t) => t.subject))} are ${first.state}`;
  return joinAnd(terms.map(clause));
}

function neverWords(c: Condition, ctx: WordContext): string {
  const terms = Object.entries(c).map(([k, v]) => termOf(k, v, ctx));
  const first = terms[0]!;
  if (terms.length === 1) return `${first.subject} is never ${first.state}`;
  if (terms.every((t) => t.state === first.state)) return `${joinAnd(terms.map((t) => t.subject))} are never ${first.state} together`;
  return `never at the same time: ${joinAnd(terms.map(clause))}`;
}

function reachableWords(c: Condition, ctx: WordContext): string {
  const terms = Object.entries(c).map(([k, v]) => termOf(k, v, ctx));
  if (terms.length === 1) return `${terms[0]!.subject} can be ${terms[0]!.state}`;
  return `it can happen that ${conditionWords(c, ctx)}`;
}

/** The property in plain language (its label aside: see `propertyTitle`). */
export function propertyWords(p: Property, ctx: WordContext): string {
  if ('never' in p) return neverWords(p.never, ctx);
  if ('always' in p) {
    const always = conditionWords(p.always, ctx);
    return p.when ? `while ${conditionWords(p.when, ctx)}, ${always}` : `always: ${always}`;
  }
  if ('after' in p) return `after ${conditionWords(p.after, ctx)}, ${conditionWords(p.expect, ctx)} within ${p.within} ms`;
  return reachableWords(p.reachable, ctx);
}

/** What a list shows first: the property's own label, else its plain words. */
export function propertyTitle(p: Property, ctx: WordContext): string {
  return p.label ?? propertyWords(p, ctx);
}
