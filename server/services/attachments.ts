/**
 * Lab attachments (a wiring diagram as an image or a PDF). The type is read from the content's
 * first bytes, never trusted from the name or the declared type: PNG's 8-byte signature (PNG
 * specification / ISO/IEC 15948, 5.2), JPEG's SOI marker FF D8 FF (ITU-T T.81, B.1.1.3), and PDF's
 * `%PDF-` header (ISO 32000-1, 7.5.2).
 */
import { ATTACHMENT_TYPES, MAX_ATTACHMENT_BYTES, type AttachmentSummary, type AttachmentType } from '@shared/api';
import type { AppContext } from '../context';
import type { User } from '../db/users';
import * as db from '../db/labs';
import { failure, success, type Outcome } from '../http/failure';
import { authorisedLab } from './labs';
import { attachmentView } from './labViews';

const SIGNATURES = {
  'image/png': [0x89, 0x50, 0x4e, 0x47, 0x0d, 0x0a, 0x1a, 0x0a],
  'image/jpeg': [0xff, 0xd8, 0xff],
  'application/pdf': [0x25, 0x50, 0x44, 0x46, 0x2d],
} as const satisfies Record<AttachmentType, readonly number[]>;

/** The content type the bytes start with, or null. */
export function sniffAttachmentType(bytes: Uint8Array): AttachmentType | null {
  return ATTACHMENT_TYPES.find((type) => SIGNATURES[type].every((b, i) => bytes[i] === b)) ?? null;
}

/** A file name safe to echo in a header: no path, no control characters, at most 200 characters. */
function cleanFilename(name: string): string {
  const base = name.split(/[\\/]/).pop() ?? '';
  // eslint-disable-next-line no-control-regex
  return base.replace(/[\u0000-\u001f\u007f"]/g, '').slice(0, 200) || 'attachment';
}

export async function addAttachment(ctx: AppContext, actor: User, labId: string, file: { originalname: string; buffer: Buffer }): Promise<Outcome<AttachmentSummary>> {
  const found = await authorisedLab(ctx, actor, labId, 'manage');
  if (!found.ok) return found;
  if (file.buffer.length > MAX_ATTACHMENT_BYTES) return failure('payload_too_large', 'An attachment is at most 10 MB', { fields: { file: 'larger than 10 MB' } });
  const type = sniffAttachmentType(file.buffer);
  if (!type) {
    return failure('unsupported_media_type', `"${cleanFilename(file.originalname)}" is not a PNG, JPEG or PDF file (judged by its content)`, { fields: { file: 'must be a PNG, JPEG or PDF file' } });
  }
  const row = await db.insertAttachment(ctx.orm, { labId, filename: cleanFilename(file.originalname), contentType: type, size: file.buffer.length, data: file.buffer, createdAt: ctx.clock.now() });
  return success(attachmentView(row));
}

export async function listLabAttachments(ctx: AppContext, actor: User, labId: string): Promise<Outcome<AttachmentSummary[]>> {
  const found = await authorisedLab(ctx, actor, labId, 'view');
  if (!found.ok) return found;
  return success((await db.listAttachments(ctx.orm, labId)).map(attachmentView));
}

export async function getAttachment(ctx: AppContext, actor: User, labId: string, id: string) {
  const found = await authorisedLab(ctx, actor, labId, 'view');
  if (!found.ok) return found;
  const row = await db.findAttachment(ctx.orm, labId, id);
  return row ? success(row) : failure('not_found', 'This attachment does not exist or is not open to you');
}

export async function removeAttachment(ctx: AppContext, actor: User, labId: string, id: string): Promise<Outcome<null>> {
  const found = await authorisedLab(ctx, actor, labId, 'manage');
  if (!found.ok) return found;
  return (await db.deleteAttachment(ctx.orm, labId, id)) ? success(null) : failure('not_found', 'This attachment does not exist or is not open to you');
}
