/**
 * Photo bytes on the web: Blobs in an IndexedDB store of their own (not the persisted cache's,
 * whose values are one JSON string; never base64), keyed `<userId>/<photoId>`, so two people
 * sharing a browser never see or send each other's photos.
 */
import { createStore, del, get, getMany, keys, set, type UseStore } from 'idb-keyval';
import type { LocalPhoto, PhotoFileStore, PhotoSource, UploadPart } from './photo-queue';
import { photoUrl } from './photo-queue';

interface Kept {
  photo: LocalPhoto;
  blob: Blob;
}

let store: UseStore | null | undefined;
function db(): UseStore | null {
  if (store === undefined) store = typeof indexedDB === 'undefined' ? null : createStore('ampwright-photos', 'blobs');
  return store;
}

const keyOf = (userId: string, id: string) => `${userId}/${id}`;
/** one object URL per photo for the life of the page */
const urls = new Map<string, string>();

function urlFor(id: string, blob: Blob): string {
  let url = urls.get(id);
  if (!url) {
    url = URL.createObjectURL(blob);
    urls.set(id, url);
  }
  return url;
}

function extension(type: string) {
  return type === 'image/png' ? 'png' : type === 'image/webp' ? 'webp' : type === 'image/heic' ? 'heic' : 'jpg';
}

export const photoFiles: PhotoFileStore = {
  async list(userId) {
    const s = db();
    if (!s) return [];
    const mine = (await keys<string>(s)).filter((k) => String(k).startsWith(`${userId}/`));
    const kept = await getMany<Kept | undefined>(mine, s);
    return kept.filter((k): k is Kept => !!k?.blob).map((k) => ({ photo: k.photo, uri: urlFor(k.photo.id, k.blob) }));
  },
  async put(userId, photo, source: PhotoSource) {
    const s = db();
    if (!s) throw new Error('This browser cannot keep photos (no IndexedDB): use another browser');
    if (!('blob' in source)) throw new Error('a photo on the web is a Blob');
    await set(keyOf(userId, photo.id), { photo, blob: source.blob } satisfies Kept, s);
    return urlFor(photo.id, source.blob);
  },
  async update(userId, id, change) {
    const s = db();
    if (!s) return;
    const kept = await get<Kept>(keyOf(userId, id), s);
    if (kept) await set(keyOf(userId, id), { ...kept, photo: { ...kept.photo, ...change } }, s);
  },
  async part(userId, id): Promise<UploadPart | null> {
    const s = db();
    const kept = s ? await get<Kept>(keyOf(userId, id), s) : undefined;
    return kept ? { blob: kept.blob, name: `${id}.${extension(kept.photo.contentType)}` } : null;
  },
  async remove(userId, id) {
    const s = db();
    if (s) await del(keyOf(userId, id), s);
    const url = urls.get(id);
    if (url) {
      // an <img> still showing it keeps its decoded copy; the switch to the server's thumbnail follows
      setTimeout(() => URL.revokeObjectURL(url), 5_000);
      urls.delete(id);
    }
  },
};

/** Every photo of this user on the device (signing out for good). */
export async function removeAllPhotoFiles(userId: string): Promise<void> {
  const s = db();
  if (!s) return;
  for (const k of await keys<string>(s)) if (String(k).startsWith(`${userId}/`)) await del(k, s);
}

let askedToKeep = false;
/**
 * Ask the browser once per page to keep this site's storage under pressure (SYNC.md): without it
 * Chromium and Safari may evict IndexedDB, photos waiting for signal included.
 */
export function askToKeepStorage(): void {
  if (askedToKeep || typeof navigator === 'undefined' || !navigator.storage?.persist) return;
  askedToKeep = true;
  void navigator.storage
    .persisted()
    .then((already) => (already ? true : navigator.storage.persist()))
    .catch(() => false);
}

/**
 * Load the server's thumbnail as the strip will, so the browser's HTTP cache holds it (the
 * server sends it `private, immutable`): after that the local bytes may go and the thumbnail still
 * shows offline. Resolves whether it loaded.
 */
export function keepServerThumbnail(photoId: string): Promise<boolean> {
  if (typeof Image === 'undefined') return Promise.resolve(false);
  return new Promise((resolve) => {
    const image = new Image();
    image.onload = () => resolve(image.naturalWidth > 0);
    image.onerror = () => resolve(false);
    image.src = photoUrl(photoId, 'thumb');
  });
}
