import { Router } from 'express';
import type pg from 'pg';
import { isDatabaseReachable } from '../db/database.js';

export function healthRoutes(pool: pg.Pool): Router {
  const router = Router();
  router.get('/health', async (_req, res) => {
    const reachable = await isDatabaseReachable(pool);
    res
      .status(reachable ? 200 : 503)
      .set('Cache-Control', 'no-store')
      .json({ status: reachable ? 'ok' : 'degraded', database: reachable ? 'reachable' : 'unreachable' });
  });
  return router;
}
