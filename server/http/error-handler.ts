import type { ErrorRequestHandler } from 'express';
import { logger } from '../logger';
import { AppError } from './errors';

/** The one JSON error middleware: `{ error: { code, message, fields? } }`, never a stack trace. */
export const errorHandler: ErrorRequestHandler = (error, req, res, _next) => {
  if (error instanceof AppError) {
    res.status(error.status).json({
      error: { code: error.code, message: error.message, ...(error.fields && { fields: error.fields }) },
    });
    return;
  }
  // body-parser errors carry a status and a type
  if (typeof error?.status === 'number' && error.status < 500) {
    const code = error.type === 'entity.too.large' ? 'too_large' : 'bad_request';
    res.status(error.status).json({ error: { code, message: 'The request could not be read' } });
    return;
  }
  logger.error({ err: error, reqId: req.id, url: req.originalUrl }, 'unhandled error');
  res.status(500).json({ error: { code: 'internal', message: 'Something went wrong on the server' } });
};
