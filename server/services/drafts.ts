/**
 * Drafts of the program being edited: kept per user a few seconds after the last edit, so a closed
 * tab or a crashed browser loses at most those seconds. A draft is never a version and belongs to
 * its owner only (`programAccess(…, 'draft')`). Its document passes the same checks as a save
 * (`checkProgramDocument`; the 1 MB body limit applies to every JSON request), and it is based on
 * a version of the program that exists.
 */
import type { Draft as DraftView, SaveDraftRequest } from '@shared/api/drafts';
import type { AppContext } from '../context';
import type { User } from '../db/users';
import * as programsDb from '../db/programs';
import * as db from '../db/drafts';
import { failure, success, type Outcome } from '../http/failure';
import { programAccess } from '../policies/programPolicy';
import { refusal } from '../policies/access';
import { checkProgramDocument } from './ladderDocuments';
import { iso } from './views';

function draftView(d: db.Draft): DraftView {
  return { programId: d.programId, baseVersion: d.baseVersion, document: d.document, updatedAt: iso(d.updatedAt) };
}

/** The program, when the actor owns it; otherwise the 404 that hides it. */
async function ownProgram(ctx: AppContext, actor: User, programId: string): Promise<Outcome<programsDb.Program>> {
  const program = await programsDb.findProgram(ctx.orm, programId);
  if (!program) return failure('not_found', 'This program does not exist or is not open to you');
  return refusal(await programAccess(ctx.orm, actor, program, 'draft'), 'program') ?? success(program);
}

export async function getDraft(ctx: AppContext, actor: User, programId: string): Promise<Outcome<DraftView | null>> {
  const found = await ownProgram(ctx, actor, programId);
  if (!found.ok) return found;
  const draft = await db.findDraft(ctx.orm, programId, actor.id);
  return success(draft ? draftView(draft) : null);
}

export async function saveDraft(ctx: AppContext, actor: User, programId: string, req: SaveDraftRequest): Promise<Outcome<DraftView>> {
  const found = await ownProgram(ctx, actor, programId);
  if (!found.ok) return found;
  if (req.baseVersion > found.value.headVersion) {
    return failure('validation', `baseVersion: this program has no version ${req.baseVersion} (its newest is ${found.value.headVersion})`, {
      fields: { baseVersion: `the newest version is ${found.value.headVersion}` },
    });
  }
  const checked = checkProgramDocument(req.document);
  if (!checked.ok) return checked;
  const draft = await db.upsertDraft(ctx.orm, { programId, userId: actor.id, baseVersion: req.baseVersion, document: checked.value, now: ctx.clock.now() });
  return success(draftView(draft));
}

export async function discardDraft(ctx: AppContext, actor: User, programId: string): Promise<Outcome<null>> {
  const found = await ownProgram(ctx, actor, programId);
  if (!found.ok) return found;
  await db.deleteDraft(ctx.orm, programId, actor.id);
  return success(null);
}
