/**
 * A program's proof sheet (properties and the checks kept from counterexamples). Its owner's
 * alone, like a draft: to anyone else, the instructor who may read the program included, it does
 * not exist (`programAccess(…, 'proof')`). The body was parsed by `ProofSheetSchema`, so every
 * saved check's script is a valid check script; properties may name devices of the lab's panel
 * and are not checked against the program.
 */
import type { ProofSheet, ProofSheetResponse } from '@shared/api/proof';
import type { AppContext } from '../context';
import type { User } from '../db/users';
import * as programsDb from '../db/programs';
import * as db from '../db/proofSheets';
import { failure, success, type Outcome } from '../http/failure';
import { programAccess } from '../policies/programPolicy';
import { refusal } from '../policies/access';
import { iso } from './views';

const EMPTY: ProofSheetResponse = { proof: { properties: [], checks: [] }, updatedAt: null };

function sheetView(row: db.ProofSheetRecord): ProofSheetResponse {
  // Written only through ProofSheetSchema, so the stored lists have its shape.
  return { proof: { properties: row.properties as ProofSheet['properties'], checks: row.checks as ProofSheet['checks'] }, updatedAt: iso(row.updatedAt) };
}

/** The program, when the actor owns it; otherwise the 404 that hides it. */
async function ownProgram(ctx: AppContext, actor: User, programId: string): Promise<Outcome<programsDb.Program>> {
  const program = await programsDb.findProgram(ctx.orm, programId);
  if (!program) return failure('not_found', 'This program does not exist or is not open to you');
  return refusal(await programAccess(ctx.orm, actor, program, 'proof'), 'program') ?? success(program);
}

export async function getProofSheet(ctx: AppContext, actor: User, programId: string): Promise<Outcome<ProofSheetResponse>> {
  const found = await ownProgram(ctx, actor, programId);
  if (!found.ok) return found;
  const row = await db.findProofSheet(ctx.orm, programId);
  return success(row ? sheetView(row) : EMPTY);
}

export async function saveProofSheet(ctx: AppContext, actor: User, programId: string, sheet: ProofSheet): Promise<Outcome<ProofSheetResponse>> {
  const found = await ownProgram(ctx, actor, programId);
  if (!found.ok) return found;
  const row = await db.upsertProofSheet(ctx.orm, { programId, userId: actor.id, properties: sheet.properties, checks: sheet.checks, now: ctx.clock.now() });
  return success(sheetView(row));
}
