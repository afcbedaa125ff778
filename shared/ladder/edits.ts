/**
 * Every edit operation on a program document, pure `(doc, args) => doc`. The editor's undo/redo
 * keeps document snapshots; no edit writes its own undo. An edit that changes nothing returns the
 * same object, and one whose arguments do not fit the document returns it unchanged.
 */
export { insertElement, insertElements, appendElement, wrapInParallel, addBranchBelow, deleteNodes, moveElement } from './editNetwork';
export type { NodeTarget } from './editNetwork';
export { setOperand, setVariant, setBlockType, setBlockInput, setBlockInstance, setComment } from './editElement';
export {
  addRung,
  moveRung,
  duplicateRung,
  deleteRung,
  setRungComment,
  addTag,
  updateTag,
  renameTag,
  deleteTag,
  setTitle,
  setDescription,
} from './editProgram';
export { normalizeNetwork } from './normalize';
