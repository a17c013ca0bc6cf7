import { Router } from 'express';
import {
  changePasswordRequestSchema,
  deleteAccountRequestSchema,
  updateAccountRequestSchema,
} from '../../shared/account-schemas.js';
import type { ServerContext } from '../context.js';
import { validate } from '../core/validate.js';
import { changePassword, deleteAccount, renameAccount, sessionView } from './account-service.js';
import { signedIn } from './session-middleware.js';

export function accountRoutes(ctx: ServerContext): Router {
  const router = Router();

  router.get('/account', async (_req, res) => {
    res.set('Cache-Control', 'no-store').json(await sessionView(ctx, signedIn(res).user.id));
  });

  router.patch('/account', async (req, res) => {
    const { user } = signedIn(res);
    res.json(await renameAccount(ctx, user.id, validate(updateAccountRequestSchema, req.body).displayName));
  });

  router.post('/account/password', async (req, res) => {
    const session = signedIn(res);
    const { currentPassword, newPassword } = validate(changePasswordRequestSchema, req.body);
    await changePassword(ctx, session.user.id, session.sessionId, currentPassword, newPassword);
    res.status(204).end();
  });

  router.delete('/account', async (req, res) => {
    const { user } = signedIn(res);
    await deleteAccount(ctx, user.id, validate(deleteAccountRequestSchema, req.body).password);
    res.setHeader('Set-Cookie', ctx.sessions.blankCookie()).status(204).end();
  });

  return router;
}
