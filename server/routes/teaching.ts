/**
 * The instructor's week: `GET /api/classes/:id/overview`, `GET /api/labs/:id/students`,
 * `POST /api/labs/:id/return-graded`, `GET /api/labs/:id/similar` and
 * `GET /api/labs/:id/similar/pair?a=&b=`. Access is the class's and the lab's policies'.
 */
import express, { type Router } from 'express';
import { z } from 'zod';
import { ReturnGradedRequestSchema } from '@shared/api/teaching';
import type { AppContext } from '../context';
import { currentUser, requireUser } from '../http/authenticate';
import { parse, parseId, reply } from '../http/reply';
import { classOverview, labStudents } from '../services/classOverview';
import { returnAllGraded } from '../services/returnGraded';
import { sideBySide, similarSubmissions } from '../services/similarity';

const PairQuerySchema = z.object({ a: z.uuid('a is a submission id'), b: z.uuid('b is a submission id') });

export function teachingRouter(ctx: AppContext): Router {
  const router = express.Router();

  router.get('/classes/:id/overview', requireUser, async (req, res) => {
    const id = parseId(req.params.id, 'class');
    if (!id.ok) return reply(res, id);
    reply(res, await classOverview(ctx, currentUser(req), id.value));
  });

  router.get('/labs/:id/students', requireUser, async (req, res) => {
    const id = parseId(req.params.id, 'lab');
    if (!id.ok) return reply(res, id);
    reply(res, await labStudents(ctx, currentUser(req), id.value), 200, (students) => ({ students }));
  });

  router.post('/labs/:id/return-graded', requireUser, async (req, res) => {
    const id = parseId(req.params.id, 'lab');
    if (!id.ok) return reply(res, id);
    const body = parse(ReturnGradedRequestSchema, req.body);
    if (!body.ok) return reply(res, body);
    reply(res, await returnAllGraded(ctx, currentUser(req), id.value, body.value));
  });

  router.get('/labs/:id/similar', requireUser, async (req, res) => {
    const id = parseId(req.params.id, 'lab');
    if (!id.ok) return reply(res, id);
    reply(res, await similarSubmissions(ctx, currentUser(req), id.value));
  });

  router.get('/labs/:id/similar/pair', requireUser, async (req, res) => {
    const id = parseId(req.params.id, 'lab');
    if (!id.ok) return reply(res, id);
    const query = parse(PairQuerySchema, req.query);
    if (!query.ok) return reply(res, query);
    reply(res, await sideBySide(ctx, currentUser(req), id.value, query.value.a, query.value.b));
  });

  return router;
}
