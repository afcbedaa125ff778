/**
 * Multipart uploads (multer, memory storage, 1 MB, one file in the field `file`): a PLCopen XML
 * program import and a roster CSV. The type is checked from the file name and the declared type
 * before any byte is read as text.
 */
import express, { type RequestHandler, type Router } from 'express';
import type { AppContext } from '../context';
import { currentUser, requireUser } from '../http/authenticate';
import { ApiError } from '../http/failure';
import { parseId, reply } from '../http/reply';
import { sendFailure } from '../http/errorHandler';
import { receiveFile } from '../http/multipart';
import { importProgramFile } from '../services/programFiles';
import { importRoster } from '../services/roster';

const MAX_UPLOAD_BYTES = 1024 * 1024;

function upload(kind: string, extension: string, types: readonly string[]): RequestHandler {
  return receiveFile({
    maxBytes: MAX_UPLOAD_BYTES,
    maxText: '1 MB',
    fileFilter: (_req, file, accept) => {
      const named = file.originalname.toLowerCase().endsWith(extension);
      if (named && (types.includes(file.mimetype) || file.mimetype === 'application/octet-stream')) accept(null, true);
      else {
        accept(new ApiError({ code: 'unsupported_media_type', message: `Upload a ${kind} file (*${extension}); got "${file.originalname}" (${file.mimetype})`, fields: { file: `must be a ${kind} file` } }));
      }
    },
  });
}

/** The uploaded file as UTF-8 text, or null after answering 400. */
function fileText(req: express.Request, res: express.Response): string | null {
  if (!req.file) {
    sendFailure(res, { code: 'validation', message: 'No file uploaded: send it as multipart/form-data in the field "file"', fields: { file: 'missing' } });
    return null;
  }
  return req.file.buffer.toString('utf8');
}

export function uploadsRouter(ctx: AppContext): Router {
  const router = express.Router();

  router.post('/programs/import', requireUser, upload('PLCopen XML', '.xml', ['application/xml', 'text/xml']), async (req, res) => {
    const xml = fileText(req, res);
    if (xml === null) return;
    reply(res, await importProgramFile(ctx, currentUser(req), xml, req.file?.originalname ?? 'import.xml'), 201);
  });

  router.post('/classes/:id/roster', requireUser, upload('CSV', '.csv', ['text/csv', 'text/plain', 'application/vnd.ms-excel']), async (req, res) => {
    const id = parseId(req.params.id, 'class');
    if (!id.ok) return reply(res, id);
    const csv = fileText(req, res);
    if (csv === null) return;
    reply(res, await importRoster(ctx, currentUser(req), id.value, csv), 200, (report) => ({ report }));
  });

  return router;
}
