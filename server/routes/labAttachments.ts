/**
 * `/api/labs/:id/attachments*`: upload (multipart, field `file`, multer memory storage, 10 MB),
 * list, download and delete. Mounted before the JSON-only rule, like the other uploads.
 */
import express, { type Router } from 'express';
import { MAX_ATTACHMENT_BYTES } from '@shared/api';
import type { AppContext } from '../context';
import { currentUser, requireUser } from '../http/authenticate';
import { sendFailure } from '../http/errorHandler';
import { receiveFile } from '../http/multipart';
import { parseId, reply } from '../http/reply';
import * as attachments from '../services/attachments';

/** One file in the field `file`; every malformed multipart body is a located 4xx (`http/multipart.ts`). */
const upload = receiveFile({ maxBytes: MAX_ATTACHMENT_BYTES, maxText: '10 MB', fields: 5 });

export function labAttachmentsRouter(ctx: AppContext): Router {
  const router = express.Router();

  router.post('/labs/:id/attachments', requireUser, upload, async (req, res) => {
    const id = parseId(req.params.id, 'lab');
    if (!id.ok) return reply(res, id);
    if (!req.file) {
      sendFailure(res, { code: 'validation', message: 'No file uploaded: send it as multipart/form-data in the field "file"', fields: { file: 'missing' } });
      return;
    }
    reply(res, await attachments.addAttachment(ctx, currentUser(req), id.value, req.file), 201, (attachment) => ({ attachment }));
  });

  router.get('/labs/:id/attachments', requireUser, async (req, res) => {
    const id = parseId(req.params.id, 'lab');
    if (!id.ok) return reply(res, id);
    reply(res, await attachments.listLabAttachments(ctx, currentUser(req), id.value), 200, (list) => ({ attachments: list }));
  });

  router.get('/labs/:id/attachments/:attachmentId', requireUser, async (req, res) => {
    const id = parseId(req.params.id, 'lab');
    const attachmentId = parseId(req.params.attachmentId, 'attachment');
    if (!id.ok) return reply(res, id);
    if (!attachmentId.ok) return reply(res, attachmentId);
    const found = await attachments.getAttachment(ctx, currentUser(req), id.value, attachmentId.value);
    if (!found.ok) return reply(res, found);
    res.type(found.value.contentType);
    res.setHeader('Content-Disposition', `inline; filename="${found.value.filename.replace(/[^\x20-\x7e]/g, '_')}"`);
    res.send(found.value.data);
  });

  router.delete('/labs/:id/attachments/:attachmentId', requireUser, async (req, res) => {
    const id = parseId(req.params.id, 'lab');
    const attachmentId = parseId(req.params.attachmentId, 'attachment');
    if (!id.ok) return reply(res, id);
    if (!attachmentId.ok) return reply(res, attachmentId);
    reply(res, await attachments.removeAttachment(ctx, currentUser(req), id.value, attachmentId.value), 204);
  });

  return router;
}
