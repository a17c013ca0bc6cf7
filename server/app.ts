import compression from 'compression';
import express, { type Express } from 'express';
import helmet from 'helmet';
import { pinoHttp } from 'pino-http';
import type { ServerConfig } from './config.js';
import { apiNotFound, errorHandler } from './core/error-handler.js';
import type { DatabaseHandle } from './db/database.js';
import { healthRoutes } from './health/health-routes.js';
import { appFiles } from './web/app-files.js';

export const JSON_BODY_LIMIT = '100kb';

export function createApp(config: ServerConfig, database: DatabaseHandle): Express {
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
          'upgrade-insecure-requests': config.production && config.trustProxy ? [] : null,
        },
      },
      strictTransportSecurity: config.production,
    }),
  );
  app.use(compression());

  const api = express.Router();
  api.use(express.json({ limit: JSON_BODY_LIMIT }));
  api.use(healthRoutes(database.pool));
  api.use(apiNotFound);
  app.use('/api', api);

  app.use(appFiles(config.appDir));
  app.use(errorHandler);
  return app;
}
