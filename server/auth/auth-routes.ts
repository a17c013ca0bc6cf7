import { Router } from 'express';
import {
  emailOnlyRequestSchema,
  resetPasswordRequestSchema,
  signInRequestSchema,
  signUpRequestSchema,
  verifyEmailRequestSchema,
} from '../../shared/account-schemas.js';
import type { ServerContext } from '../context.js';
import { validate } from '../core/validate.js';
import { signedIn } from './session-middleware.js';
import {
  AFTER_SIGN_UP,
  RESET_SENT,
  requestPasswordReset,
  resendVerification,
  resetPassword,
  signIn,
  signUp,
  verifyEmail,
} from './sign-in-service.js';

export function authRoutes(ctx: ServerContext): Router {
  const router = Router();

  router.post('/auth/sign-up', async (req, res) => {
    const next = await signUp(ctx, validate(signUpRequestSchema, req.body), req.ip ?? 'unknown');
    res.status(202).json({ message: AFTER_SIGN_UP[next], next });
  });

  router.post('/auth/verify', async (req, res) => {
    await verifyEmail(ctx, validate(verifyEmailRequestSchema, req.body).token);
    res.json({ verified: true });
  });

  router.post('/auth/verify/resend', async (req, res) => {
    await resendVerification(ctx, validate(emailOnlyRequestSchema, req.body).email, req.ip ?? 'unknown');
    res.status(202).json({ message: 'If this address still needs confirming, a new link is on its way.' });
  });

  router.post('/auth/sign-in', async (req, res) => {
    const { cookie, view } = await signIn(ctx, validate(signInRequestSchema, req.body), req.ip ?? 'unknown');
    // A session left from before (another account on a shared phone) ends; the new one has a new id.
    if (res.locals.session) await ctx.sessions.end(res.locals.session.sessionId);
    res.setHeader('Set-Cookie', cookie).json(view);
  });

  router.post('/auth/sign-out', async (_req, res) => {
    if (res.locals.session) await ctx.sessions.end(res.locals.session.sessionId);
    res.setHeader('Set-Cookie', ctx.sessions.blankCookie()).status(204).end();
  });

  router.post('/auth/sign-out-others', async (_req, res) => {
    const session = signedIn(res);
    await ctx.sessions.endAllFor(session.user.id, session.sessionId);
    res.status(204).end();
  });

  router.post('/auth/forgot', async (req, res) => {
    await requestPasswordReset(ctx, validate(emailOnlyRequestSchema, req.body).email, req.ip ?? 'unknown');
    res.status(202).json({ message: RESET_SENT });
  });

  router.post('/auth/reset', async (req, res) => {
    await resetPassword(ctx, validate(resetPasswordRequestSchema, req.body));
    res.setHeader('Set-Cookie', ctx.sessions.blankCookie()).status(204).end();
  });

  return router;
}
