/**
 * Programs and versions: every save is a new immutable version based on the version the editor
 * loaded; if the head moved on, the save is refused with the current head (409), never merged or
 * overwritten. Access is decided by `programPolicy` before anything is read or written.
 */
import type { CreateProgramRequest, DiffResponse, ProgramDetail, ProgramListItem, ProgramSummary, RestoreVersionRequest, SaveVersionRequest, VersionDetail, VersionSummary } from '@shared/api';
import type { Program as ProgramDocument } from '@shared/ladder/schema';
import { createEmptyProgram } from '@shared/ladder';
import type { AppContext } from '../context';
import type { User } from '../db/users';
import * as db from '../db/programs';
import { failure, success, type Outcome } from '../http/failure';
import { programAccess, programListAccess, type ProgramAction } from '../policies/programPolicy';
import { refusal } from '../policies/access';
import { checkProgramDocument, diffProgramDocuments } from './ladderDocuments';
import { authorisedLab } from './labs';
import { programView, versionDetailView, versionView } from './views';

/** Loads a program the actor may act on, or the failure to answer (404 hides, 403 refuses). */
async function authorised(ctx: AppContext, actor: User, programId: string, action: ProgramAction): Promise<Outcome<db.Program>> {
  const program = await db.findProgram(ctx.orm, programId);
  if (!program) return failure('not_found', 'This program does not exist or is not open to you');
  return refusal(await programAccess(ctx.orm, actor, program, action), 'program') ?? success(program);
}

/** The owner's programs the actor may read: all of their own; of a student, those in the labs of classes the actor teaches them in. */
export async function listPrograms(ctx: AppContext, actor: User, ownerId: string | undefined): Promise<Outcome<ProgramListItem[]>> {
  const owner = ownerId ?? actor.id;
  const access = await programListAccess(ctx.orm, actor, owner);
  if (access.kind === 'hidden') return failure('not_found', 'This user does not exist or is not open to you');
  const rows = await db.listProgramsByOwner(ctx.orm, owner);
  const readable = access.kind === 'all' ? rows : rows.filter((p) => p.labId !== null && access.labIds.has(p.labId));
  return success(readable.map((p) => ({ ...programView(p), labTitle: p.labTitle })));
}

/** The one answer for a lab that does not exist and a lab the caller may not see (no lab titles or ids learnt by probing). */
const NO_SUCH_LAB = failure('not_found', 'labId: no lab with this id is open to you', { fields: { labId: 'no lab with this id is open to you' } });

/**
 * PostgreSQL's foreign-key violation (SQLSTATE 23503): the lab was deleted between the check and
 * the insert. Drizzle wraps the driver's error, so its `cause` is looked at too.
 */
function isForeignKeyViolation(err: unknown): boolean {
  for (let e = err, depth = 0; typeof e === 'object' && e !== null && depth < 3; e = (e as { cause?: unknown }).cause, depth += 1) {
    if ((e as { code?: unknown }).code === '23503') return true;
  }
  return false;
}

export async function createProgram(ctx: AppContext, actor: User, req: CreateProgramRequest, demo = false): Promise<Outcome<ProgramDetail>> {
  const checked = checkProgramDocument(req.document ?? createEmptyProgram(req.title));
  if (!checked.ok) return checked;
  // A program may name only a lab its owner can see: a student's lab of an enrolled class (published), a lab of a class the actor runs.
  if (req.labId !== undefined && !(await authorisedLab(ctx, actor, req.labId, 'view')).ok) return NO_SUCH_LAB;
  try {
    const { program, version } = await db.insertProgram(ctx.orm, {
      ownerId: actor.id,
      title: req.title,
      labId: req.labId ?? null,
      demo,
      document: checked.value,
      message: req.message || 'Created',
      authorId: actor.id,
      now: ctx.clock.now(),
    });
    return success({ program: programView(program), head: versionDetailView(version) });
  } catch (err) {
    if (isForeignKeyViolation(err)) return NO_SUCH_LAB;
    throw err;
  }
}

/** A program and its head version (a `ProgramDetail` once the document is spliced in, see `replyWithDocument`). */
export interface ProgramWithHead {
  program: ProgramSummary;
  head: VersionWithJson;
}

export async function getProgram(ctx: AppContext, actor: User, programId: string): Promise<Outcome<ProgramWithHead>> {
  const found = await authorised(ctx, actor, programId, 'read');
  if (!found.ok) return found;
  const head = await db.findVersionJson(ctx.orm, programId, found.value.headVersion);
  if (!head) return failure('internal', 'The program has no head version');
  return success({ program: programView(found.value), head: { summary: versionView(head), documentJson: head.documentJson } });
}

export async function renameProgram(ctx: AppContext, actor: User, programId: string, title: string): Promise<Outcome<ProgramSummary>> {
  const found = await authorised(ctx, actor, programId, 'write');
  if (!found.ok) return found;
  const renamed = await db.renameProgram(ctx.orm, programId, title, ctx.clock.now());
  return renamed ? success(programView(renamed)) : failure('not_found', 'This program does not exist or is not open to you');
}

export async function deleteProgram(ctx: AppContext, actor: User, programId: string): Promise<Outcome<null>> {
  const found = await authorised(ctx, actor, programId, 'write');
  if (!found.ok) return found;
  await db.deleteProgram(ctx.orm, programId);
  return success(null);
}

/**
 * A version as an answer needs it: the summary, and the document as JSON text (the text a save
 * wrote to the database, or the row cache's), so the answer does not serialise a whole document.
 */
export interface VersionWithJson {
  summary: VersionSummary;
  documentJson: string;
}

async function append(ctx: AppContext, actor: User, programId: string, baseVersion: number, document: unknown, message: string): Promise<Outcome<VersionWithJson>> {
  const checked = checkProgramDocument(document);
  if (!checked.ok) return checked;
  const result = await db.appendVersion(ctx.orm, { programId, baseVersion, document: checked.value, message, authorId: actor.id, now: ctx.clock.now() });
  // The saved version holds what the draft kept, so the same statement deleted the actor's draft:
  // a draft left behind would be offered back as newer work.
  if (result.ok) return success({ summary: versionView(result.version), documentJson: result.version.documentJson });
  if (!result.head) return failure('not_found', 'This program does not exist or is not open to you');
  return failure('version_conflict', `Version ${result.head.number} was saved after version ${baseVersion}; load it and apply your change again`, {
    details: { head: versionView(result.head) },
  });
}

export async function saveVersion(ctx: AppContext, actor: User, programId: string, req: SaveVersionRequest): Promise<Outcome<VersionWithJson>> {
  const found = await authorised(ctx, actor, programId, 'write');
  if (!found.ok) return found;
  return append(ctx, actor, programId, req.baseVersion, req.document, req.message || `Saved on version ${req.baseVersion}`);
}

export async function listVersions(ctx: AppContext, actor: User, programId: string): Promise<Outcome<VersionSummary[]>> {
  const found = await authorised(ctx, actor, programId, 'read');
  if (!found.ok) return found;
  return success((await db.listVersions(ctx.orm, programId)).map(versionView));
}

async function loadVersion(ctx: AppContext, programId: string, number: number): Promise<Outcome<db.ProgramVersion>> {
  const version = await db.findVersion(ctx.orm, programId, number);
  return version ? success(version) : failure('not_found', `This program has no version ${number}`);
}

export async function getVersion(ctx: AppContext, actor: User, programId: string, number: number): Promise<Outcome<VersionDetail>> {
  const found = await authorised(ctx, actor, programId, 'read');
  if (!found.ok) return found;
  const version = await loadVersion(ctx, programId, number);
  return version.ok ? success(versionDetailView(version.value)) : version;
}

/** A version as its answer sends it (the document as JSON text). */
export async function getVersionJson(ctx: AppContext, actor: User, programId: string, number: number): Promise<Outcome<VersionWithJson>> {
  const found = await authorised(ctx, actor, programId, 'read');
  if (!found.ok) return found;
  const version = await db.findVersionJson(ctx.orm, programId, number);
  if (!version) return failure('not_found', `This program has no version ${number}`);
  return success({ summary: versionView(version), documentJson: version.documentJson });
}

/** The version itself, for export. */
export async function getVersionDocument(ctx: AppContext, actor: User, programId: string, number: number): Promise<Outcome<{ program: db.Program; document: ProgramDocument }>> {
  const found = await authorised(ctx, actor, programId, 'read');
  if (!found.ok) return found;
  const version = await loadVersion(ctx, programId, number);
  if (!version.ok) return version;
  const checked = checkProgramDocument(version.value.document);
  return checked.ok ? success({ program: found.value, document: checked.value }) : checked;
}

export async function diffVersions(ctx: AppContext, actor: User, programId: string, from: number, to: number): Promise<Outcome<DiffResponse>> {
  const found = await authorised(ctx, actor, programId, 'read');
  if (!found.ok) return found;
  const [a, b] = await Promise.all([loadVersion(ctx, programId, from), loadVersion(ctx, programId, to)]);
  if (!a.ok) return a;
  if (!b.ok) return b;
  const before = checkProgramDocument(a.value.document);
  const after = checkProgramDocument(b.value.document);
  if (!before.ok) return before;
  if (!after.ok) return after;
  return success({ from, to, rungs: diffProgramDocuments(before.value, after.value) });
}

export async function restoreVersion(ctx: AppContext, actor: User, programId: string, req: RestoreVersionRequest): Promise<Outcome<VersionWithJson>> {
  const found = await authorised(ctx, actor, programId, 'write');
  if (!found.ok) return found;
  const old = await loadVersion(ctx, programId, req.version);
  if (!old.ok) return old;
  return append(ctx, actor, programId, req.baseVersion, old.value.document, req.message || `Restored version ${req.version}`);
}
