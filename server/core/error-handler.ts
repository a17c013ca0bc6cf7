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
  req.log?.error({ err: error }, 'unhandled error');
  res
    .status(500)
    .json({ error: { code: 'internal', message: 'Something went wrong on the server. Nothing was saved.' } });
};
