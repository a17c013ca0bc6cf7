import type { RequestHandler } from 'express';
import { AppError } from './app-error.js';

const SAFE_METHODS = new Set(['GET', 'HEAD', 'OPTIONS']);

/**
 * Refuses a state-changing request a browser sent from another site (CSRF). Browsers always say
 * where a request comes from (Sec-Fetch-Site, or at least Origin); programs that say nothing
 * carry no one's cookies by accident and pass.
 */
export function sameOriginOnly(publicOrigin: string): RequestHandler {
  return (req, _res, next) => {
    if (SAFE_METHODS.has(req.method)) return next();
    const fetchSite = req.get('sec-fetch-site');
    if (fetchSite !== undefined) {
      return fetchSite === 'same-origin' ? next() : next(refusal());
    }
    const origin = req.get('origin');
    if (origin === undefined) return next();
    const ownOrigins = [publicOrigin, `${req.protocol}://${req.get('host')}`];
    return ownOrigins.includes(origin) ? next() : next(refusal());
  };
}

function refusal(): AppError {
  return new AppError(403, 'cross_site', 'This request came from another site and was refused.');
}
