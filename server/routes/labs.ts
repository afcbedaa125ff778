/** `/api/lab-templates`, `/api/classes/:id/labs*` and `/api/labs/:id*`: authoring, student work, review. */
import express, { type Router } from 'express';
import {
  CreateLabRequestSchema,
  FromTemplateRequestSchema,
  ProgramVersionRefSchema,
  SubmissionListQuerySchema,
  UpdateLabRequestSchema,
} from '@shared/api';
import type { AppContext } from '../context';
import { currentUser, requireRole, requireUser } from '../http/authenticate';
import { parse, parseId, reply } from '../http/reply';
import * as labs from '../services/labs';
import * as studentLabs from '../services/studentLabs';
import * as submissions from '../services/submissions';

export function labsRouter(ctx: AppContext): Router {
  const router = express.Router();

  // The standard labs are the instructors' to choose from; a student needs none of them.
  router.get('/lab-templates', requireRole('instructor', 'admin'), (_req, res) => {
    res.json({ templates: labs.listTemplates() });
  });

  router.get('/classes/:id/labs', requireUser, async (req, res) => {
    const id = parseId(req.params.id, 'class');
    if (!id.ok) return reply(res, id);
    reply(res, await studentLabs.listClassLabs(ctx, currentUser(req), id.value), 200, (list) => ({ labs: list }));
  });

  router.post('/classes/:id/labs', requireUser, async (req, res) => {
    const id = parseId(req.params.id, 'class');
    if (!id.ok) return reply(res, id);
    const body = parse(CreateLabRequestSchema, req.body);
    if (!body.ok) return reply(res, body);
    reply(res, await labs.createLab(ctx, currentUser(req), id.value, body.value), 201, (lab) => ({ lab }));
  });

  router.post('/classes/:id/labs/from-template', requireUser, async (req, res) => {
    const id = parseId(req.params.id, 'class');
    if (!id.ok) return reply(res, id);
    const body = parse(FromTemplateRequestSchema, req.body);
    if (!body.ok) return reply(res, body);
    const { templateId, ...options } = body.value;
    reply(res, await labs.labFromTemplate(ctx, currentUser(req), id.value, templateId, options), 201);
  });

  router.use('/labs/:id', requireUser);

  router.get('/labs/:id', async (req, res) => {
    const id = parseId(req.params.id, 'lab');
    if (!id.ok) return reply(res, id);
    reply(res, await labs.getLab(ctx, currentUser(req), id.value), 200, (lab) => ({ lab }));
  });

  router.patch('/labs/:id', async (req, res) => {
    const id = parseId(req.params.id, 'lab');
    if (!id.ok) return reply(res, id);
    const body = parse(UpdateLabRequestSchema, req.body);
    if (!body.ok) return reply(res, body);
    reply(res, await labs.updateLab(ctx, currentUser(req), id.value, body.value), 200, (lab) => ({ lab }));
  });

  router.delete('/labs/:id', async (req, res) => {
    const id = parseId(req.params.id, 'lab');
    if (!id.ok) return reply(res, id);
    reply(res, await labs.deleteLab(ctx, currentUser(req), id.value), 204);
  });

  for (const [path, published] of [['publish', true], ['unpublish', false]] as const) {
    router.post(`/labs/:id/${path}`, async (req, res) => {
      const id = parseId(req.params.id, 'lab');
      if (!id.ok) return reply(res, id);
      reply(res, await labs.setPublished(ctx, currentUser(req), id.value, published), 200, (lab) => ({ lab }));
    });
  }

  router.post('/labs/:id/try', async (req, res) => {
    const id = parseId(req.params.id, 'lab');
    if (!id.ok) return reply(res, id);
    const body = parse(ProgramVersionRefSchema, req.body);
    if (!body.ok) return reply(res, body);
    reply(res, await labs.tryLab(ctx, currentUser(req), id.value, body.value));
  });

  router.post('/labs/:id/open', async (req, res) => {
    const id = parseId(req.params.id, 'lab');
    if (!id.ok) return reply(res, id);
    const opened = await studentLabs.openLab(ctx, currentUser(req), id.value);
    reply(res, opened, opened.ok && opened.value.created ? 201 : 200);
  });

  router.get('/labs/:id/self-check-script', async (req, res) => {
    const id = parseId(req.params.id, 'lab');
    if (!id.ok) return reply(res, id);
    reply(res, await studentLabs.getSelfCheckScript(ctx, currentUser(req), id.value));
  });

  router.post('/labs/:id/submissions', async (req, res) => {
    const id = parseId(req.params.id, 'lab');
    if (!id.ok) return reply(res, id);
    const body = parse(ProgramVersionRefSchema, req.body);
    if (!body.ok) return reply(res, body);
    reply(res, await submissions.submit(ctx, currentUser(req), id.value, body.value), 201, (submission) => ({ submission }));
  });

  router.get('/labs/:id/submissions/mine', async (req, res) => {
    const id = parseId(req.params.id, 'lab');
    if (!id.ok) return reply(res, id);
    reply(res, await submissions.listMine(ctx, currentUser(req), id.value), 200, (list) => ({ submissions: list }));
  });

  router.get('/labs/:id/submissions', async (req, res) => {
    const id = parseId(req.params.id, 'lab');
    if (!id.ok) return reply(res, id);
    const query = parse(SubmissionListQuerySchema, req.query);
    if (!query.ok) return reply(res, query);
    reply(res, await submissions.listForLab(ctx, currentUser(req), id.value, query.value), 200, (list) => ({ submissions: list }));
  });

  router.post('/labs/:id/regrade', async (req, res) => {
    const id = parseId(req.params.id, 'lab');
    if (!id.ok) return reply(res, id);
    reply(res, await submissions.regradeLab(ctx, currentUser(req), id.value));
  });

  return router;
}
