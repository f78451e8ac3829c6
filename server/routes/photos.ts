import { pipeline } from 'node:stream/promises';
import { Router, type RequestHandler } from 'express';
import multer from 'multer';
import type { DataSource } from 'typeorm';
import { z } from 'zod';
import { PHOTO_MAX_BYTES } from '../../shared/records';
import { idSchema } from '../../shared/schemas';
import { requireUser } from '../auth/session';
import { AppError, NotFoundError, ValidationError } from '../http/errors';
import { handle } from '../http/handle';
import { logger } from '../logger';
import type { PhotoStore, PhotoVariant } from '../services/photo-store';
import * as photos from '../services/photos';

const photoParams = z.object({ photoId: idSchema });
const MAX_MB = Math.round(PHOTO_MAX_BYTES / 1024 / 1024);
/** uploads one user may have in flight in this process */
export const MAX_UPLOADS_AT_ONCE = 3;
const UPLOAD_RETRY_AFTER_S = 5;

/**
 * `PUT /api/photos/:photoId` (multipart, field `photo`, header `x-content-sha256`) and
 * `GET /api/photos/:photoId` / `GET /api/photos/:photoId/thumb`. The rules are in services/photos.ts.
 */
export function photosRouter(ds: DataSource, store: PhotoStore): Router {
  const router = Router();
  router.use(requireUser(ds));

  // who may upload, and whether these bytes are this photo's, before a byte of the body is read
  const checkTarget: RequestHandler = async (req, res, next) => {
    try {
      const params = photoParams.safeParse(req.params);
      if (!params.success) throw new NotFoundError('Photo');
      const sha256 = photos.parseShaHeader(req.headers['x-content-sha256']);
      const done = await photos.checkUploadTarget(ds.manager, req.actor, params.data.photoId, sha256);
      if (done) {
        res.json(done);
        return;
      }
      next();
    } catch (error) {
      next(error);
    }
  };

  const multipart = multer({
    storage: multer.memoryStorage(),
    limits: { fileSize: PHOTO_MAX_BYTES, files: 1, fields: 10 },
  }).single('photo');
  // multer's own errors in the API's shape; it drains the rest of the body itself
  const receivePhoto: RequestHandler = (req, res, next) => {
    multipart(req, res, (error: unknown) => {
      if (error && req.socket.destroyed) {
        // the device hung up mid-upload (signal lost): no one to answer, and no fault of ours
        logger.info({ reqId: req.id, err: error }, 'photo upload abandoned by the client');
        return;
      }
      if (!(error instanceof multer.MulterError)) return next(error);
      if (error.code === 'LIMIT_FILE_SIZE') {
        return next(new AppError(413, 'too_large', `A photo may be at most ${MAX_MB} MB`));
      }
      next(new ValidationError({ [error.field ?? 'photo']: error.message }, 'Send one photo as the form field "photo"'));
    });
  };

  // each upload holds its body in memory and decodes it: a few at once per user is plenty for the
  // app (it sends one at a time) and keeps one account from filling the server's memory
  const inFlight = new Map<string, number>();
  const uploadSlot: RequestHandler = (req, res, next) => {
    const userId = req.actor.userId;
    const busy = inFlight.get(userId) ?? 0;
    if (busy >= MAX_UPLOADS_AT_ONCE) {
      res.setHeader('Retry-After', String(UPLOAD_RETRY_AFTER_S));
      next(new AppError(429, 'too_many_uploads', `At most ${MAX_UPLOADS_AT_ONCE} photo uploads at once; try again in a few seconds`));
      return;
    }
    inFlight.set(userId, busy + 1);
    // 'close' comes once whether the answer went out or the client went away
    res.once('close', () => {
      const left = (inFlight.get(userId) ?? 1) - 1;
      if (left > 0) inFlight.set(userId, left);
      else inFlight.delete(userId);
    });
    next();
  };

  router.put(
    '/:photoId',
    uploadSlot,
    checkTarget,
    receivePhoto,
    handle({ params: photoParams }, async ({ params }, req) =>
      photos.uploadPhoto(
        ds,
        store,
        req.actor,
        params.photoId,
        photos.parseShaHeader(req.headers['x-content-sha256']),
        req.file?.buffer,
      ),
    ),
  );

  const download = (variant: PhotoVariant) =>
    handle({ params: photoParams }, async ({ params }, req, res) => {
      const photo = await photos.openPhoto(ds, store, req.actor, params.photoId, variant);
      res.status(200);
      res.setHeader('Content-Type', photo.contentType);
      res.setHeader('Content-Length', String(photo.bytes));
      // a photo's bytes never change (another upload is a 409), but they are this user's to see only
      res.setHeader('Cache-Control', 'private, max-age=31536000, immutable');
      try {
        await pipeline(photo.body, res);
      } catch (error) {
        if (!res.headersSent) throw error;
        // the reader hung up. After the last byte that is no failure: a client may close as soon
        // as Content-Length is reached, before the response has finished on this side
        if (!photo.body.readableEnded) {
          logger.warn({ err: error, reqId: req.id, photoId: params.photoId }, 'photo download cut short');
        }
        res.destroy();
      }
    });
  router.get('/:photoId', download('original'));
  router.get('/:photoId/thumb', download('thumb'));

  return router;
}
