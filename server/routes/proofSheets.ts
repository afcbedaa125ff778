/** `/api/programs/:id/proof`: the owner's proof sheet of a program. Thin: parse, call the service, answer. */
import express, { type Router } from 'express';
import { ProofSheetSchema } from '@shared/api/proof';
import type { AppContext } from '../context';
import { currentUser, requireUser } from '../http/authenticate';
import { parse, parseId, reply } from '../http/reply';
import * as proofSheets from '../services/proofSheets';

export function proofSheetsRouter(ctx: AppContext): Router {
  const router = express.Router();
  router.use('/programs/:id/proof', requireUser);

  router.get('/programs/:id/proof', async (req, res) => {
    const id = parseId(req.params.id, 'program');
    if (!id.ok) return reply(res, id);
    reply(res, await proofSheets.getProofSheet(ctx, currentUser(req), id.value));
  });

  router.put('/programs/:id/proof', async (req, res) => {
    const id = parseId(req.params.id, 'program');
    if (!id.ok) return reply(res, id);
    const body = parse(ProofSheetSchema, req.body);
    if (!body.ok) return reply(res, body);
    reply(res, await proofSheets.saveProofSheet(ctx, currentUser(req), id.value, body.value));
  });

  return router;
}
