import { Router, type RequestHandler } from 'express';
import type { DataSource } from 'typeorm';
import { MAX_PUSH_MUTATIONS, pullBody, pushEnvelope } from '../../shared/sync';
import { requireUser } from '../auth/session';
import { AppError } from '../http/errors';
import { handle } from '../http/handle';
import * as sync from '../sync/push';

/** Too many mutations is the one push failure the client fixes by itself: it sends smaller batches. */
const limitMutations: RequestHandler = (req, _res, next) => {
  const mutations = (req.body as { mutations?: unknown } | undefined)?.mutations;
  if (Array.isArray(mutations) && mutations.length > MAX_PUSH_MUTATIONS) {
    const message = `At most ${MAX_PUSH_MUTATIONS} mutations per push; this one has ${mutations.length}`;
    next(new AppError(413, 'too_large', message));
    return;
  }
  next();
};

/**
 * `POST /api/sync/push` and `POST /api/sync/pull` (SYNC.md). A push answers 200 with a result per
 * mutation, rejected ones included; only the request as a whole fails with 4xx/5xx.
 */
export function syncRouter(ds: DataSource): Router {
  const router = Router();
  router.use(requireUser(ds));
  router.post(
    '/push',
    limitMutations,
    handle({ body: pushEnvelope }, async ({ body }, req) => sync.push(ds, req.actor, body)),
  );
  router.post(
    '/pull',
    handle({ body: pullBody }, async ({ body }, req) => sync.pull(ds, req.actor, body)),
  );
  return router;
}
