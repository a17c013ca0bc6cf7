import { Router } from 'express';
import { pullQuerySchema, pushRequestSchema } from '../../shared/sync-schemas.js';
import { signedIn } from '../auth/session-middleware.js';
import type { ServerContext } from '../context.js';
import { AppError } from '../core/app-error.js';
import { validate } from '../core/validate.js';
import { pull } from './pull-service.js';
import { push } from './push-service.js';

/** A failure that is not the request's fault: the device keeps its outbox and tries again, a minute later at the soonest. */
function passing(error: unknown): never {
  if (error instanceof AppError) throw error;
  const busy = new AppError(
    503,
    'try_again',
    'The server could not save this just now; nothing was changed. Your device will try again.',
  );
  busy.retryAfterMinutes = 1;
  throw busy;
}

export function syncRoutes(ctx: ServerContext): Router {
  const router = Router();

  router.post('/sync/push', async (req, res) => {
    const { user } = signedIn(res);
    const { workshopId, mutations } = validate(pushRequestSchema, req.body);
    res.json(await push(ctx, user.id, workshopId, mutations).catch(passing));
  });

  router.get('/sync/pull', async (req, res) => {
    const { user } = signedIn(res);
    const { workshopId, after, limit } = validate(pullQuerySchema, req.query);
    res.set('Cache-Control', 'no-store').json(await pull(ctx, user.id, workshopId, after, limit).catch(passing));
  });

  return router;
}
