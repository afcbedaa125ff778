/** `/api/programs/*`: programs, versions, diff, restore, export. Thin: parse, call the service, answer. */
import express, { type Router } from 'express';
import { z } from 'zod';
import {
  CreateProgramRequestSchema,
  DiffQuerySchema,
  ExportQuerySchema,
  OwnerQuerySchema,
  RenameProgramRequestSchema,
  RestoreVersionRequestSchema,
  SaveVersionRequestSchema,
} from '@shared/api';
import type { AppContext } from '../context';
import { currentUser, requireUser } from '../http/authenticate';
import { parse, parseId, reply } from '../http/reply';
import * as programs from '../services/programs';
import { exportProgramFile } from '../services/programFiles';

const VersionNumberSchema = z.coerce.number().int().min(1);

export function programsRouter(ctx: AppContext): Router {
  const router = express.Router();
  router.use('/programs', requireUser);

  router.get('/programs', async (req, res) => {
    const query = parse(OwnerQuerySchema, req.query);
    if (!query.ok) return reply(res, query);
    reply(res, await programs.listPrograms(ctx, currentUser(req), query.value.ownerId), 200, (list) => ({ programs: list }));
  });

  router.post('/programs', async (req, res) => {
    const body = parse(CreateProgramRequestSchema, req.body);
    if (!body.ok) return reply(res, body);
    reply(res, await programs.createProgram(ctx, currentUser(req), body.value), 201);
  });

  router.get('/programs/:id', async (req, res) => {
    const id = parseId(req.params.id, 'program');
    if (!id.ok) return reply(res, id);
    reply(res, await programs.getProgram(ctx, currentUser(req), id.value));
  });

  router.patch('/programs/:id', async (req, res) => {
    const id = parseId(req.params.id, 'program');
    if (!id.ok) return reply(res, id);
    const body = parse(RenameProgramRequestSchema, req.body);
    if (!body.ok) return reply(res, body);
    reply(res, await programs.renameProgram(ctx, currentUser(req), id.value, body.value.title), 200, (program) => ({ program }));
  });

  router.delete('/programs/:id', async (req, res) => {
    const id = parseId(req.params.id, 'program');
    if (!id.ok) return reply(res, id);
    reply(res, await programs.deleteProgram(ctx, currentUser(req), id.value), 204);
  });

  router.get('/programs/:id/versions', async (req, res) => {
    const id = parseId(req.params.id, 'program');
    if (!id.ok) return reply(res, id);
    reply(res, await programs.listVersions(ctx, currentUser(req), id.value), 200, (versions) => ({ versions }));
  });

  router.post('/programs/:id/versions', async (req, res) => {
    const id = parseId(req.params.id, 'program');
    if (!id.ok) return reply(res, id);
    const body = parse(SaveVersionRequestSchema, req.body);
    if (!body.ok) return reply(res, body);
    reply(res, await programs.saveVersion(ctx, currentUser(req), id.value, body.value), 201, (version) => ({ version }));
  });

  router.get('/programs/:id/versions/:number', async (req, res) => {
    const id = parseId(req.params.id, 'program');
    if (!id.ok) return reply(res, id);
    const number = parse(VersionNumberSchema, req.params.number);
    if (!number.ok) return reply(res, { ok: false, failure: { code: 'not_found', message: 'No such version' } });
    reply(res, await programs.getVersion(ctx, currentUser(req), id.value, number.value), 200, (version) => ({ version }));
  });

  router.get('/programs/:id/versions/:number/export', async (req, res) => {
    const id = parseId(req.params.id, 'program');
    if (!id.ok) return reply(res, id);
    const number = parse(VersionNumberSchema, req.params.number);
    if (!number.ok) return reply(res, { ok: false, failure: { code: 'not_found', message: 'No such version' } });
    const query = parse(ExportQuerySchema, req.query);
    if (!query.ok) return reply(res, query);
    const found = await programs.getVersionDocument(ctx, currentUser(req), id.value, number.value);
    if (!found.ok) return reply(res, found);
    const file = exportProgramFile(found.value.program.title, number.value, found.value.document, query.value.format, ctx.clock.now());
    res.setHeader('Content-Type', file.contentType);
    res.setHeader('Content-Disposition', `attachment; filename="${file.fileName}"`);
    res.send(file.content);
  });

  router.get('/programs/:id/diff', async (req, res) => {
    const id = parseId(req.params.id, 'program');
    if (!id.ok) return reply(res, id);
    const query = parse(DiffQuerySchema, req.query);
    if (!query.ok) return reply(res, query);
    reply(res, await programs.diffVersions(ctx, currentUser(req), id.value, query.value.from, query.value.to));
  });

  router.post('/programs/:id/restore', async (req, res) => {
    const id = parseId(req.params.id, 'program');
    if (!id.ok) return reply(res, id);
    const body = parse(RestoreVersionRequestSchema, req.body);
    if (!body.ok) return reply(res, body);
    reply(res, await programs.restoreVersion(ctx, currentUser(req), id.value, body.value), 201, (version) => ({ version }));
  });

  return router;
}
