/**
 * `/api/admin/*` (admin only): accounts (list, deactivate, reactivate, send a reset link),
 * instructor invitations; and `/api/dev/mail` (admin only, and only with the local fake SMTP).
 */
import express, { type Router } from 'express';
import { InviteInstructorRequestSchema } from '@shared/api';
import type { AppContext } from '../context';
import { currentUser, requireRole } from '../http/authenticate';
import { parse, parseId, reply } from '../http/reply';
import { sendFailure } from '../http/errorHandler';
import { inviteInstructor } from '../services/accounts';
import { listUsers } from '../db/users';
import { listSentMail } from '../db/sentMail';
import { iso } from '../services/views';
import { accountView, deactivateAccount, reactivateAccount } from '../services/accountAdmin';
import { sendResetLinkTo } from '../services/passwords';

export function adminRouter(ctx: AppContext): Router {
  const router = express.Router();

  router.get('/admin/users', requireRole('admin'), async (_req, res) => {
    res.json({ users: (await listUsers(ctx.orm)).map(accountView) });
  });

  router.post('/admin/users/:id/deactivate', requireRole('admin'), async (req, res) => {
    const id = parseId(req.params.id, 'account');
    if (!id.ok) return reply(res, id);
    reply(res, await deactivateAccount(ctx, currentUser(req), id.value), 200, (user) => ({ user: accountView(user) }));
  });

  router.post('/admin/users/:id/reactivate', requireRole('admin'), async (req, res) => {
    const id = parseId(req.params.id, 'account');
    if (!id.ok) return reply(res, id);
    reply(res, await reactivateAccount(ctx, id.value), 200, (user) => ({ user: accountView(user) }));
  });

  router.post('/admin/users/:id/password-reset', requireRole('admin'), async (req, res) => {
    const id = parseId(req.params.id, 'account');
    if (!id.ok) return reply(res, id);
    reply(res, await sendResetLinkTo(ctx, id.value), 202, (sent) => ({ sent }));
  });

  router.post('/admin/instructor-invitations', requireRole('admin'), async (req, res) => {
    const body = parse(InviteInstructorRequestSchema, req.body);
    if (!body.ok) return reply(res, body);
    reply(res, await inviteInstructor(ctx, body.value.email, body.value.name ?? null), 201, (invitation) => ({ invitation }));
  });

  router.get('/dev/mail', requireRole('admin'), async (_req, res) => {
    if (ctx.mailer.kind !== 'local-fake') {
      sendFailure(res, { code: 'mail_disabled', message: 'SMTP_URL is set, so mail goes to the real server and no local copy is kept' });
      return;
    }
    const mail = await listSentMail(ctx.orm);
    res.json({ mail: mail.map((m) => ({ ...m, receivedAt: iso(m.receivedAt) })) });
  });

  return router;
}
