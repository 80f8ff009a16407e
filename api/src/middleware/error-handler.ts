import type { ErrorRequestHandler, RequestHandler } from 'express';
import { InvalidInputError } from '@midgray/shared';
import { AppError } from '../errors.ts';

/** 404 for any /api path no route answered. */
export const apiNotFound: RequestHandler = (req, res) => {
  res.status(404).json({ error: { code: 'not_found', message: `No API route for ${req.method} ${req.path}` } });
};

/** Turns every thrown error into `{ error: { code, message, details? } }`; hides internals on 5xx. */
export const errorHandler: ErrorRequestHandler = (err, req, res, _next) => {
  if (res.headersSent) return;
  if (err instanceof AppError) {
    res.status(err.status).json({ error: { code: err.code, message: err.message, details: err.details } });
    return;
  }
  if (err instanceof InvalidInputError) {
    res.status(422).json({ error: { code: 'invalid_input', message: err.message, details: err.field ? { field: err.field } : undefined } });
    return;
  }
  // body-parser errors carry a `type` and a status
  if (err?.type === 'entity.parse.failed') {
    res.status(400).json({ error: { code: 'bad_request', message: 'The request body is not valid JSON' } });
    return;
  }
  if (err?.type === 'entity.too.large') {
    res.status(413).json({ error: { code: 'payload_too_large', message: `The request body is larger than the ${err.limit} bytes allowed` } });
    return;
  }
  if (err?.code === 'EBADCSRFTOKEN' || err?.message === 'invalid csrf token') {
    res.status(403).json({ error: { code: 'csrf_failed', message: 'The form is out of date or came from another site: reload the page and try again' } });
    return;
  }
  if (typeof err?.status === 'number' && err.status >= 400 && err.status < 500) {
    res.status(err.status).json({ error: { code: 'bad_request', message: err.message ?? 'Bad request' } });
    return;
  }
  // Sequelize optimistic/constraint errors that escaped a service
  if (err?.name === 'SequelizeUniqueConstraintError') {
    res.status(409).json({ error: { code: 'conflict', message: 'That record already exists' } });
    return;
  }
  console.error(`[api] ${req.method} ${req.originalUrl} failed:`, err);
  res.status(500).json({ error: { code: 'internal', message: 'Something went wrong on our side; the error was logged' } });
};
