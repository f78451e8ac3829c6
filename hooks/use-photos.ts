/**
 * Photos: a parent's photos from the replica with how each stands (on this device / uploading /
 * synced / refused), adding photos (pick → resize → keep the bytes → queue the row), removing one,
 * and the photos still waiting on this device. The upload loop itself is lib/photo-queue.ts; this
 * file wires it to the query client, the outbox and the signal, once per signed-in user.
 */
import { onlineManager, useQuery, useQueryClient, type QueryClient } from '@tanstack/react-query';
import * as ImagePicker from 'expo-image-picker';
import { useCallback, useContext, useEffect, useState, useSyncExternalStore } from 'react';
import { Platform } from 'react-native';
import { uuidv7 } from 'uuidv7';
import { preparePhoto } from '@/lib/image-resize';
import { askToKeepStorage, keepServerThumbnail, photoFiles, removeAllPhotoFiles } from '@/lib/photo-files';
import {
  describePhase,
  NEW_ATTEMPT,
  PhotoUploader,
  photoUrl,
  type Phase,
  type PhotoStatus,
  type QueueSnapshot,
} from '@/lib/photo-queue';
import { recordsOf, type Replica } from '@/lib/replica';
import { pendingOutbox } from '@/lib/sync';
import { photoCreateBody, type Photo } from '@/shared/records';
import type { Mutation } from '@/shared/sync';
import { keys } from './keys';
import { useRecordWrites } from './use-records';
import { AccountContext } from './use-session';

// ---------- the one uploader per signed-in user ----------

let running: { client: QueryClient; userId: string; uploader: PhotoUploader } | null = null;

/** Coalesce a burst of cache events into one call on the next turn. */
function coalesced(fn: () => void): () => void {
  let queued = false;
  return () => {
    if (queued) return;
    queued = true;
    setTimeout(() => {
      queued = false;
      fn();
    }, 0);
  };
}

function uploaderFor(client: QueryClient, userId: string): PhotoUploader {
  if (running && running.client === client && running.userId === userId) return running.uploader;
  // another user's cache is mounted now: their photos are not this one's to send
  running?.uploader.stop();
  const uploader = new PhotoUploader({
    userId,
    files: photoFiles,
    rows: () => {
      const replica = client.getQueryData<Replica>(keys.replica);
      if (!replica) return null;
      const queued = new Set(
        pendingOutbox(client)
          .map((m) => m.state.variables as Mutation | undefined)
          .filter((m) => m?.name === 'photo.create')
          .map((m) => m!.entityId),
      );
      return {
        row: (buildingId, photoId) => {
          const copy = replica.buildings[buildingId];
          return copy ? recordsOf(copy, 'photos')[photoId] : null;
        },
        queued: (photoId) => queued.has(photoId),
      };
    },
    isOnline: () => onlineManager.isOnline(),
    subscribe: (onChange) => {
      const fire = coalesced(onChange);
      const offQueries = client.getQueryCache().subscribe((event) => {
        if (event.query.queryKey[0] === keys.replica[0]) fire();
      });
      const offMutations = client.getMutationCache().subscribe(fire);
      const offOnline = onlineManager.subscribe(fire);
      return () => {
        offQueries();
        offMutations();
        offOnline();
      };
    },
    subscribeOnline: (onOnline) => onlineManager.subscribe((online) => online && onOnline()),
    warm: keepServerThumbnail,
    afterStored: () => void client.invalidateQueries({ queryKey: keys.replica }),
  });
  running = { client, userId, uploader };
  void uploader.start();
  return uploader;
}

const EMPTY: QueueSnapshot = { ready: false, photos: {} };
const noSubscription = () => () => undefined;

function useUploader(): PhotoUploader | null {
  const client = useQueryClient();
  const { userId } = useContext(AccountContext);
  return userId ? uploaderFor(client, userId) : null;
}

/**
 * Keep the upload loop running for the signed-in user. Any screen showing photos does this; a
 * component mounted for the whole session (the header's sync status) should too, so photos also
 * go while the user is elsewhere in the app.
 */
export function usePhotoQueue(): QueueSnapshot {
  const uploader = useUploader();
  return useSyncExternalStore(uploader?.subscribeSnapshot ?? noSubscription, uploader?.getSnapshot ?? (() => EMPTY), () => EMPTY);
}

/** A clock that ticks every second while `active` (for "again in 12 s"). */
function useNow(active: boolean): number {
  const [now, setNow] = useState(() => Date.now());
  useEffect(() => {
    if (!active) return;
    const timer = setInterval(() => setNow(Date.now()), 1000);
    return () => clearInterval(timer);
  }, [active]);
  return active ? now : Date.now();
}

// ---------- a parent's photos ----------

export interface ShownPhoto {
  photo: Photo;
  /** what the thumbnail shows: the bytes on this device, else the server's thumbnail (null: nothing yet) */
  thumbUri: string | null;
  /** the full-size picture */
  fullUri: string | null;
  /** the bytes are on this device */
  local: boolean;
  status: PhotoStatus;
}

function statusOf(snapshot: QueueSnapshot, photo: Photo, now: number): { status: PhotoStatus; uri: string | null } {
  const local = snapshot.photos[photo.id];
  if (!local) return { status: describePhase(null, NEW_ATTEMPT, null, now, photo.uploaded), uri: null };
  return { status: describePhase(local.phase, local.attempt, local.photo.refused, now, photo.uploaded), uri: local.uri };
}

/** The photos of one parent and purpose, oldest first; undefined while the replica loads. */
export function usePhotos(buildingId: string, parentKind: Photo['parentKind'], parentId: string, purpose: Photo['purpose']): ShownPhoto[] | undefined {
  const rows = useQuery({
    queryKey: keys.replica,
    select: useCallback(
      (r: Replica): Photo[] => {
        const copy = r.buildings[buildingId];
        if (!copy) return [];
        return Object.values(recordsOf(copy, 'photos'))
          .filter((p) => p.parentKind === parentKind && p.parentId === parentId && p.purpose === purpose)
          .sort((a, b) => a.takenAt.localeCompare(b.takenAt) || a.id.localeCompare(b.id));
      },
      [buildingId, parentKind, parentId, purpose],
    ),
  }).data;
  const snapshot = usePhotoQueue();
  const retrying = Object.values(snapshot.photos).some((p) => p.phase === 'retrying');
  const now = useNow(retrying);
  return rows?.map((photo) => {
    const { status, uri } = statusOf(snapshot, photo, now);
    return {
      photo,
      local: uri !== null,
      thumbUri: uri ?? (photo.uploaded ? photoUrl(photo.id, 'thumb') : null),
      fullUri: uri ?? (photo.uploaded ? photoUrl(photo.id, 'original') : null),
      status,
    };
  });
}

// ---------- adding and removing ----------

function problemOf(error: unknown): string {
  const name = (error as { name?: string } | null)?.name;
  if (name === 'QuotaExceededError') {
    return 'This device is out of storage, so the photo was not kept. Sync the photos waiting here, or free some space, then try again.';
  }
  return error instanceof Error ? error.message : 'The photo could not be kept on this device.';
}

export interface PhotoTarget {
  buildingId: string;
  parentKind: Photo['parentKind'];
  parentId: string;
  purpose: Photo['purpose'];
}

/**
 * Take (native: the camera) or pick (web: a file picker, several at once) photos, resize them,
 * keep their bytes on the device and queue their rows. Call `add` straight from the button's
 * press: a browser opens a file picker only from the user's own tap.
 */
export function useAddPhotos({ buildingId, parentKind, parentId, purpose }: PhotoTarget) {
  const { createPhotoRow } = useRecordWrites();
  const uploader = useUploader();
  const [busy, setBusy] = useState(false);
  const [problem, setProblem] = useState<string | null>(null);

  const add = async () => {
    setProblem(null);
    let result: ImagePicker.ImagePickerResult;
    try {
      if (Platform.OS === 'web') {
        result = await ImagePicker.launchImageLibraryAsync({ mediaTypes: ['images'], allowsMultipleSelection: true, quality: 1 });
      } else {
        const permission = await ImagePicker.requestCameraPermissionsAsync();
        if (!permission.granted) {
          setProblem('The camera is not allowed for Ampwright. Allow it in the phone’s settings to take photos.');
          return;
        }
        result = await ImagePicker.launchCameraAsync({ mediaTypes: ['images'], quality: 1, exif: true });
      }
    } catch (error) {
      setProblem(problemOf(error));
      return;
    }
    if (result.canceled || !result.assets?.length) return;
    if (!uploader) return;
    setBusy(true);
    askToKeepStorage();
    const problems: string[] = [];
    for (const asset of result.assets) {
      try {
        const prepared = await preparePhoto(asset);
        const fields = photoCreateBody.parse({
          parentKind,
          parentId,
          purpose,
          sha256: prepared.sha256,
          bytes: prepared.bytes,
          contentType: prepared.contentType,
          width: prepared.width,
          height: prepared.height,
          takenAt: prepared.takenAt,
          caption: '',
        });
        const id = uuidv7();
        // the bytes first: a row whose bytes never got kept could never be uploaded
        await uploader.add(
          { id, buildingId, sha256: prepared.sha256, bytes: prepared.bytes, contentType: prepared.contentType, savedAt: Date.now(), refused: null },
          prepared.source,
        );
        createPhotoRow(buildingId, id, fields);
      } catch (error) {
        problems.push(problemOf(error));
      }
    }
    setBusy(false);
    if (problems.length) setProblem(problems.join(' '));
  };

  return { add, busy, problem, dismissProblem: () => setProblem(null) };
}

/** Delete a photo (queued like any change) and drop its bytes from this device. */
export function useRemovePhoto() {
  const { deletePhoto } = useRecordWrites();
  const uploader = useUploader();
  return (buildingId: string, photoId: string) => {
    deletePhoto(buildingId, photoId);
    void uploader?.forget(photoId);
  };
}

// ---------- what is still waiting ----------

const WAITING: ReadonlySet<Phase> = new Set(['unknown', 'waiting-row', 'waiting-signal', 'retrying', 'uploading', 'next', 'refused']);

export interface WaitingPhoto {
  id: string;
  /** "Finding photo · Brackenfold Family Clinic" */
  label: string;
  bytes: number;
  status: PhotoStatus;
}

const PURPOSE_WORDS: Record<Photo['purpose'], string> = {
  thermal: 'Thermal image',
  visible: 'Visible-light photo',
  finding: 'Finding photo',
  repair: 'Repair photo',
  equipment: 'Equipment photo',
};

/** The photos whose bytes have not reached the server, oldest first (the Sync tab). */
export function useWaitingPhotos(): { ready: boolean; photos: WaitingPhoto[]; refused: number } {
  const snapshot = usePhotoQueue();
  const replica = useQuery<Replica>({ queryKey: keys.replica }).data;
  const entries = Object.values(snapshot.photos)
    .filter((p) => WAITING.has(p.phase))
    .sort((a, b) => a.photo.savedAt - b.photo.savedAt);
  const now = useNow(entries.some((p) => p.phase === 'retrying'));
  const photos = entries.map(({ photo, phase, attempt, uri: _uri }) => {
    const copy = replica?.buildings[photo.buildingId];
    const row = copy ? recordsOf(copy, 'photos')[photo.id] : undefined;
    const what = row ? PURPOSE_WORDS[row.purpose] : 'Photo';
    return {
      id: photo.id,
      label: copy ? `${what} · ${copy.building.name}` : what,
      bytes: photo.bytes,
      status: describePhase(phase, attempt, photo.refused, now, false),
    };
  });
  return { ready: snapshot.ready, photos, refused: entries.filter((p) => p.phase === 'refused').length };
}

/** Remove every photo of this user from the device (signing out for good). */
export function forgetDevicePhotos(userId: string): Promise<void> {
  if (running?.userId === userId) {
    running.uploader.stop();
    running = null;
  }
  return removeAllPhotoFiles(userId);
}
