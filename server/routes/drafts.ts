/** `/api/programs/:id/draft`: the owner's unsaved editor state. Thin: parse, call the service, answer. */
import express, { type Router } from 'express';
import { SaveDraftRequestSchema } from '@shared/api/drafts';
import type { AppContext } from '../context';
import { currentUser, requireUser } from '../http/authenticate';
import { parse, parseId, reply } from '../http/reply';
import * as drafts from '../services/drafts';

export function draftsRouter(ctx: AppContext): Router {
  const router = express.Router();
  router.use('/programs/:id/draft', requireUser);

  router.get('/programs/:id/draft', async (req, res) => {
    const id = parseId(req.params.id, 'program');
    if (!id.ok) return reply(res, id);
    reply(res, await drafts.getDraft(ctx, currentUser(req), id.value), 200, (draft) => ({ draft }));
  });

  router.put('/programs/:id/draft', async (req, res) => {
    const id = parseId(req.params.id, 'program');
    if (!id.ok) return reply(res, id);
    const body = parse(SaveDraftRequestSchema, req.body);
    if (!body.ok) return reply(res, body);
    reply(res, await drafts.saveDraft(ctx, currentUser(req), id.value, body.value), 200, (draft) => ({ draft }));
  });

  router.delete('/programs/:id/draft', async (req, res) => {
    const id = parseId(req.params.id, 'program');
    if (!id.ok) return reply(res, id);
    reply(res, await drafts.discardDraft(ctx, currentUser(req), id.value), 204);
  });

  return router;
}
