/** `/api/classes/*`: classes, join codes, students, invitations (the roster upload is in uploads.ts). */
import express, { type Router } from 'express';
import { CreateClassRequestSchema, JoinClassRequestSchema, JoinCodeSchema } from '@shared/api';
import { z } from 'zod';
import type { AppContext } from '../context';
import { currentUser, requireUser } from '../http/authenticate';
import { parse, parseId, reply } from '../http/reply';
import * as classes from '../services/classes';

export function classesRouter(ctx: AppContext): Router {
  const router = express.Router();
  router.use('/classes', requireUser);

  router.get('/classes', async (req, res) => {
    res.json({ classes: await classes.listClasses(ctx, currentUser(req)) });
  });

  router.post('/classes', async (req, res) => {
    const body = parse(CreateClassRequestSchema, req.body);
    if (!body.ok) return reply(res, body);
    reply(res, await classes.createClass(ctx, currentUser(req), body.value), 201, (cls) => ({ class: cls }));
  });

  router.post('/classes/join', async (req, res) => {
    const body = parse(JoinClassRequestSchema.extend({ joinCode: JoinCodeSchema }), req.body);
    if (!body.ok) return reply(res, body);
    reply(res, await classes.joinClass(ctx, currentUser(req), body.value.joinCode), 200, (cls) => ({ class: cls }));
  });

  router.get('/classes/:id', async (req, res) => {
    const id = parseId(req.params.id, 'class');
    if (!id.ok) return reply(res, id);
    reply(res, await classes.getClass(ctx, currentUser(req), id.value), 200, (cls) => ({ class: cls }));
  });

  router.post('/classes/:id/join-code', async (req, res) => {
    const id = parseId(req.params.id, 'class');
    if (!id.ok) return reply(res, id);
    reply(res, await classes.regenerateJoinCode(ctx, currentUser(req), id.value), 200, (cls) => ({ class: cls }));
  });

  router.get('/classes/:id/students', async (req, res) => {
    const id = parseId(req.params.id, 'class');
    if (!id.ok) return reply(res, id);
    reply(res, await classes.listStudents(ctx, currentUser(req), id.value), 200, (students) => ({ students }));
  });

  router.delete('/classes/:id/students/:userId', async (req, res) => {
    const id = parseId(req.params.id, 'class');
    if (!id.ok) return reply(res, id);
    const userId = parse(z.uuid(), req.params.userId);
    if (!userId.ok) return reply(res, { ok: false, failure: { code: 'not_found', message: 'That student is not in this class' } });
    reply(res, await classes.removeStudent(ctx, currentUser(req), id.value, userId.value), 204);
  });

  router.get('/classes/:id/invitations', async (req, res) => {
    const id = parseId(req.params.id, 'class');
    if (!id.ok) return reply(res, id);
    reply(res, await classes.listInvitations(ctx, currentUser(req), id.value), 200, (invitations) => ({ invitations }));
  });

  return router;
}
