/**
 * Properties a proof decides, as data in the vocabulary of check scripts (device ids with their
 * state words, addresses, tags, block values): nothing typed here ever becomes code.
 *
 *   { "never": { "%QX1": true, "%QX2": true } }                   no reachable scan has all of these
 *   { "always": { "%QX1": false }, "when": { "S0": "pressed" } }  every reachable scan where `when` holds
 *   { "after": { "S1": "pressed" }, "within": 100, "expect": { "K1": "open" } }
 *                                                                  each time the trigger becomes true,
 *                                                                  the expectation holds within 100 ms
 *   { "reachable": { "P3": "lit" } }                              some sequence of actions gets there
 */
import { z } from 'zod';
import { ExpectationSchema, MAX_WAIT_MS, type Expectation } from '../checks/script';

const condition = z.record(z.string().min(1), ExpectationSchema).refine((c) => Object.keys(c).length > 0, { message: 'a condition names at least one device, address or value' });
const label = z.string().min(1).max(200).optional();

export const NeverPropertySchema = z.strictObject({ never: condition, label });
export const AlwaysPropertySchema = z.strictObject({ always: condition, when: condition.optional(), label });
export const AfterPropertySchema = z.strictObject({
  after: condition,
  /** ms of virtual time; the expectation must hold at a scan no later than this after the trigger. */
  within: z.number().int().min(0).max(MAX_WAIT_MS),
  expect: condition,
  label,
});
export const ReachablePropertySchema = z.strictObject({ reachable: condition, label });

export const PropertySchema = z.union([NeverPropertySchema, AlwaysPropertySchema, AfterPropertySchema, ReachablePropertySchema]);
export type Property = z.infer<typeof PropertySchema>;
export type Condition = Record<string, Expectation>;

/** The file the command line reads: `{ "properties": [ … ] }`. */
export const PropertiesFileSchema = z.strictObject({ properties: z.array(PropertySchema).min(1).max(100) });
export type PropertiesFile = z.infer<typeof PropertiesFileSchema>;

export type PropertyKind = 'never' | 'always' | 'after' | 'reachable';

export function propertyKind(p: Property): PropertyKind {
  if ('never' in p) return 'never';
  if ('always' in p) return 'always';
  if ('after' in p) return 'after';
  return 'reachable';
}

const show = (c: Condition): string =>
  Object.entries(c)
    .map(([k, v]) => `${k} ${typeof v === 'object' ? `in ${JSON.stringify(v)}` : String(v)}`)
    .join(' and ');

/** The property in plain words, its label if it has one: "never K1 closed and K2 closed". */
export function propertyLabel(p: Property): string {
  if (p.label !== undefined) return p.label;
  if ('never' in p) return `never ${show(p.never)}`;
  if ('always' in p) return `always ${show(p.always)}${p.when ? ` when ${show(p.when)}` : ''}`;
  if ('after' in p) return `after ${show(p.after)}, ${show(p.expect)} within ${p.within} ms`;
  return `reachable ${show(p.reachable)}`;
}

/** Every condition a property reads. */
export function conditionsOf(p: Property): Condition[] {
  if ('never' in p) return [p.never];
  if ('always' in p) return p.when ? [p.always, p.when] : [p.always];
  if ('after' in p) return [p.after, p.expect];
  return [p.reachable];
}
