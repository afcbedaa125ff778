/** `/api/submissions/:id*`: an instructor's review — the full report, override, feedback, return. */
import express, { type Router } from 'express';
import { FeedbackRequestSchema, OverrideScoreRequestSchema, ReturnSubmissionRequestSchema } from '@shared/api';
import type { AppContext } from '../context';
import { currentUser, requireUser } from '../http/authenticate';
import { parse, parseId, reply } from '../http/reply';
import * as submissions from '../services/submissions';

export function submissionsRouter(ctx: AppContext): Router {
  const router = express.Router();
  router.use('/submissions', requireUser);

  router.get('/submissions/:id', async (req, res) => {
    const id = parseId(req.params.id, 'submission');
    if (!id.ok) return reply(res, id);
    reply(res, await submissions.getSubmission(ctx, currentUser(req), id.value), 200, (submission) => ({ submission }));
  });

  router.post('/submissions/:id/override', async (req, res) => {
    const id = parseId(req.params.id, 'submission');
    if (!id.ok) return reply(res, id);
    const body = parse(OverrideScoreRequestSchema, req.body);
    if (!body.ok) return reply(res, body);
    reply(res, await submissions.overrideScore(ctx, currentUser(req), id.value, body.value), 200, (submission) => ({ submission }));
  });

  router.put('/submissions/:id/feedback', async (req, res) => {
    const id = parseId(req.params.id, 'submission');
    if (!id.ok) return reply(res, id);
    const body = parse(FeedbackRequestSchema, req.body);
    if (!body.ok) return reply(res, body);
    reply(res, await submissions.setFeedback(ctx, currentUser(req), id.value, body.value.feedback), 200, (submission) => ({ submission }));
  });

  router.post('/submissions/:id/return', async (req, res) => {
    const id = parseId(req.params.id, 'submission');
    if (!id.ok) return reply(res, id);
    const body = parse(ReturnSubmissionRequestSchema, req.body);
    if (!body.ok) return reply(res, body);
    reply(res, await submissions.returnSubmission(ctx, currentUser(req), id.value, body.value.feedback), 200, (submission) => ({ submission }));
  });

  return router;
}
