/**
 * Diagnostics: what validation says about a program, located by rung, path and element. One table
 * maps every code to its severity, a short title and the message template, so the validator, the
 * API's error bodies and the UI all speak with one voice (STYLE.md point 11).
 */

/** Where a diagnostic points and what it says. */
export interface Diagnostic {
  code: DiagnosticCode;
  /** The rung concerned, or `null` for the tag table and the program as a whole. */
  rungId: string | null;
  /** Node path inside the rung's network (see `NodePath`); for a tag, `[tagIndex]`; else `[]`. */
  path: number[];
  /** The element concerned, when there is one. */
  elementId: string | null;
  severity: 'error' | 'warning';
  message: string;
  /** Which part of the element or tag: a block input name (`PT`), `instance`, `name`, `address`. */
  field?: string;
}

export type Severity = Diagnostic['severity'];

interface Template<P> {
  severity: Severity;
  /** A few words for lists and filters. */
  title: string;
  message: (params: P) => string;
}

const template = <P>(severity: Severity, title: string, message: (params: P) => string): Template<P> => ({
  severity,
  title,
  message,
});

type Because = { operand: string; reason: string };
type Named = { name: string };

export const DIAGNOSTICS = {
  'address-invalid': template<Because>('error', 'Bad address', (p) => p.reason),
  'address-out-of-range': template<Because>('error', 'Address out of range', (p) => p.reason),
  'unknown-tag': template<Because>('error', 'Unknown tag', (p) => p.reason),
  'unknown-member': template<Because>('error', 'Unknown block output', (p) => p.reason),
  'operand-invalid': template<Because>('error', 'Bad operand', (p) => p.reason),
  'operand-missing': template<{ what: string }>(
    'error',
    'Missing operand',
    (p) => `this ${p.what} has no operand yet: type an address such as %IX1 or a tag name`,
  ),
  'contact-not-bool': template<{ operand: string; type: string }>(
    'error',
    'Contact needs a bit',
    (p) => `a contact examines a bit (TRUE/FALSE), but ${p.operand} is ${p.type}`,
  ),
  'coil-on-input': template<{ operand: string; address: string }>(
    'error',
    'Coil on an input',
    (p) => `a coil cannot write an input: ${p.address} is read from the field; use %QX or %MX`,
  ),
  'coil-not-writable': template<{ operand: string; what: string }>(
    'error',
    'Coil needs a writable bit',
    (p) => `a coil writes an output or memory bit, but ${p.operand} is ${p.what}; use %QX or %MX`,
  ),
  'contact-after-coil': template<{ operand: string }>(
    'error',
    'Contact after a coil',
    (p) =>
      `the contact ${p.operand} comes after a coil: power flow ends at the coils on the right; ` +
      'move the contact to the left of the coil or start a new rung',
  ),
  'coil-mid-rung': template<{ operand: string }>(
    'error',
    'Coil in the middle',
    (p) =>
      `the coil ${p.operand} sits in the middle of the rung: coils go at the right end, ` +
      'as the last items or as the ends of a final parallel branch',
  ),
  'empty-rung': template<Record<never, never>>(
    'error',
    'Empty rung',
    () => 'this rung is empty: add contacts and end it with a coil or a block',
  ),
  'empty-branch': template<Record<never, never>>(
    'error',
    'Empty branch',
    () => 'this branch is empty: it joins its two ends directly, so the branches beside it are bypassed; put a contact in it or delete it',
  ),
  'empty-group': template<{ what: string }>('error', 'Empty group', (p) => `this ${p.what} holds nothing; delete it`),
  'rung-without-output': template<Record<never, never>>(
    'error',
    'No coil at the end',
    () => 'this rung does not end in a coil or a block, so it changes nothing; add a coil on the right',
  ),
  'branch-without-output': template<Record<never, never>>(
    'error',
    'Branch without a coil',
    () => 'this branch of the final parallel does not end in a coil or a block; add a coil at its end',
  ),
  'duplicate-coil': template<{ operand: string; otherRung: number; thisRung: number }>(
    'warning',
    'Output driven twice',
    (p) =>
      `${p.operand} is also written by a coil in rung ${p.otherRung}: the rungs run top to bottom every scan and the last write wins, ` +
      `so rung ${p.thisRung} decides the output and rung ${p.otherRung}'s result is lost (only the rungs in between see it); ` +
      'join the conditions in one rung with a parallel branch, or use set/reset coils',
  ),
  'instance-missing': template<{ type: string }>(
    'error',
    'Block without a name',
    (p) => `this ${p.type} has no instance name: name it, e.g. ${p.type.startsWith('CT') ? 'C1' : p.type.startsWith('T') ? 'T1' : 'B1'}`,
  ),
  'instance-bad-name': template<{ name: string; reason: string }>(
    'error',
    'Bad instance name',
    (p) => `"${p.name}" cannot name a block: ${p.reason}`,
  ),
  'instance-type-conflict': template<{ name: string; type: string; firstType: string; firstRung: number }>(
    'error',
    'Instance reused with another type',
    (p) =>
      `"${p.name}" is already a ${p.firstType} (rung ${p.firstRung}); one instance name is one piece of memory, ` +
      `so it cannot also be a ${p.type}: give this block another name`,
  ),
  'instance-called-twice': template<{ name: string; firstRung: number }>(
    'warning',
    'Instance used twice',
    (p) =>
      `"${p.name}" is also called in rung ${p.firstRung}: both calls share one block's memory, ` +
      'so each scan the second call overrides the first; give this block its own name',
  ),
  'name-clash': template<Named>(
    'error',
    'Tag and block share a name',
    (p) => `"${p.name}" names both a tag and a block instance; rename one of them`,
  ),
  'timer-preset-missing': template<{ name: string }>(
    'error',
    'Timer preset missing',
    (p) => `timer ${p.name} has no preset time: set PT, e.g. T#3s`,
  ),
  'timer-preset-not-time': template<{ name: string; operand: string }>(
    'error',
    'Timer preset not a time',
    (p) => `timer ${p.name}'s preset PT must be a duration such as T#3s, not "${p.operand}"`,
  ),
  'timer-preset-negative': template<{ name: string; operand: string }>(
    'error',
    'Negative timer preset',
    (p) => `timer ${p.name}'s preset ${p.operand} is negative; a duration counts from zero up`,
  ),
  'counter-preset-missing': template<{ name: string }>(
    'error',
    'Counter preset missing',
    (p) => `counter ${p.name} has no preset value: set PV, e.g. 3`,
  ),
  'counter-preset-not-int': template<{ name: string; operand: string }>(
    'error',
    'Counter preset not a whole number',
    (p) => `counter ${p.name}'s preset PV must be a whole number such as 3, not "${p.operand}"`,
  ),
  'block-input-not-bool': template<{ name: string; input: string; operand: string }>(
    'error',
    'Block input needs a bit',
    (p) => `${p.name}.${p.input} takes a bit (an address, a tag, TRUE or FALSE), not "${p.operand}"`,
  ),
  'block-input-unknown': template<{ name: string; type: string; input: string; inputs: string }>(
    'error',
    'No such block input',
    (p) => `a ${p.type} has no input "${p.input}" (${p.name}); its inputs are ${p.inputs}`,
  ),
  'block-input-power-flow': template<{ name: string; input: string }>(
    'error',
    'Power-flow input given an operand',
    (p) =>
      `${p.name}.${p.input} is fed by the rung on its left, so it cannot also be given an operand; ` +
      'remove it and put a contact before the block instead',
  ),
  'tag-bad-name': template<{ name: string; reason: string }>('error', 'Bad tag name', (p) => `tag "${p.name}": ${p.reason}`),
  'tag-duplicate-name': template<{ name: string; first: number }>(
    'error',
    'Duplicate tag name',
    (p) => `tag "${p.name}" is already declared in row ${p.first} of the tag table (names ignore upper/lower case)`,
  ),
  'tag-bad-address': template<{ name: string; reason: string }>(
    'error',
    'Bad tag address',
    (p) => `tag "${p.name}": ${p.reason}`,
  ),
  'tag-duplicate-address': template<{ name: string; address: string; other: string }>(
    'warning',
    'Two tags for one address',
    (p) => `tags "${p.other}" and "${p.name}" both name ${p.address}; one name per bit is easier to read`,
  ),
} as const satisfies Record<string, Template<never>>;

/** Every diagnostic code. */
export type DiagnosticCode = keyof typeof DIAGNOSTICS;

/** The parameters a code's message needs. */
export type DiagnosticParams<C extends DiagnosticCode> = Parameters<(typeof DIAGNOSTICS)[C]['message']>[0];

/** Where a diagnostic points. */
export interface DiagnosticLocation {
  rungId: string | null;
  path?: readonly number[];
  elementId?: string | null;
  field?: string;
}

/** Build a diagnostic from its code, the message parameters and where it points. */
export function createDiagnostic<C extends DiagnosticCode>(
  code: C,
  params: DiagnosticParams<C>,
  at: DiagnosticLocation,
): Diagnostic {
  const entry = DIAGNOSTICS[code] as Template<DiagnosticParams<C>>;
  const diagnostic: Diagnostic = {
    code,
    rungId: at.rungId,
    path: [...(at.path ?? [])],
    elementId: at.elementId ?? null,
    severity: entry.severity,
    message: entry.message(params),
  };
  if (at.field !== undefined) diagnostic.field = at.field;
  return diagnostic;
}

/** True when any diagnostic is an error (warnings do not stop a program from running). */
export function hasErrors(diagnostics: readonly Diagnostic[]): boolean {
  return diagnostics.some((d) => d.severity === 'error');
}
