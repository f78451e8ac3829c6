/**
 * What the server does to a photo's bytes before they are stored: tell the real type from the bytes
 * (file-type), remove location metadata (ExifTool, through exiftool-vendored) and make a thumbnail
 * (sharp). Nothing here touches the database or object storage.
 *
 * HEIC: the sharp build from npm reads a HEIC file's header but cannot decode its HEVC pixels
 * ("Support for this compression format has not been built in: HEVC"), so a HEIC photo is stored
 * with its location removed by ExifTool, and it has no thumbnail.
 */
import { randomUUID } from 'node:crypto';
import fs from 'node:fs/promises';
import os from 'node:os';
import path from 'node:path';
import { ExifTool } from 'exiftool-vendored';
import { fileTypeFromBuffer } from 'file-type';
import sharp from 'sharp';
import type { PhotoType } from '../../shared/records';
import { AppError } from '../http/errors';
import { logger } from '../logger';

/** Long edge of a thumbnail, px: sharp on a phone's list row and small enough to pull on 3G. */
export const THUMB_LONG_EDGE_PX = 320;
export const THUMB_TYPE = 'image/webp';

const EXTENSIONS: Record<PhotoType, string> = {
  'image/jpeg': 'jpg',
  'image/png': 'png',
  'image/webp': 'webp',
  'image/heic': 'heic',
};

/** What file-type may call a type we accept; a HEIC with the generic HEIF brand is still HEIC. */
const SNIFFED: Record<string, PhotoType> = {
  'image/jpeg': 'image/jpeg',
  'image/png': 'image/png',
  'image/webp': 'image/webp',
  'image/heic': 'image/heic',
  'image/heif': 'image/heic',
};

/** Words for the types in messages. */
export const TYPE_NAMES: Record<PhotoType, string> = {
  'image/jpeg': 'JPEG',
  'image/png': 'PNG',
  'image/webp': 'WebP',
  'image/heic': 'HEIC',
};

/**
 * The photo type the bytes really are (magic numbers, not a name or a header), or null for anything
 * we do not take; `found` says what the bytes are, for the message.
 */
export async function sniffPhotoType(bytes: Buffer): Promise<{ type: PhotoType | null; found: string }> {
  const found = await fileTypeFromBuffer(bytes);
  if (!found) return { type: null, found: 'not a picture (text, or no format we know)' };
  return { type: SNIFFED[found.mime] ?? null, found: `of type ${found.mime}` };
}

/**
 * Every tag that says where a photo was taken: the EXIF GPS directory, its XMP copies, and the
 * IPTC / XMP place names. ExifTool edits these in place, so the pixels (and a thermal camera's
 * own data segments) are kept exactly as sent.
 */
const LOCATION_TAGS = [
  '-gps:all=',
  '-xmp:gps*=',
  '-xmp-iptcExt:LocationCreated=',
  '-xmp-iptcExt:LocationShown=',
  '-xmp-iptcCore:Location=',
  '-xmp-iptcCore:CountryCode=',
  '-xmp-photoshop:City=',
  '-xmp-photoshop:State=',
  '-xmp-photoshop:Country=',
  '-iptc:City=',
  '-iptc:Sub-location=',
  '-iptc:Province-State=',
  '-iptc:Country-PrimaryLocationName=',
  '-iptc:Country-PrimaryLocationCode=',
];

let exiftool: ExifTool | null = null;

/** One long-lived ExifTool process (it takes ≈ 0.4 s to start), made on first use. */
function tool(): ExifTool {
  exiftool ??= new ExifTool({ maxProcs: 1 });
  return exiftool;
}

/**
 * The photo without location metadata; everything else (orientation, time, camera) is kept.
 * ExifTool works on files: the bytes pass through a private temporary folder that is removed after.
 */
export async function stripLocation(bytes: Buffer, type: PhotoType): Promise<Buffer> {
  const dir = await fs.mkdtemp(path.join(os.tmpdir(), 'ampwright-photo-'));
  try {
    const file = path.join(dir, `${randomUUID()}.${EXTENSIONS[type]}`);
    await fs.writeFile(file, bytes);
    try {
      // -m: minor problems (odd maker notes, common in camera files) must not block the edit
      await tool().write(file, {}, { writeArgs: ['-overwrite_original', ...LOCATION_TAGS], ignoreMinorErrors: true });
    } catch (error) {
      // ExifTool names the file when the file is the problem; anything else (no perl, a crash)
      // is the server's and stays a 500
      if (!String((error as Error)?.message).includes(file)) throw error;
      logger.warn({ err: error, type }, 'location could not be removed from a photo');
      throw new AppError(
        415,
        'unreadable_photo',
        `The ${TYPE_NAMES[type]} file's metadata could not be read, so its location could not be removed`,
      );
    }
    return await fs.readFile(file);
  } finally {
    await fs.rm(dir, { recursive: true, force: true });
  }
}

/**
 * The most pixels a photo may have: 50 MP is more than any phone camera's full frame (the app
 * itself sends a long edge of 2000 px) and bounds what decoding one upload may cost: about
 * 200 MB of RGBA, where sharp's own default (268 MP) would allow a gigabyte.
 */
export const PHOTO_MAX_PIXELS = 50_000_000;

/**
 * A WebP thumbnail, upright (EXIF orientation applied) with a long edge of THUMB_LONG_EDGE_PX and
 * no metadata at all; null for HEIC, which this sharp cannot decode. The header is read first:
 * more than PHOTO_MAX_PIXELS is a 413 before a pixel is decoded. Decoding the whole picture
 * here is also the check that a JPEG/PNG/WebP is an image and not just its first bytes.
 */
export async function makeThumbnail(bytes: Buffer, type: PhotoType): Promise<Buffer | null> {
  const unreadable = () =>
    new AppError(415, 'unreadable_photo', `The file starts like a ${TYPE_NAMES[type]} image but could not be decoded`);
  // the container must at least be readable, HEIC included
  const header = await sharp(bytes).metadata().catch(() => null);
  if (!header) throw unreadable();
  if (header.width && header.height && header.width * header.height > PHOTO_MAX_PIXELS) {
    const mp = ((header.width * header.height) / 1e6).toFixed(1);
    throw new AppError(
      413,
      'too_many_pixels',
      `A photo may have at most ${PHOTO_MAX_PIXELS / 1e6} megapixels; this one is ${header.width} × ${header.height} (${mp} MP)`,
    );
  }
  if (type === 'image/heic') return null;
  try {
    return await sharp(bytes, { failOn: 'error', limitInputPixels: PHOTO_MAX_PIXELS })
      .rotate()
      .resize({ width: THUMB_LONG_EDGE_PX, height: THUMB_LONG_EDGE_PX, fit: 'inside', withoutEnlargement: true })
      .webp({ quality: 72 })
      .toBuffer();
  } catch {
    throw unreadable();
  }
}

/** End the ExifTool process (the app's closeResources calls this; it restarts on next use). */
export async function closePhotoTools(): Promise<void> {
  const running = exiftool;
  exiftool = null;
  if (running) await running.end();
}
