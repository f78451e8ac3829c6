/**
 * Make a picked photo ready to queue, in the browser: decode it, scale the long edge down to about
 * PHOTO_LONG_EDGE px on a canvas and encode JPEG at PHOTO_JPEG_QUALITY, then hash the final bytes.
 * A JPEG already small enough is kept as it is (its metadata too: the server removes the location
 * unless the organisation keeps it). A file the browser cannot decode (HEIC in Chromium) is kept
 * as it is when the server takes its type.
 */
import type { ImagePickerAsset } from 'expo-image-picker';
import { PHOTO_MAX_BYTES, PHOTO_TYPES, type PhotoType } from '@/shared/records';
import { PHOTO_JPEG_QUALITY, PHOTO_LONG_EDGE, sha256Hex } from './photo-queue';
import { scaleToLongEdge, takenAtOf, type PreparedPhoto } from './image-resize-rules';

export type { PreparedPhoto } from './image-resize-rules';

/** A JPEG within the size limit and at most this large is not re-encoded. */
const KEEP_JPEG_UP_TO_BYTES = 2 * 1024 * 1024;

async function decode(file: Blob): Promise<ImageBitmap | null> {
  try {
    return await createImageBitmap(file, { imageOrientation: 'from-image' });
  } catch {
    return null;
  }
}

function toJpeg(image: ImageBitmap, width: number, height: number): Promise<Blob> {
  const canvas = document.createElement('canvas');
  canvas.width = width;
  canvas.height = height;
  const context = canvas.getContext('2d');
  if (!context) throw new Error('This browser cannot resize photos');
  // JPEG has no transparency: a PNG's clear parts become white, not black
  context.fillStyle = '#FFFFFF';
  context.fillRect(0, 0, width, height);
  context.imageSmoothingQuality = 'high';
  context.drawImage(image, 0, 0, width, height);
  return new Promise((resolve, reject) =>
    canvas.toBlob((blob) => (blob ? resolve(blob) : reject(new Error('The photo could not be encoded'))), 'image/jpeg', PHOTO_JPEG_QUALITY),
  );
}

export async function preparePhoto(asset: ImagePickerAsset): Promise<PreparedPhoto> {
  const file = asset.file;
  if (!file) throw new Error('The picked file could not be read');
  const takenAt = takenAtOf(file.lastModified, Date.now());
  const declared = (PHOTO_TYPES as readonly string[]).includes(file.type) ? (file.type as PhotoType) : null;
  const image = await decode(file);
  try {
    let blob: Blob;
    let contentType: PhotoType;
    let width: number | null = null;
    let height: number | null = null;
    if (!image) {
      if (!declared) throw new Error(`${file.name || 'This file'} is not a photo this app can read (JPEG, PNG, WebP or HEIC)`);
      blob = file;
      contentType = declared;
      width = asset.width || null;
      height = asset.height || null;
    } else {
      const size = scaleToLongEdge(image.width, image.height, PHOTO_LONG_EDGE);
      const keep = declared === 'image/jpeg' && !size.scaled && file.size <= KEEP_JPEG_UP_TO_BYTES;
      blob = keep ? file : await toJpeg(image, size.width, size.height);
      contentType = 'image/jpeg';
      width = size.width;
      height = size.height;
    }
    if (blob.size > PHOTO_MAX_BYTES) throw new Error(`This photo is larger than ${Math.round(PHOTO_MAX_BYTES / 1024 / 1024)} MB`);
    const bytes = new Uint8Array(await blob.arrayBuffer());
    // a Blob of its own (not the picked File): IndexedDB keeps its bytes, not a handle to the file
    const kept = new Blob([bytes], { type: contentType });
    return { source: { blob: kept }, bytes: bytes.length, sha256: await sha256Hex(bytes), contentType, width, height, takenAt };
  } finally {
    image?.close();
    if (asset.uri.startsWith('blob:')) URL.revokeObjectURL(asset.uri);
  }
}
