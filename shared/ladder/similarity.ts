/**
 * How alike two programs are in structure: a signal for an instructor to start a conversation
 * with two students, never evidence of copying on its own (small labs have few good answers).
 *
 * Programs are compared as rung networks, not as text. Each rung is brought into a canonical form
 * that a copy cannot shed by renaming: tag names are replaced by what they name (an I/O address
 * stays, since the panel fixes it for everyone), memory bits and block instances are numbered in
 * the order they first appear, the conditions in front of a rung's outputs are sorted (AND does not
 * care about order) and so are parallel branches (nor does OR). The features of a program are the
 * canonical strings of its rungs and of every compound part of them (series and parallel branches),
 * counted as a multiset; whatever the lab's starter already holds is taken out of both first, so
 * what is left is what each student wrote. The score is the multiset Jaccard index of the two
 * feature sets: 1 for the same structure, 0 for nothing in common beyond the starter.
 */
import { normalizeNetwork } from './normalize';
import { buildSymbolTable, resolveOperand, type SymbolTable } from './operands';
import { formatAddress } from './addresses';
import type { NetworkNode, Program, Rung } from './schema';

/** At or above this score two submissions are listed as alike. */
export const ALIKE_THRESHOLD = 0.7;

/** The canonical form of each rung of a program, and every feature the program is compared on. */
export interface ProgramFingerprint {
  /** One canonical string per rung, in the program's order. */
  rungs: string[];
  /** Feature → how many times it occurs. */
  features: Map<string, number>;
}

/** Names memory bits and block instances by first appearance, so renaming them changes nothing. */
class Renamer {
  private readonly names = new Map<string, string>();
  private readonly counts = { M: 0, B: 0 };
  constructor(private readonly symbols: SymbolTable) {}

  private local(kind: 'M' | 'B', key: string): string {
    const found = this.names.get(`${kind}:${key}`);
    if (found) return found;
    this.counts[kind] += 1;
    const name = `${kind}${this.counts[kind]}`;
    this.names.set(`${kind}:${key}`, name);
    return name;
  }

  instance(name: string): string {
    return this.local('B', name.trim().toUpperCase());
  }

  operand(text: string): string {
    const resolved = resolveOperand(text, this.symbols);
    if (!resolved.ok) return '?';
    const op = resolved.value;
    switch (op.kind) {
      case 'bit': {
        const address = formatAddress(op.address);
        return address.startsWith('%M') ? this.local('M', address) : address;
      }
      case 'member':
        return `${this.instance(op.instance)}.${op.member}`;
      case 'time':
        return `T#${op.ms}ms`;
      case 'int':
        return String(op.value);
      case 'bool':
        return op.value ? 'TRUE' : 'FALSE';
    }
  }
}

/** Canonical text of a node; `parts` collects the text of every compound node inside it. */
function canonical(node: NetworkNode, names: Renamer, parts: string[]): string {
  switch (node.kind) {
    case 'contact':
      return `${node.variant}(${names.operand(node.operand)})`;
    case 'coil':
      return `${node.variant}-coil(${names.operand(node.operand)})`;
    case 'block': {
      const inputs = Object.keys(node.inputs)
        .sort()
        .map((k) => `${k}=${names.operand(node.inputs[k] ?? '')}`);
      return `${node.type}[${names.instance(node.instance)}](${inputs.join(',')})`;
    }
    case 'parallel': {
      const text = `OR{${node.branches.map((b) => canonical(b, names, parts)).sort().join('|')}}`;
      parts.push(text);
      return text;
    }
    case 'series': {
      // The conditions before the first coil or block commute; what follows keeps its order.
      const firstOutput = node.items.findIndex((i) => i.kind === 'coil' || i.kind === 'block');
      const cut = firstOutput === -1 ? node.items.length : firstOutput;
      const conditions = node.items.slice(0, cut).map((i) => canonical(i, names, parts)).sort();
      const rest = node.items.slice(cut).map((i) => canonical(i, names, parts));
      const text = `AND{${[...conditions, ...rest].join(',')}}`;
      if (node.items.length > 1) parts.push(text);
      return text;
    }
  }
}

function rungForm(rung: Rung, names: Renamer, parts: string[]): string {
  return canonical(normalizeNetwork(rung.network), names, parts);
}

/** The fingerprint of a program (see the file comment). */
export function fingerprint(program: Program): ProgramFingerprint {
  const names = new Renamer(buildSymbolTable(program));
  const features = new Map<string, number>();
  const add = (f: string) => features.set(f, (features.get(f) ?? 0) + 1);
  const rungs = program.rungs.map((rung) => {
    const parts: string[] = [];
    const whole = rungForm(rung, names, parts);
    add(`rung:${whole}`);
    for (const p of parts) add(`part:${p}`);
    return whole;
  });
  return { rungs, features };
}

/** `a` without what `b` holds (multiset difference). */
function without(a: ReadonlyMap<string, number>, b: ReadonlyMap<string, number> | null): Map<string, number> {
  const out = new Map<string, number>();
  for (const [k, n] of a) {
    const left = n - (b?.get(k) ?? 0);
    if (left > 0) out.set(k, left);
  }
  return out;
}

/** Two programs compared: the score, and which rungs of each have their twin in the other. */
export interface Similarity {
  /** 0..1, multiset Jaccard index of the features beyond the starter. */
  score: number;
  /** True at index i when rung i of `a` (resp. `b`) has the same canonical form in the other program and is not the starter's. */
  matchedA: boolean[];
  matchedB: boolean[];
}

/** Compares two programs' fingerprints, leaving out what the starter already holds. */
export function compareFingerprints(a: ProgramFingerprint, b: ProgramFingerprint, starter: ProgramFingerprint | null): Similarity {
  const fa = without(a.features, starter?.features ?? null);
  const fb = without(b.features, starter?.features ?? null);
  let shared = 0;
  let union = 0;
  for (const k of new Set([...fa.keys(), ...fb.keys()])) {
    const x = fa.get(k) ?? 0;
    const y = fb.get(k) ?? 0;
    shared += Math.min(x, y);
    union += Math.max(x, y);
  }
  const starterRungs = new Set(starter?.rungs ?? []);
  const inB = new Set(b.rungs);
  const inA = new Set(a.rungs);
  return {
    score: union === 0 ? 0 : Math.round((shared / union) * 1000) / 1000,
    matchedA: a.rungs.map((r) => inB.has(r) && !starterRungs.has(r)),
    matchedB: b.rungs.map((r) => inA.has(r) && !starterRungs.has(r)),
  };
}

/** Compares two programs, leaving out what the starter already holds. */
export function compareProgramStructure(a: Program, b: Program, starter: Program | null): Similarity {
  return compareFingerprints(fingerprint(a), fingerprint(b), starter ? fingerprint(starter) : null);
}
