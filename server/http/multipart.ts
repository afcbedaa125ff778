/**
 * Receiving one uploaded file (multer, memory storage) with every way a multipart body can be
 * wrong answered as a 4xx: not multipart (415), no `boundary` in the Content-Type (400), a body
 * busboy cannot read (400, with its reason), a file too large (413), a file name with control
 * characters (400). Without this, busboy's own errors ("Multipart: Boundary not found", "Unexpected
 * end of form") reached the error middleware as unexpected 500s.
 */
import type { RequestHandler } from 'express';
import multer from 'multer';
import { parse as parseContentType } from 'content-type';
import { ApiError, type Failure } from './failure';

export interface FileUploadOptions {
  /** Largest file accepted, in bytes. */
  maxBytes: number;
  /** Said in the 413 message, e.g. "1 MB". */
  maxText: string;
  /** Other form fields allowed beside `file`. */
  fields?: number;
  /** Accepts or refuses the file by its name and declared type, before any byte is stored. */
  fileFilter?: multer.Options['fileFilter'];
}

/** The `boundary` parameter of a multipart Content-Type, or null when it is missing or unreadable. */
function boundaryOf(contentType: string | undefined): string | null {
  if (!contentType) return null;
  try {
    const boundary = parseContentType(contentType).parameters.boundary;
    return boundary && boundary.length <= 70 ? boundary : null;
  } catch {
    return null;
  }
}

// C0 controls and DEL: a file name is shown and stored as text.
// eslint-disable-next-line no-control-regex
const CONTROL_CHARACTERS = /[\u0000-\u001f\u007f]/;

function refusal(failure: Failure): ApiError {
  return new ApiError(failure);
}

/** Middleware: one file in the field `file` into `req.file`, or a located 4xx. */
export function receiveFile(options: FileUploadOptions): RequestHandler {
  const receive = multer({
    storage: multer.memoryStorage(),
    limits: { fileSize: options.maxBytes, files: 1, fields: options.fields ?? 10, fieldSize: 64 * 1024, parts: (options.fields ?? 10) + 1 },
    fileFilter: (req, file, accept) => {
      if (CONTROL_CHARACTERS.test(file.originalname)) {
        accept(refusal({ code: 'validation', message: 'The file name holds control characters', fields: { file: 'file name with control characters' } }));
      } else if (options.fileFilter) options.fileFilter(req, file, accept);
      else accept(null, true);
    },
  }).single('file');

  return (req, res, next) => {
    if (!req.is('multipart/form-data')) {
      next(refusal({ code: 'unsupported_media_type', message: 'Send the file as multipart/form-data in the field "file"' }));
      return;
    }
    if (boundaryOf(req.get('content-type')) === null) {
      next(refusal({ code: 'validation', message: 'The multipart/form-data Content-Type has no boundary parameter (e.g. "multipart/form-data; boundary=…")', fields: { 'content-type': 'boundary missing' } }));
      return;
    }
    receive(req, res, (err: unknown) => {
      if (!err) return next();
      if (err instanceof ApiError) return next(err);
      if (err instanceof multer.MulterError) {
        if (err.code === 'LIMIT_FILE_SIZE') return next(refusal({ code: 'payload_too_large', message: `The file is larger than ${options.maxText}`, fields: { file: `larger than ${options.maxText}` } }));
        return next(refusal({ code: 'validation', message: `Upload one file in the field "file" (${err.message})`, fields: { [err.field ?? 'file']: err.message } }));
      }
      // Anything else comes from reading the body (busboy): the request's fault, never the server's.
      const reason = err instanceof Error ? err.message : String(err);
      next(refusal({ code: 'validation', message: `The multipart body cannot be read: ${reason}` }));
    });
  };
}
