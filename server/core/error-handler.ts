import type { ErrorRequestHandler, RequestHandler } from 'express';
import { AppError } from './app-error.js';

interface HttpishError {
  status?: number;
  statusCode?: number;
  type?: string;
  expose?: boolean;
}

/** Errors body-parser and friends raise on bad requests, translated into our own words. */
const REQUEST_ERRORS: Record<string, [string, string]> = {
  'entity.too.large': ['body_too_large', 'The request body is larger than the server accepts.'],
  'entity.parse.failed': ['malformed_json', 'The request body is not valid JSON.'],
  'encoding.unsupported': ['unsupported_encoding', 'The request body has an encoding the server does not accept.'],
  'charset.unsupported': ['unsupported_charset', 'The request body has a character set the server does not accept.'],
};

export const apiNotFound: RequestHandler = (req, _res, next) => {
  next(new AppError(404, 'not_found', `There is no API route ${req.method} ${req.path}.`));
};

export const errorHandler: ErrorRequestHandler = (error: unknown, req, res, next) => {
  // A streamed answer that fails halfway cannot become an error body; Express closes the connection.
  if (res.headersSent) return next(error);
  if (error instanceof AppError) {
    if (error.retryAfterMinutes !== undefined) res.setHeader('Retry-After', String(error.retryAfterMinutes * 60));
    res.status(error.status).json({
      error: {
        code: error.code,
        message: error.message,
        fields: error.fields,
        retryAfterMinutes: error.retryAfterMinutes,
      },
    });
    return;
  }
  const httpish = (error ?? {}) as HttpishError;
  const status = httpish.status ?? httpish.statusCode;
  if (status && status >= 400 && status < 500) {
    const [code, message] = REQUEST_ERRORS[httpish.type ?? ''] ?? [
      'bad_request',
      'The request could not be understood.',
    ];
    res.status(status).json({ error: { code, message } });
    return;
  }
  if (databaseUnavailable(error)) {
    req.log?.warn({ err: error }, 'database unavailable');
    res.setHeader('Retry-After', '5');
    res.status(503).json({
      error: {
        code: 'database_unavailable',
        message: 'The server cannot reach its database for a moment. Nothing was saved; try again shortly.',
      },
    });
    return;
  }
  req.log?.error({ err: error }, 'unhandled error');
  res
    .status(500)
    .json({ error: { code: 'internal', message: 'Something went wrong on the server. Nothing was saved.' } });
};

/** PostgreSQL shutting down or restarting (SQLSTATE classes 57P and 08), or no connection to be had. */
function databaseUnavailable(error: unknown): boolean {
  for (let cause = error, depth = 0; cause instanceof Error && depth < 5; depth += 1) {
    const code = (cause as { code?: unknown }).code;
    if (typeof code === 'string' && (/^57P0[123]$/.test(code) || code.startsWith('08') || code === 'ECONNREFUSED')) {
      return true;
    }
    if (/Connection terminated|timeout exceeded when trying to connect/.test(cause.message)) return true;
    cause = cause.cause;
  }
  return false;
}
