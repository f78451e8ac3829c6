import type { ErrorRequestHandler } from 'express';
import { DB_RETRY_AFTER_S, isDatabaseUnavailable } from '../db-health';
import { logger } from '../logger';
import { AppError } from './errors';

/** The one JSON error middleware: `{ error: { code, message, fields? } }`, never a stack trace. */
export const errorHandler: ErrorRequestHandler = (error, req, res, next) => {
  // express-session may report a failed save after the answer went out; Express then ends the socket
  if (res.headersSent) {
    logger.warn({ err: error, reqId: req.id, url: req.originalUrl }, 'error after the answer was sent');
    next(error);
    return;
  }
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
  // the database is away (restart, failover): a passing state the client waits out, not a bug.
  // This covers the session middleware too, whose store lookup fails the same way
  if (isDatabaseUnavailable(error)) {
    logger.warn({ err: error, reqId: req.id, url: req.originalUrl }, 'database unavailable');
    res.setHeader('Retry-After', String(DB_RETRY_AFTER_S));
    res.status(503).json({
      error: { code: 'database_unavailable', message: 'The database is not reachable right now; try again in a few seconds' },
    });
    return;
  }
  logger.error({ err: error, reqId: req.id, url: req.originalUrl }, 'unhandled error');
  res.status(500).json({ error: { code: 'internal', message: 'Something went wrong on the server' } });
};
