import compression from 'compression';
import express, { type Express } from 'express';
import helmet from 'helmet';
import { pinoHttp } from 'pino-http';
import { accountRoutes } from './auth/account-routes.js';
import { authRoutes } from './auth/auth-routes.js';
import { readSession } from './auth/session-middleware.js';
import type { ServerContext } from './context.js';
import { apiNotFound, errorHandler } from './core/error-handler.js';
import { sameOriginOnly } from './core/same-origin.js';
import { healthRoutes } from './health/health-routes.js';
import { openApiRoutes } from './openapi/openapi-routes.js';
import { buildRoutes } from './builds/build-routes.js';
import { costRoutes } from './costs/cost-routes.js';
import { photoRoutes } from './photos/photo-routes.js';
import { pourRoutes } from './pours/pour-routes.js';
import { shelfRoutes } from './shelf/shelf-routes.js';
import { reminderRoutes } from './reminders/reminder-routes.js';
import { syncRoutes } from './sync/sync-routes.js';
import { workshopRoutes } from './workshops/workshop-routes.js';
import { appFiles } from './web/app-files.js';

export const JSON_BODY_LIMIT = '100kb';

export function createApp(ctx: ServerContext): Express {
  const { config } = ctx;
  const app = express();
  app.disable('x-powered-by');
  app.set('trust proxy', config.trustProxy);
  app.use(
    pinoHttp({
      level: config.logLevel,
      // One short line a request: no headers, so no cookies or tokens end up in the logs.
      serializers: {
        req: (req: { method: string; url: string }) => ({ method: req.method, url: req.url }),
        res: (res: { statusCode: number }) => ({ statusCode: res.statusCode }),
      },
    }),
  );
  app.use(
    helmet({
      contentSecurityPolicy: {
        directives: {
          // Angular Material sets element styles at run time.
          'style-src': ["'self'", "'unsafe-inline'"],
          'img-src': ["'self'", 'data:', 'blob:'],
          'font-src': ["'self'"],
          'worker-src': ["'self'"],
          'manifest-src': ["'self'"],
          'connect-src': ["'self'"],
          'upgrade-insecure-requests': config.production && config.trustProxy > 0 ? [] : null,
        },
      },
      strictTransportSecurity: config.production,
    }),
  );
  app.use(compression());

  const api = express.Router();
  api.use(sameOriginOnly(config.publicOrigin));
  api.use(express.json({ limit: JSON_BODY_LIMIT }));
  api.use(healthRoutes(ctx.pool));
  api.use(openApiRoutes());
  api.use(readSession(ctx.sessions));
  api.use(authRoutes(ctx));
  api.use(accountRoutes(ctx));
  api.use(workshopRoutes(ctx));
  api.use(buildRoutes(ctx));
  api.use(shelfRoutes(ctx));
  api.use(pourRoutes(ctx));
  api.use(photoRoutes(ctx));
  api.use(costRoutes(ctx));
  api.use(syncRoutes(ctx));
  api.use(reminderRoutes(ctx));
  api.use(apiNotFound);
  app.use('/api', api);

  app.use(appFiles(config.appDir));
  app.use(errorHandler);
  return app;
}
