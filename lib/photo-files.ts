/**
 * Photo bytes on native: files under the document directory (the cache directory can be purged),
 * `photos/<userId>/<photoId>.<ext>` with a `<photoId>.json` beside it holding what the queue needs.
 * Never base64 in AsyncStorage. The web build uses photo-files.web.ts; only the web target is run.
 */
import { Directory, File, Paths } from 'expo-file-system';
import { Image } from 'react-native';
import type { LocalPhoto, PhotoFileStore, PhotoSource, UploadPart } from './photo-queue';
import { photoUrl } from './photo-queue';

const folder = (userId: string) => new Directory(Paths.document, 'photos', userId);
const ext = (type: string) => (type === 'image/png' ? 'png' : type === 'image/webp' ? 'webp' : type === 'image/heic' ? 'heic' : 'jpg');
const bytesFile = (userId: string, photo: Pick<LocalPhoto, 'id' | 'contentType'>) =>
  new File(folder(userId), `${photo.id}.${ext(photo.contentType)}`);
const metaFile = (userId: string, id: string) => new File(folder(userId), `${id}.json`);

async function readMeta(userId: string, id: string): Promise<LocalPhoto | null> {
  const file = metaFile(userId, id);
  if (!file.exists) return null;
  try {
    return JSON.parse(await file.text()) as LocalPhoto;
  } catch {
    return null;
  }
}

export const photoFiles: PhotoFileStore = {
  async list(userId) {
    const dir = folder(userId);
    if (!dir.exists) return [];
    const out: { photo: LocalPhoto; uri: string }[] = [];
    for (const entry of dir.list()) {
      if (!(entry instanceof File) || !entry.name.endsWith('.json')) continue;
      const photo = await readMeta(userId, entry.name.replace(/\.json$/, ''));
      const bytes = photo && bytesFile(userId, photo);
      if (photo && bytes?.exists) out.push({ photo, uri: bytes.uri });
    }
    return out;
  },
  async put(userId, photo, source: PhotoSource) {
    if (!('uri' in source)) throw new Error('a photo on native is a file');
    const dir = folder(userId);
    if (!dir.exists) dir.create({ intermediates: true, idempotent: true });
    const target = bytesFile(userId, photo);
    // the picker's and the resizer's files live in the cache directory, which the system may purge
    new File(source.uri).copySync(target, { overwrite: true });
    // the metadata last: a photo is only listed once both are written
    metaFile(userId, photo.id).write(JSON.stringify(photo));
    return target.uri;
  },
  async update(userId, id, change) {
    const photo = await readMeta(userId, id);
    if (photo) metaFile(userId, id).write(JSON.stringify({ ...photo, ...change }));
  },
  async part(userId, id): Promise<UploadPart | null> {
    const photo = await readMeta(userId, id);
    const file = photo && bytesFile(userId, photo);
    return photo && file?.exists ? { uri: file.uri, name: file.name, type: photo.contentType } : null;
  },
  async remove(userId, id) {
    const photo = await readMeta(userId, id);
    if (photo) {
      const file = bytesFile(userId, photo);
      if (file.exists) file.delete();
    }
    const meta = metaFile(userId, id);
    if (meta.exists) meta.delete();
  },
};

export async function removeAllPhotoFiles(userId: string): Promise<void> {
  const dir = folder(userId);
  if (dir.exists) dir.delete();
}

/** Native storage is not evicted like a browser's: nothing to ask. */
export function askToKeepStorage(): void {}

/** Fetch the server's thumbnail into the image cache (the session cookie goes with it). */
export async function keepServerThumbnail(photoId: string): Promise<boolean> {
  return Image.prefetch(photoUrl(photoId, 'thumb')).catch(() => false);
}
