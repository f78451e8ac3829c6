/**
 * The bytes of a photo (SYNC.md, "Photos"). The row arrives through the sync push with the hash,
 * size and type the device recorded; `PUT /api/photos/:id` then brings the bytes. The server
 * checks them against the row, removes location metadata unless the organisation keeps it, makes
 * a thumbnail, stores both (photo-store.ts) and sets `uploaded`, which reaches devices by pull.
 *
 * The rules, in the order they are applied:
 * - not visible to the user (another organisation, an owner's building not granted) → 404;
 *   owners may look but not upload → 403;
 * - the hash in `x-content-sha256` is not the row's → 409 (SYNC.md: a photo's bytes never change);
 *   it is, and the photo is already uploaded → 200, nothing done (a retry after a lost answer).
 *   Both are decided from the header and the row, before the body is read;
 * - no file or 0 bytes → 400; more than PHOTO_MAX_BYTES → 413 (multer, in the route);
 *   the bytes' hash is not the header's (damaged on the way) → 400;
 * - the bytes decide the type, never a file name or a part's Content-Type: anything but JPEG,
 *   PNG, WebP or HEIC → 415; a real image of another type than the row records → 415, because the
 *   row (synced to every device) would then describe a file we do not have. So a JPEG uploaded
 *   as `x.txt` is accepted when its row says image/jpeg;
 * - more than PHOTO_MAX_PIXELS (photo-image.ts, read from the header) → 413 too_many_pixels;
 * - a file that starts like an image but does not decode → 415.
 * At most MAX_UPLOADS_AT_ONCE uploads per user are in flight in one process (routes/photos.ts);
 * more answer 429 with Retry-After.
 * Nothing is stored unless every check passed. A deleted (tombstoned) photo still takes its bytes,
 * so that a restore brings it back whole; it is not served while deleted.
 */
import { createHash } from 'node:crypto';
import type { Readable } from 'node:stream';
import type { DataSource, EntityManager } from 'typeorm';
import type { Role } from '../../shared/domain';
import { DEFAULT_SETTINGS } from '../../shared/records';
import { roleForBuilding, type Actor } from '../auth/access';
import { Building, Organisation, Photo } from '../entities';
import { AppError, ForbiddenError, NotFoundError, ValidationError } from '../http/errors';
import { logger } from '../logger';
import { serverStamp } from './clock';
import { makeThumbnail, sniffPhotoType, stripLocation, THUMB_TYPE, TYPE_NAMES } from './photo-image';
import type { PhotoStore, PhotoVariant } from './photo-store';

const UPLOADERS: readonly Role[] = ['admin', 'electrician', 'inspector'];

/** The hex SHA-256 of some bytes, as devices compute it. */
export function sha256Hex(bytes: Buffer): string {
  return createHash('sha256').update(bytes).digest('hex');
}

/** The `x-content-sha256` header, lower-cased, or a 400 naming it. */
export function parseShaHeader(value: string | string[] | undefined): string {
  const text = Array.isArray(value) ? value[0] : value;
  if (!text || !/^[0-9a-fA-F]{64}$/.test(text.trim())) {
    throw new ValidationError(
      { 'x-content-sha256': 'the hex SHA-256 of the photo' },
      'Send the SHA-256 of the photo in the x-content-sha256 header',
    );
  }
  return text.trim().toLowerCase();
}

async function visiblePhoto(em: EntityManager, actor: Actor, photoId: string) {
  const photo = await em.findOne(Photo, { where: { id: photoId } });
  const building = photo && (await em.findOne(Building, { where: { id: photo.buildingId } }));
  const role = building && roleForBuilding(actor, building);
  if (!photo || !building || !role) throw new NotFoundError('Photo');
  return { photo, building, role };
}

/** What the upload answers. */
export interface UploadResult {
  photoId: string;
  uploaded: true;
  /** true when these bytes were already stored: nothing was done */
  unchanged: boolean;
  /** the photo row's version after the upload */
  version: number;
  /** false for HEIC, which the server cannot decode (GET …/thumb answers 404 no_thumbnail) */
  thumbnail: boolean;
}

/**
 * The checks that need only the row and the header, made before the body is read: visibility,
 * role, and whether these bytes are this photo's. Answers the no-op result for a photo already
 * uploaded with this hash, else null (go on and read the body).
 */
export async function checkUploadTarget(
  em: EntityManager,
  actor: Actor,
  photoId: string,
  sha256: string,
): Promise<UploadResult | null> {
  return (await uploadTarget(em, actor, photoId, sha256)).done;
}

async function uploadTarget(em: EntityManager, actor: Actor, photoId: string, sha256: string) {
  const { photo, building, role } = await visiblePhoto(em, actor, photoId);
  if (!UPLOADERS.includes(role)) throw new ForbiddenError('Owners can look at photos but not upload them');
  if (sha256 !== photo.sha256) {
    throw new AppError(
      409,
      'photo_conflict',
      photo.uploaded
        ? 'This photo was already uploaded with other bytes; a photo never changes (take a new one instead)'
        : 'These bytes are not the photo recorded: their SHA-256 differs from the one the device recorded',
    );
  }
  const done: UploadResult | null = photo.uploaded
    ? {
        photoId,
        uploaded: true,
        unchanged: true,
        version: Number(photo.version),
        thumbnail: photo.contentType !== 'image/heic',
      }
    : null;
  return { photo, building, done };
}

/**
 * Check the bytes, prepare what is kept (location stripped unless the organisation keeps it, and
 * the thumbnail), store it, then mark the row uploaded under the building's lock with a new
 * version. The route calls checkUploadTarget before reading the body; this repeats it.
 */
export async function uploadPhoto(
  ds: DataSource,
  store: PhotoStore,
  actor: Actor,
  photoId: string,
  sha256: string,
  bytes: Buffer | undefined,
): Promise<UploadResult> {
  const { photo, building, done } = await uploadTarget(ds.manager, actor, photoId, sha256);
  if (done) return done;
  if (!bytes) throw new ValidationError({ photo: 'attach the photo' }, 'Send the photo as the form field "photo"');
  if (bytes.length === 0) throw new ValidationError({ photo: 'the file is empty' }, 'The photo is empty (0 bytes)');
  if (sha256Hex(bytes) !== sha256) {
    throw new AppError(
      400,
      'checksum_mismatch',
      'The bytes received do not match x-content-sha256 (damaged on the way?); send them again',
    );
  }
  // after the hash: a transfer cut short is a checksum_mismatch the device retries; these are the
  // photo's bytes, and its row (synced to every device) records another size
  if (bytes.length !== photo.bytes) {
    throw new ValidationError(
      { bytes: `the photo's record says ${photo.bytes} bytes; ${bytes.length} were received` },
      'The photo is not the size its record declares',
    );
  }

  const declared = photo.contentType;
  const sniffed = await sniffPhotoType(bytes);
  if (!sniffed.type) {
    throw new AppError(
      415,
      'unsupported_type',
      `Only JPEG, PNG, WebP and HEIC photos are accepted; this file is ${sniffed.found}, whatever its name says`,
    );
  }
  if (sniffed.type !== declared) {
    throw new AppError(
      415,
      'type_mismatch',
      `The photo is recorded as ${TYPE_NAMES[declared]} but the file is a ${TYPE_NAMES[sniffed.type]} image`,
    );
  }

  const organisation = await ds.manager.findOne(Organisation, { where: { id: building.organisationId } });
  const keepLocation = organisation?.settings?.keepPhotoLocation ?? DEFAULT_SETTINGS.keepPhotoLocation;
  const thumbnail = await makeThumbnail(bytes, declared);
  const kept = keepLocation ? bytes : await stripLocation(bytes, declared);

  await store.put(photoId, 'original', kept, declared, {
    'upload-sha256': sha256,
    location: keepLocation ? 'kept' : 'removed',
  });
  if (thumbnail) await store.put(photoId, 'thumb', thumbnail, THUMB_TYPE);

  return ds.transaction(async (em) => {
    // the building's lock first, as every writer takes it (server/sync: push, kinds): then the photo
    const locked: unknown[] = await em.query('SELECT id FROM building WHERE id = $1 FOR UPDATE', [photo.buildingId]);
    if (locked.length === 0) throw new NotFoundError('Photo');
    const [current]: { uploaded: boolean; version: string }[] = await em.query(
      'SELECT uploaded, version FROM photo WHERE id = $1 FOR UPDATE',
      [photoId],
    );
    const result = { photoId, uploaded: true as const, thumbnail: thumbnail !== null };
    // a concurrent upload of the same bytes got here first (the objects it wrote are these bytes too)
    if (current.uploaded) return { ...result, unchanged: true, version: Number(current.version) };

    // TypeORM answers an UPDATE … RETURNING on PostgreSQL as [rows, affectedCount]
    const [rows]: [{ version: string }[], number] = await em.query(
      'UPDATE building SET version = version + 1 WHERE id = $1 RETURNING version',
      [photo.buildingId],
    );
    const version = Number(rows[0].version);
    const hlc = serverStamp();
    await em.query(
      `UPDATE photo SET uploaded = true, version = $2, updated_at = $3, updated_by = $4,
              field_meta = field_meta || jsonb_build_object('uploaded', $5::jsonb)
        WHERE id = $1`,
      [photoId, version, hlc, actor.userId, JSON.stringify({ hlc, version, device: 'server', user: actor.userId })],
    );
    return { ...result, unchanged: false, version };
  });
}

/** A stored variant, ready to stream. */
export interface PhotoDownload {
  body: Readable;
  contentType: string;
  bytes: number;
}

/**
 * The stored original or thumbnail for a user who may see the photo's building. Not visible or
 * deleted → 404 not_found; not uploaded yet → 404 not_uploaded; a HEIC's thumb → 404 no_thumbnail.
 */
export async function openPhoto(
  ds: DataSource,
  store: PhotoStore,
  actor: Actor,
  photoId: string,
  variant: PhotoVariant,
): Promise<PhotoDownload> {
  const { photo, building } = await visiblePhoto(ds.manager, actor, photoId);
  if (photo.deletedAt || building.deletedAt) throw new NotFoundError('Photo');
  if (!photo.uploaded) throw new AppError(404, 'not_uploaded', 'The photo has not reached the server yet');
  const stored = await store.get(photoId, variant);
  if (stored) return stored;
  if (variant === 'thumb') {
    const why = photo.contentType === 'image/heic' ? ': the server cannot decode HEIC photos' : '';
    throw new AppError(404, 'no_thumbnail', `No thumbnail for this photo${why}`);
  }
  logger.error({ photoId }, 'a photo marked uploaded has no stored original');
  throw new AppError(404, 'not_found', 'The photo is recorded as uploaded but its bytes are missing from storage');
}
