/**
 * The admin console's routes beyond the account list (`admin.ts`): role changes, usage counts, a
 * database backup, every invitation; and resending or cancelling an invitation, which a class's
 * instructor may do too for the class's own (`invitationPolicy`).
 */
import { promisify } from 'node:util';
import { gzip } from 'node:zlib';
import express, { type Router } from 'express';
import { ChangeRoleRequestSchema } from '@shared/api/administration';
import type { AppContext } from '../context';
import { currentUser, requireRole, requireUser } from '../http/authenticate';
import { parse, parseId, reply } from '../http/reply';
import { sendFailure } from '../http/errorHandler';
import { accountView } from '../services/accountAdmin';
import { cancelOneInvitation, changeRole, listInvitationEntries, resendInvitation, usage } from '../services/adminConsole';

const gzipAsync = promisify(gzip);

/** `rungwright-backup-2026-12-05T1153Z.tar.gz`: sorts by time, no character a file system refuses. */
export function backupFilename(at: Date): string {
  return `rungwright-backup-${at.toISOString().slice(0, 16).replace(':', '')}Z.tar.gz`;
}

export function adminConsoleRouter(ctx: AppContext): Router {
  const router = express.Router();

  router.post('/admin/users/:id/role', requireRole('admin'), async (req, res) => {
    const id = parseId(req.params.id, 'account');
    if (!id.ok) return reply(res, id);
    const body = parse(ChangeRoleRequestSchema, req.body);
    if (!body.ok) return reply(res, body);
    reply(res, await changeRole(ctx, currentUser(req), id.value, body.value), 200, (user) => ({ user: accountView(user) }));
  });

  router.get('/admin/usage', requireRole('admin'), async (_req, res) => {
    res.json(await usage(ctx));
  });

  router.get('/admin/invitations', requireRole('admin'), async (_req, res) => {
    res.json({ invitations: await listInvitationEntries(ctx) });
  });

  // PGlite's own dump of the data directory, gzipped; docs/backup.md says how to restore it. One
  // at a time: a dump copies the whole database, and two at once only make both slower.
  let backupRunning = false;
  router.get('/admin/backup', requireRole('admin'), async (_req, res) => {
    if (!ctx.backup) {
      sendFailure(res, { code: 'conflict', message: 'The database is on a PostgreSQL server: back it up there (pg_dump), not from here' });
      return;
    }
    if (backupRunning) {
      res.setHeader('Retry-After', '10');
      sendFailure(res, { code: 'conflict', message: 'A backup is being made right now; download it again in a moment' });
      return;
    }
    backupRunning = true;
    try {
      const tar = Buffer.from(await (await ctx.backup()).arrayBuffer());
      const body = await gzipAsync(tar);
      res.type('application/gzip');
      res.attachment(backupFilename(ctx.clock.now()));
      res.send(body);
    } finally {
      backupRunning = false;
    }
  });

  router.post('/invitations/:id/resend', requireUser, async (req, res) => {
    const id = parseId(req.params.id, 'invitation');
    if (!id.ok) return reply(res, id);
    reply(res, await resendInvitation(ctx, currentUser(req), id.value), 201, (invitation) => ({ invitation }));
  });

  router.post('/invitations/:id/cancel', requireUser, async (req, res) => {
    const id = parseId(req.params.id, 'invitation');
    if (!id.ok) return reply(res, id);
    reply(res, await cancelOneInvitation(ctx, currentUser(req), id.value), 200, (invitation) => ({ invitation }));
  });

  return router;
}
