/** `GET /api/health`: the server is up and the database answers. */
import express, { type Router } from 'express';
import { sql } from 'drizzle-orm';
import type { HealthResponse } from '@shared/api/health';
import type { AppContext } from '../context';

export function healthRouter(ctx: AppContext): Router {
  const router = express.Router();
  router.get('/health', async (_req, res) => {
    await ctx.orm.execute(sql`select 1`);
    const body: HealthResponse = { ok: true, db: ctx.driver, version: ctx.version };
    res.json(body);
  });
  return router;
}
