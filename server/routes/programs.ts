/** `/api/programs/*`: programs, versions, diff, restore, export. Thin: parse, call the service, answer. */
import express, { type Router } from 'express';
import { z } from 'zod';
import {
  CreateProgramRequestSchema,
  DiffQuerySchema,
  ExportQuerySchema,
  INT32_MAX,
  OwnerQuerySchema,
  RenameProgramRequestSchema,
  RestoreVersionRequestSchema,
  SaveVersionRequestSchema,
} from '@shared/api';
import type { AppContext } from '../context';
import { currentUser, requireUser } from '../http/authenticate';
import { parse, parseId, reply, replyWithDocument } from '../http/reply';
import * as programs from '../services/programs';
import { exportVersion } from '../services/programFiles';

/** A version number in the path: a whole number that fits the `integer` column. */
const VersionNumberSchema = z.coerce.number().int().min(1).max(INT32_MAX);

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
    replyWithDocument(res, await programs.getProgram(ctx, currentUser(req), id.value), 200, ({ program, head }) => ({ fields: { program }, key: 'head', ...head }));
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
    replyWithDocument(res, await programs.saveVersion(ctx, currentUser(req), id.value, body.value), 201, (version) => ({ key: 'version', ...version }));
  });

  router.get('/programs/:id/versions/:number', async (req, res) => {
    const id = parseId(req.params.id, 'program');
    if (!id.ok) return reply(res, id);
    const number = parse(VersionNumberSchema, req.params.number);
    if (!number.ok) return reply(res, { ok: false, failure: { code: 'not_found', message: 'No such version' } });
    replyWithDocument(res, await programs.getVersionJson(ctx, currentUser(req), id.value, number.value), 200, (version) => ({ key: 'version', ...version }));
  });

  router.get('/programs/:id/versions/:number/export', async (req, res) => {
    const id = parseId(req.params.id, 'program');
    if (!id.ok) return reply(res, id);
    const number = parse(VersionNumberSchema, req.params.number);
    if (!number.ok) return reply(res, { ok: false, failure: { code: 'not_found', message: 'No such version' } });
    const query = parse(ExportQuerySchema, req.query);
    if (!query.ok) return reply(res, query);
    const file = await exportVersion(ctx, currentUser(req), id.value, number.value, query.value.format);
    if (!file.ok) return reply(res, file);
    res.setHeader('Content-Type', file.value.contentType);
    res.setHeader('Content-Disposition', `attachment; filename="${file.value.fileName}"`);
    res.setHeader('Content-Length', file.value.body.byteLength);
    // `end`, not `send`: send would hash megabytes for an ETag on the main thread.
    res.end(file.value.body);
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
    replyWithDocument(res, await programs.restoreVersion(ctx, currentUser(req), id.value, body.value), 201, (version) => ({ key: 'version', ...version }));
  });

  return router;
}
