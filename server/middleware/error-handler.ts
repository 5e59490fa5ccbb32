import type { ErrorRequestHandler, RequestHandler } from 'express';
import { AppError, NotFoundError } from '../lib/errors';
import { isBadInputValue } from '../lib/pg-errors';

export const notFound: RequestHandler = (req) => {
  throw new NotFoundError(`No such endpoint: ${req.method} ${req.originalUrl.split('?')[0]}`);
};

export const errorHandler: ErrorRequestHandler = (err, req, res, _next) => {
  if (err instanceof AppError) {
    res.status(err.status).json({ error: { code: err.code, message: err.message, ...(err.details && { details: err.details }) } });
    return;
  }
  if (isBadInputValue(err)) {
    req.log?.warn({ err }, 'request value refused by the database');
    res.status(400).json({ error: { code: 'bad_request', message: 'A number in the request is out of range or a value is not valid.' } });
    return;
  }
  // Errors from body parsers and other middleware carry their own status.
  const status = typeof err?.status === 'number' && err.status >= 400 && err.status < 500 ? err.status : 500;
  if (status === 500) req.log?.error({ err }, 'unhandled error');
  const message = status === 500 ? 'Something went wrong on our side. Please try again.' : String(err.message ?? 'Bad request');
  res.status(status).json({ error: { code: status === 500 ? 'internal' : 'bad_request', message } });
};
