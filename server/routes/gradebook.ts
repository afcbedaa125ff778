/** `/api/classes/:id/gradebook` (JSON) and `/api/classes/:id/gradebook.csv` (a download). */
import express, { type Router } from 'express';
import type { AppContext } from '../context';
import { currentUser, requireUser } from '../http/authenticate';
import { parseId, reply } from '../http/reply';
import { gradebook, gradebookCsv, gradebookFilename } from '../services/gradebook';

export function gradebookRouter(ctx: AppContext): Router {
  const router = express.Router();

  router.get('/classes/:id/gradebook', requireUser, async (req, res) => {
    const id = parseId(req.params.id, 'class');
    if (!id.ok) return reply(res, id);
    reply(res, await gradebook(ctx, currentUser(req), id.value));
  });

  router.get('/classes/:id/gradebook.csv', requireUser, async (req, res) => {
    const id = parseId(req.params.id, 'class');
    if (!id.ok) return reply(res, id);
    const book = await gradebook(ctx, currentUser(req), id.value);
    if (!book.ok) return reply(res, book);
    res.type('text/csv; charset=utf-8');
    res.attachment(gradebookFilename(book.value));
    res.send(gradebookCsv(book.value));
  });

  return router;
}
