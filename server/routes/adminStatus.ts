/**
 * `GET /api/admin/status` (admin only): the demo accounts that can still sign in. Their passwords
 * are in the README, so the admin page warns while any exists.
 */
import express, { type Router } from 'express';
import type { AdminStatus } from '@shared/api/adminStatus';
import type { AppContext } from '../context';
import { requireRole } from '../http/authenticate';
import { listActiveDemoUsers } from '../db/demoUsers';

export function adminStatusRouter(ctx: AppContext): Router {
  const router = express.Router();
  router.get('/admin/status', requireRole('admin'), async (_req, res) => {
    const body: AdminStatus = { demoAccounts: await listActiveDemoUsers(ctx.orm) };
    res.json(body);
  });
  return router;
}
