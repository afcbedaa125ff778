/**
 * A compact way to write the labs' programs in TypeScript: `rung('comment', no('Stop'),
 * par(no('Fwd'), no('K1_aux')), coil('K1'))`. Ids are given in order when the program is built
 * (`r1`, `r1e1`, …), so the documents are deterministic and valid for `ProgramSchema`.
 */
import type { Block, BlockType, Coil, Contact, NetworkNode, Program, Rung, Tag } from '../ladder/schema';
import { PROGRAM_FORMAT, PROGRAM_VERSION } from '../ladder/schema';

/** A network node whose ids are filled in by `buildProgram`. */
export type Draft = NetworkNode;

export interface RungDraft {
  comment: string;
  items: Draft[];
}

const contact = (variant: Contact['variant']) => (operand: string): Contact => ({ kind: 'contact', id: '', variant, operand });
const coilOf = (variant: Coil['variant']) => (operand: string): Coil => ({ kind: 'coil', id: '', variant, operand });

/** `| |` NO contact. */
export const no = contact('no');
/** `|/|` NC contact. */
export const nc = contact('nc');
/** `|P|` rising-edge contact. */
export const rising = contact('rising');
/** `|N|` falling-edge contact. */
export const falling = contact('falling');
/** `( )` coil. */
export const coil = coilOf('coil');
/** `(S)` set coil. */
export const setCoil = coilOf('set');
/** `(R)` reset coil. */
export const resetCoil = coilOf('reset');

/** A standard function block; `inputs` holds the operand inputs (`PT`, `PV`, `R`…). */
export function block(type: BlockType, instance: string, inputs: Record<string, string>): Block {
  return { kind: 'block', id: '', type, instance, inputs };
}

/** Branches joined at both ends. Each branch is a node or a list read as a series. */
export function par(...branches: (Draft | Draft[])[]): Draft {
  return { kind: 'parallel', id: '', branches: branches.map((b) => (Array.isArray(b) ? ser(...b) : b)) };
}

/** Items in series (inside a branch). */
export function ser(...items: Draft[]): Draft {
  return { kind: 'series', id: '', items };
}

export function rung(comment: string, ...items: Draft[]): RungDraft {
  return { comment, items };
}

/** A tag: name, address and a comment. */
export function tag(name: string, address: string, comment = ''): Tag {
  return { name, address, comment };
}

function withIds(node: Draft, prefix: string, counter: { n: number }): NetworkNode {
  counter.n += 1;
  const id = `${prefix}n${counter.n}`;
  if (node.kind === 'series') return { ...node, id, items: node.items.map((c) => withIds(c, prefix, counter)) };
  if (node.kind === 'parallel') return { ...node, id, branches: node.branches.map((c) => withIds(c, prefix, counter)) };
  return { ...node, id };
}

/** Assemble a program document with deterministic ids. */
export function buildProgram(title: string, description: string, tags: Tag[], rungs: RungDraft[]): Program {
  const built: Rung[] = rungs.map((r, i) => {
    const prefix = `r${i + 1}`;
    const counter = { n: 0 };
    return {
      id: prefix,
      comment: r.comment,
      network: { kind: 'series', id: `${prefix}s`, items: r.items.map((item) => withIds(item, prefix, counter)) },
    };
  });
  return { format: PROGRAM_FORMAT, version: PROGRAM_VERSION, title, description, tags, rungs: built };
}
