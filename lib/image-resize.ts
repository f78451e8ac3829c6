/**
 * Make a photo from the camera ready to queue, on native: expo-image-manipulator scales the long
 * edge to about PHOTO_LONG_EDGE px and saves JPEG at PHOTO_JPEG_QUALITY; the final file is hashed
 * here (no Web Crypto on Hermes: the plain-JS SHA-256). The web build uses image-resize.web.ts;
 * only the web target is run.
 */
import { File } from 'expo-file-system';
import { ImageManipulator, SaveFormat } from 'expo-image-manipulator';
import type { ImagePickerAsset } from 'expo-image-picker';
import { PHOTO_MAX_BYTES } from '@/shared/records';
import { PHOTO_JPEG_QUALITY, PHOTO_LONG_EDGE, sha256Hex } from './photo-queue';
import { exifTimeMs, scaleToLongEdge, takenAtOf, type PreparedPhoto } from './image-resize-rules';

export type { PreparedPhoto } from './image-resize-rules';

export async function preparePhoto(asset: ImagePickerAsset): Promise<PreparedPhoto> {
  const size = scaleToLongEdge(asset.width, asset.height, PHOTO_LONG_EDGE);
  const context = ImageManipulator.manipulate(asset.uri);
  if (size.scaled) context.resize({ width: size.width, height: size.height });
  const image = await context.renderAsync();
  const saved = await image.saveAsync({ compress: PHOTO_JPEG_QUALITY, format: SaveFormat.JPEG });
  const bytes = await new File(saved.uri).bytes();
  if (bytes.length > PHOTO_MAX_BYTES) throw new Error(`This photo is larger than ${Math.round(PHOTO_MAX_BYTES / 1024 / 1024)} MB`);
  const exif = asset.exif as Record<string, unknown> | null | undefined;
  return {
    source: { uri: saved.uri },
    bytes: bytes.length,
    sha256: await sha256Hex(bytes),
    contentType: 'image/jpeg',
    width: saved.width,
    height: saved.height,
    takenAt: takenAtOf(exifTimeMs(exif?.DateTimeOriginal) ?? Date.now(), Date.now()),
  };
}
