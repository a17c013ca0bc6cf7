import express, { Router, type Response } from 'express';
import { existsSync } from 'node:fs';
import { basename, join } from 'node:path';

/** Build output names carry a content hash (`main-AB12CD34.js`): safe to cache for a year. */
const HASHED_FILE = /-[A-Z0-9]{8}\.[a-z0-9]+$/;
/** Files that say which version is current: always revalidated. */
const NEVER_CACHED = new Set(['index.html', 'ngsw.json', 'ngsw-worker.js', 'safety-worker.js', 'manifest.webmanifest']);

function setCacheHeaders(res: Response, path: string): void {
  const name = basename(path);
  if (NEVER_CACHED.has(name)) res.setHeader('Cache-Control', 'no-cache');
  else if (HASHED_FILE.test(name)) res.setHeader('Cache-Control', 'public, max-age=31536000, immutable');
  else res.setHeader('Cache-Control', 'public, max-age=3600');
}

/** Serves the production build of the app with an index.html fallback for client-side routes. */
export function appFiles(appDir: string): Router {
  const router = Router();
  const indexHtml = join(appDir, 'index.html');
  if (!existsSync(indexHtml)) {
    router.get('/', (_req, res) => {
      res
        .status(503)
        .type('text')
        .send('The Benchtide app has not been built yet. Run `npm start`, or `npm run build` and restart.');
    });
    return router;
  }
  router.use(express.static(appDir, { index: false, setHeaders: setCacheHeaders }));
  router.get(/.*/, (req, res, next) => {
    // Only page navigations fall back to the app; a missing asset stays a 404.
    if (!req.accepts('html') || /\.[a-z0-9]+$/i.test(req.path)) return next();
    res.setHeader('Cache-Control', 'no-cache');
    res.sendFile(indexHtml);
  });
  return router;
}
