/**
 * Edits of one element's fields, addressed by element id (ids are unique in the program). Same
 * contract as every edit: pure, and the same document back when nothing changes or the arguments
 * do not fit (unknown id, a variant of the wrong kind, text longer than the schema allows).
 */
import { BLOCK_SPECS } from './blocks';
import { updateRung } from './editCore';
import {
  BlockTypeSchema,
  CoilVariantSchema,
  ContactVariantSchema,
  OperandSchema,
  type Block,
  type BlockType,
  type CoilVariant,
  type ContactVariant,
  type Element,
  type Program,
} from './schema';
import { findElement, updateNode } from './walk';

const MAX_COMMENT = 500;
const MAX_INSTANCE = 32;

/** Apply `change` to the element with this id; the same document when it returns the element unchanged. */
function updateElement(doc: Program, elementId: string, change: (element: Element) => Element): Program {
  const found = findElement(doc, elementId);
  if (found === null) return doc;
  return updateRung(doc, found.rung.id, (rung) => {
    const network = updateNode(rung.network, found.path, (node) => change(node as Element));
    return network === rung.network ? rung : { ...rung, network };
  });
}

/** Set a contact's or coil's operand (trimmed). */
export function setOperand(doc: Program, args: { elementId: string; operand: string }): Program {
  const operand = args.operand.trim();
  if (!OperandSchema.safeParse(operand).success) return doc;
  return updateElement(doc, args.elementId, (element) =>
    element.kind !== 'block' && element.operand !== operand ? { ...element, operand } : element,
  );
}

/** Change a contact's variant (`no`, `nc`, `rising`, `falling`) or a coil's (`coil`, `negated`, `set`, `reset`). */
export function setVariant(doc: Program, args: { elementId: string; variant: ContactVariant | CoilVariant }): Program {
  return updateElement(doc, args.elementId, (element) => {
    if (element.kind === 'contact') {
      const variant = ContactVariantSchema.safeParse(args.variant);
      return variant.success && variant.data !== element.variant ? { ...element, variant: variant.data } : element;
    }
    if (element.kind === 'coil') {
      const variant = CoilVariantSchema.safeParse(args.variant);
      return variant.success && variant.data !== element.variant ? { ...element, variant: variant.data } : element;
    }
    return element;
  });
}

/** Change a block's type, keeping the operand inputs the new type also has (TON → TOF keeps PT). */
export function setBlockType(doc: Program, args: { elementId: string; type: BlockType }): Program {
  const parsed = BlockTypeSchema.safeParse(args.type);
  if (!parsed.success) return doc;
  const type = parsed.data;
  return updateElement(doc, args.elementId, (element) => {
    if (element.kind !== 'block' || element.type === type) return element;
    const spec = BLOCK_SPECS[type];
    const kept = Object.entries(element.inputs).filter(
      ([name]) => name !== spec.powerIn && spec.inputs.some((p) => p.name === name),
    );
    return { ...element, type, inputs: Object.fromEntries(kept) };
  });
}

/** Set one operand input of a block (`PT`, `PV`, `R`…); empty text removes it. */
export function setBlockInput(doc: Program, args: { elementId: string; input: string; operand: string }): Program {
  const operand = args.operand.trim();
  if (!OperandSchema.safeParse(operand).success) return doc;
  return updateElement(doc, args.elementId, (element) => {
    if (element.kind !== 'block') return element;
    const spec = BLOCK_SPECS[element.type];
    if (args.input === spec.powerIn || !spec.inputs.some((p) => p.name === args.input)) return element;
    const current = element.inputs[args.input];
    if (operand === '') {
      if (current === undefined) return element;
      const { [args.input]: _removed, ...inputs } = element.inputs;
      return { ...element, inputs } satisfies Block;
    }
    return current === operand ? element : { ...element, inputs: { ...element.inputs, [args.input]: operand } };
  });
}

/** Rename a block instance (trimmed). Other blocks and operands are left alone: the name is the student's choice. */
export function setBlockInstance(doc: Program, args: { elementId: string; instance: string }): Program {
  const instance = args.instance.trim();
  if (instance.length > MAX_INSTANCE) return doc;
  return updateElement(doc, args.elementId, (element) =>
    element.kind === 'block' && element.instance !== instance ? { ...element, instance } : element,
  );
}

/** Set an element's comment; empty text removes it. */
export function setComment(doc: Program, args: { elementId: string; comment: string }): Program {
  const comment = args.comment.trim();
  if (comment.length > MAX_COMMENT) return doc;
  return updateElement(doc, args.elementId, (element) => {
    if ((element.comment ?? '') === comment) return element;
    if (comment === '') {
      const { comment: _removed, ...rest } = element;
      return rest as Element;
    }
    return { ...element, comment };
  });
}
