import { randomUUID } from 'node:crypto';
import type { RequestHandler } from 'express';
import { logger } from '../logger';

declare module 'express-serve-static-core' {
  interface Request {
    id: string;
  }
}

/** A request id on every request (echoed in `x-request-id`) and one log line per API call. */
export const requestLog: RequestHandler = (req, res, next) => {
  req.id = randomUUID();
  res.setHeader('x-request-id', req.id);
  const started = process.hrtime.bigint();
  res.on('finish', () => {
    if (!req.originalUrl.startsWith('/api/')) return;
    const ms = Number(process.hrtime.bigint() - started) / 1e6;
    logger.info(
      { reqId: req.id, method: req.method, url: req.originalUrl, status: res.statusCode, ms },
      'request',
    );
  });
  next();
};
