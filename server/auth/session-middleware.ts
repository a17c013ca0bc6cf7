import type { RequestHandler, Response } from 'express';
import { AppError } from '../core/app-error.js';
import type { SessionStore, ValidatedSession } from './session-store.js';

declare global {
  // eslint-disable-next-line @typescript-eslint/no-namespace
  namespace Express {
    interface Locals {
      session: ValidatedSession | null;
    }
  }
}

/** Reads the session cookie on every API request; renews or clears it as the store says. */
export function readSession(sessions: SessionStore): RequestHandler {
  return async (req, res, next) => {
    const session = await sessions.validate(req.headers.cookie);
    res.locals.session = session;
    if (session?.refreshedCookie) res.append('Set-Cookie', session.refreshedCookie);
    if (!session && req.headers.cookie?.includes('benchtide_session='))
      res.append('Set-Cookie', sessions.blankCookie());
    next();
  };
}

export function signedIn(res: Response): ValidatedSession {
  const session = res.locals.session;
  if (!session) throw new AppError(401, 'signed_out', 'Sign in to do this.');
  return session;
}
