import { Router } from 'express';
import { openApiDocument } from './openapi-document.js';
import { referencePage } from './reference-page.js';

/** The API described, for programs (OpenAPI 3) and for people (a plain page); public, like the API's shape. */
export function openApiRoutes(): Router {
  const router = Router();
  const document = openApiDocument();
  const page = referencePage(document);

  router.get('/openapi.json', (_req, res) => {
    res.set('Cache-Control', 'no-cache').json(document);
  });

  router.get('/reference', (_req, res) => {
    res.set('Cache-Control', 'no-cache').type('html').send(page);
  });

  return router;
}
