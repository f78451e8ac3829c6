/**
 * The photo queue (SYNC.md, "Photos"): the bytes of every photo taken on this device wait in a
 * store of their own (IndexedDB on the web, the document directory on native: lib/photo-files)
 * until the server has them. The queue is that store plus the replica's photo rows, so it
 * survives reloads with nothing else to persist:
 *
 * - the row (`photo.create`) goes through the outbox like any change; its id is the store's key;
 * - while online, each stored photo whose row is not `uploaded` is sent with `PUT /api/photos/:id`
 *   (XMLHttpRequest, for upload progress), one at a time, oldest first;
 * - 404 (the row has not reached the server yet), 5xx, 429 and no answer at all are retried with
 *   capped, jittered backoff; no answer also marks the app offline (lib/online.ts), and the retry
 *   comes as soon as the API answers again;
 * - 400/403/409/413/415 will not change on retry: the photo stops and shows the server's reason;
 * - 200: the bytes stay the display source until the pulled row says `uploaded` and the server's
 *   thumbnail has been fetched once (kept by the browser's HTTP cache: the server sends it
 *   `immutable`), so a thumbnail keeps showing offline after a reload; then they are deleted.
 *
 * The decisions are pure functions (unit-tested); `PhotoUploader` runs them against its
 * dependencies, which hooks/use-photos.ts wires to the query client and the platform's store.
 */
import { apiUrl } from './api-base';
import type { NativeFile } from './form-data-native';
import { markUnreachable } from './online';

/** Resize on the device before queueing: the long edge, and the JPEG quality. */
export const PHOTO_LONG_EDGE = 2000;
export const PHOTO_JPEG_QUALITY = 0.8;

/** Backoff between upload attempts: doubling from BASE, never above CAP, with jitter. */
export const RETRY_BASE_MS = 2_000;
export const RETRY_CAP_MS = 5 * 60_000;
/** Bytes with no row on the device after this long belong to a deleted (or refused) photo. */
export const ORPHAN_GRACE_MS = 10 * 60_000;
/** An accepted upload whose row has not come back `uploaded` by then is asked about again. */
export const ACCEPTED_RECHECK_MS = 60_000;
/** Fetching the server's thumbnail before the local bytes go: give up (and keep them) after this. */
export const MAX_WARM_FAILURES = 6;
/**
 * The local bytes outlive the pulled `uploaded` row by this long, so the persisted cache (written
 * on a short throttle) holds that row before they go: a reload must never find neither.
 */
export const SYNCED_SETTLE_MS = 5_000;
/** An upload with no progress for this long is dropped and tried again. */
export const STALL_MS = 60_000;

export const photoUrl = (photoId: string, variant: 'original' | 'thumb') =>
  apiUrl(`/photos/${encodeURIComponent(photoId)}${variant === 'thumb' ? '/thumb' : ''}`);

// ---------- what is kept on the device ----------

/** A refusal the server gave for these bytes: it will not change on retry. */
export interface Refusal {
  status: number;
  reason: string;
}

/** What the store keeps beside the bytes of one photo. */
export interface LocalPhoto {
  id: string;
  buildingId: string;
  sha256: string;
  bytes: number;
  contentType: string;
  /** epoch ms when the bytes were stored */
  savedAt: number;
  refused: Refusal | null;
}

/** The bytes as the upload sends them: a Blob on the web, a file on native. */
export type UploadPart = { blob: Blob; name: string } | { uri: string; name: string; type: string };

/** The device's store of photo bytes (lib/photo-files.web.ts, lib/photo-files.ts). */
export interface PhotoFileStore {
  /** every photo of this user, with a URI to show it (an object URL on the web) */
  list(userId: string): Promise<{ photo: LocalPhoto; uri: string }[]>;
  put(userId: string, photo: LocalPhoto, source: PhotoSource): Promise<string>;
  update(userId: string, id: string, change: Partial<Pick<LocalPhoto, 'refused'>>): Promise<void>;
  part(userId: string, id: string): Promise<UploadPart | null>;
  remove(userId: string, id: string): Promise<void>;
}

/** The prepared bytes of a new photo (lib/image-resize). */
export type PhotoSource = { blob: Blob } | { uri: string };

// ---------- decisions (pure) ----------

/** How it stands with one photo's bytes. */
export type Phase =
  /** the building copy is not on the device (yet): nothing is decided */
  | 'unknown'
  /** its row is still in the outbox: the server would answer 404 */
  | 'waiting-row'
  | 'waiting-signal'
  /** waiting for the next attempt after a failure */
  | 'retrying'
  | 'uploading'
  /** ready to go, behind another photo's upload */
  | 'next'
  /** the server took the bytes; the pull has not said `uploaded` yet */
  | 'accepted'
  /** the row says `uploaded`; the local bytes go once the server's thumbnail is kept */
  | 'synced'
  | 'refused'
  /** no row on the device: the photo was deleted, or its row refused */
  | 'orphan';

/** What the uploader remembers of its attempts for one photo (memory only). */
export interface Attempt {
  failures: number;
  /** epoch ms before which no new attempt is made */
  nextAt: number;
  inFlight: boolean;
  /** the last failure got no answer at all: retry as soon as the API answers */
  offline: boolean;
  /** epoch ms of a 200 answer */
  acceptedAt: number | null;
  lastError: string | null;
  /** 0..1 while uploading */
  fraction: number;
  warmFailures: number;
  /** epoch ms when the row was first seen `uploaded` */
  syncedAt: number | null;
}

export const NEW_ATTEMPT: Attempt = {
  failures: 0,
  nextAt: 0,
  inFlight: false,
  offline: false,
  acceptedAt: null,
  lastError: null,
  fraction: 0,
  warmFailures: 0,
  syncedAt: null,
};

export interface DecideInput {
  local: Pick<LocalPhoto, 'savedAt' | 'refused'>;
  /** the replica's row; `null` when the building's copy is not on the device */
  row: { uploaded: boolean } | undefined | null;
  /** its `photo.create` is still waiting in the outbox */
  queued: boolean;
  attempt: Attempt;
  online: boolean;
  now: number;
}

export type Act = 'none' | 'upload' | 'finish' | 'forget';

/** What to do next with one stored photo, and how it stands. */
export function decide({ local, row, queued, attempt, online, now }: DecideInput): { phase: Phase; act: Act } {
  if (row === null) return { phase: 'unknown', act: 'none' };
  if (row === undefined) {
    // the row is put on the replica a moment after the bytes are stored: give it time
    return now - local.savedAt > ORPHAN_GRACE_MS ? { phase: 'orphan', act: 'forget' } : { phase: 'unknown', act: 'none' };
  }
  if (row.uploaded) {
    const settled = attempt.syncedAt !== null && now - attempt.syncedAt >= SYNCED_SETTLE_MS;
    const canWarm = settled && online && attempt.warmFailures < MAX_WARM_FAILURES && now >= attempt.nextAt;
    return { phase: 'synced', act: canWarm ? 'finish' : 'none' };
  }
  if (local.refused) return { phase: 'refused', act: 'none' };
  if (attempt.inFlight) return { phase: 'uploading', act: 'none' };
  if (attempt.acceptedAt !== null && now - attempt.acceptedAt < ACCEPTED_RECHECK_MS) return { phase: 'accepted', act: 'none' };
  if (!online) return { phase: 'waiting-signal', act: 'none' };
  if (queued) return { phase: 'waiting-row', act: 'none' };
  if (now < attempt.nextAt) return { phase: 'retrying', act: 'none' };
  return { phase: 'uploading', act: 'upload' };
}

/** Capped exponential backoff with jitter (half to all of the step), for the n-th failure (1-based). */
export function backoffMs(failures: number, random: () => number = Math.random): number {
  const step = Math.min(RETRY_CAP_MS, RETRY_BASE_MS * 2 ** Math.max(0, failures - 1));
  return Math.round(step * (0.5 + random() / 2));
}

/** What an upload's answer means for the queue. */
export type Outcome =
  | { kind: 'stored' }
  | { kind: 'retry'; reason: string; offline: boolean }
  | { kind: 'refused'; refusal: Refusal };

const REFUSED_WORDS: Record<number, string> = {
  400: 'the server could not read this photo',
  403: 'you may look at photos here but not add them',
  409: 'a different photo is already stored under this record',
  413: 'the photo is too large',
  415: 'this file type is not accepted',
};

/** `status` 0: no answer at all. `body` is the parsed JSON answer, if any. */
export function classifyAnswer(status: number, body: unknown): Outcome {
  const error = (body as { error?: { code?: string; message?: string } } | null | undefined)?.error;
  if (status >= 200 && status < 300) return { kind: 'stored' };
  if (status === 0) return { kind: 'retry', reason: 'no connection to the server', offline: true };
  if (status === 404) return { kind: 'retry', reason: 'waiting for its record to reach the server', offline: false };
  if (status === 401) return { kind: 'retry', reason: 'signed out: sign in again to upload', offline: false };
  if (status >= 500 || status === 408 || status === 425 || status === 429) {
    return { kind: 'retry', reason: `the server is busy or failing (${status})`, offline: false };
  }
  // damaged on the way: the bytes on the device are still good, send them again
  if (status === 400 && error?.code === 'checksum_mismatch') {
    return { kind: 'retry', reason: 'the upload was damaged on the way', offline: false };
  }
  return { kind: 'refused', refusal: { status, reason: error?.message || REFUSED_WORDS[status] || `the server refused it (${status})` } };
}

/** The attempt after an upload's outcome. */
export function afterOutcome(attempt: Attempt, outcome: Outcome, now: number, random: () => number = Math.random): Attempt {
  const settled = { ...attempt, inFlight: false, fraction: 0 };
  switch (outcome.kind) {
    case 'stored':
      return { ...settled, failures: 0, nextAt: 0, offline: false, acceptedAt: now, lastError: null };
    case 'refused':
      return { ...settled, offline: false, lastError: outcome.refusal.reason };
    case 'retry': {
      const failures = attempt.failures + 1;
      return { ...settled, failures, nextAt: now + backoffMs(failures, random), offline: outcome.offline, acceptedAt: null, lastError: outcome.reason };
    }
  }
}

/** The words a user reads under a thumbnail. */
export interface PhotoStatus {
  /** 'on this device' | 'uploading' | 'synced' | 'refused' | 'not uploaded yet' */
  word: string;
  /** the rest of the line: why it waits, the percentage, the reason */
  detail: string;
  /** 0..1 while uploading */
  fraction: number | null;
  tone: 'waiting' | 'busy' | 'done' | 'refused';
}

export function describePhase(phase: Phase | null, attempt: Attempt, refusal: Refusal | null, now: number, uploaded: boolean): PhotoStatus {
  if (phase === null) {
    // nothing of it on this device: it was taken elsewhere
    return uploaded
      ? { word: 'synced', detail: '', fraction: null, tone: 'done' }
      : { word: 'not uploaded yet', detail: 'on the device that took it', fraction: null, tone: 'waiting' };
  }
  switch (phase) {
    case 'uploading': {
      const pct = Math.min(99, Math.floor(attempt.fraction * 100));
      return { word: 'uploading', detail: `${pct} %`, fraction: attempt.fraction, tone: 'busy' };
    }
    case 'accepted':
    case 'synced':
      return { word: 'synced', detail: '', fraction: null, tone: 'done' };
    case 'refused':
      return { word: 'refused', detail: refusal?.reason ?? 'by the server', fraction: null, tone: 'refused' };
    case 'waiting-signal':
      return { word: 'on this device', detail: 'waiting for signal', fraction: null, tone: 'waiting' };
    case 'waiting-row':
      return { word: 'on this device', detail: 'its record goes first', fraction: null, tone: 'waiting' };
    case 'next':
      return { word: 'on this device', detail: 'next in line', fraction: null, tone: 'waiting' };
    case 'retrying': {
      const seconds = Math.max(1, Math.ceil((attempt.nextAt - now) / 1000));
      const when = seconds >= 90 ? `${Math.round(seconds / 60)} min` : `${seconds} s`;
      return { word: 'on this device', detail: `${attempt.lastError ?? 'will retry'} · again in ${when}`, fraction: null, tone: 'waiting' };
    }
    default:
      return { word: 'on this device', detail: '', fraction: null, tone: 'waiting' };
  }
}

// ---------- SHA-256 ----------

const K = new Uint32Array([
  0x428a2f98, 0x71374491, 0xb5c0fbcf, 0xe9b5dba5, 0x3956c25b, 0x59f111f1, 0x923f82a4, 0xab1c5ed5, 0xd807aa98, 0x12835b01,
  0x243185be, 0x550c7dc3, 0x72be5d74, 0x80deb1fe, 0x9bdc06a7, 0xc19bf174, 0xe49b69c1, 0xefbe4786, 0x0fc19dc6, 0x240ca1cc,
  0x2de92c6f, 0x4a7484aa, 0x5cb0a9dc, 0x76f988da, 0x983e5152, 0xa831c66d, 0xb00327c8, 0xbf597fc7, 0xc6e00bf3, 0xd5a79147,
  0x06ca6351, 0x14292967, 0x27b70a85, 0x2e1b2138, 0x4d2c6dfc, 0x53380d13, 0x650a7354, 0x766a0abb, 0x81c2c92e, 0x92722c85,
  0xa2bfe8a1, 0xa81a664b, 0xc24b8b70, 0xc76c51a3, 0xd192e819, 0xd6990624, 0xf40e3585, 0x106aa070, 0x19a4c116, 0x1e376c08,
  0x2748774c, 0x34b0bcb5, 0x391c0cb3, 0x4ed8aa4a, 0x5b9cca4f, 0x682e6ff3, 0x748f82ee, 0x78a5636f, 0x84c87814, 0x8cc70208,
  0x90befffa, 0xa4506ceb, 0xbef9a3f7, 0xc67178f2,
]);

/**
 * SHA-256 in plain JavaScript (FIPS 180-4), for engines without Web Crypto (Hermes on native).
 * Checked against node:crypto in tests/unit/photo-queue.test.ts.
 */
export function sha256HexSync(data: Uint8Array): string {
  const h = new Uint32Array([0x6a09e667, 0xbb67ae85, 0x3c6ef372, 0xa54ff53a, 0x510e527f, 0x9b05688c, 0x1f83d9ab, 0x5be0cd19]);
  const bitLength = data.length * 8;
  const padded = new Uint8Array((((data.length + 9 + 63) >> 6) << 6));
  padded.set(data);
  padded[data.length] = 0x80;
  const view = new DataView(padded.buffer);
  view.setUint32(padded.length - 8, Math.floor(bitLength / 2 ** 32));
  view.setUint32(padded.length - 4, bitLength >>> 0);
  const w = new Uint32Array(64);
  for (let offset = 0; offset < padded.length; offset += 64) {
    for (let i = 0; i < 16; i++) w[i] = view.getUint32(offset + i * 4);
    for (let i = 16; i < 64; i++) {
      const a = w[i - 15], b = w[i - 2];
      const s0 = ((a >>> 7) | (a << 25)) ^ ((a >>> 18) | (a << 14)) ^ (a >>> 3);
      const s1 = ((b >>> 17) | (b << 15)) ^ ((b >>> 19) | (b << 13)) ^ (b >>> 10);
      w[i] = (w[i - 16] + s0 + w[i - 7] + s1) >>> 0;
    }
    let [a, b, c, d, e, f, g, hh] = h;
    for (let i = 0; i < 64; i++) {
      const S1 = ((e >>> 6) | (e << 26)) ^ ((e >>> 11) | (e << 21)) ^ ((e >>> 25) | (e << 7));
      const ch = (e & f) ^ (~e & g);
      const t1 = (hh + S1 + ch + K[i] + w[i]) >>> 0;
      const S0 = ((a >>> 2) | (a << 30)) ^ ((a >>> 13) | (a << 19)) ^ ((a >>> 22) | (a << 10));
      const maj = (a & b) ^ (a & c) ^ (b & c);
      const t2 = (S0 + maj) >>> 0;
      hh = g; g = f; f = e; e = (d + t1) >>> 0; d = c; c = b; b = a; a = (t1 + t2) >>> 0;
    }
    h[0] += a; h[1] += b; h[2] += c; h[3] += d; h[4] += e; h[5] += f; h[6] += g; h[7] += hh;
  }
  return Array.from(h, (x) => x.toString(16).padStart(8, '0')).join('');
}

/** Hex SHA-256 of the final bytes, as the server checks them (Web Crypto where there is one). */
export async function sha256Hex(data: Uint8Array): Promise<string> {
  const subtle = globalThis.crypto?.subtle;
  if (subtle) {
    const digest = await subtle.digest('SHA-256', data as Uint8Array<ArrayBuffer>);
    return Array.from(new Uint8Array(digest), (x) => x.toString(16).padStart(2, '0')).join('');
  }
  return sha256HexSync(data);
}

// ---------- the upload ----------

export interface UploadAnswer {
  status: number;
  body: unknown;
}

export interface UploadHandle {
  done: Promise<UploadAnswer>;
  abort(): void;
}

/**
 * `PUT /api/photos/:id` as multipart (field `photo`) with `x-content-sha256`. XMLHttpRequest, not
 * fetch, for the upload's progress events. Status 0 when no answer came (and the app is marked
 * offline); a connection that stalls for STALL_MS is dropped the same way.
 */
export function putPhoto(photoId: string, part: UploadPart, sha256: string, onProgress: (fraction: number) => void): UploadHandle {
  const xhr = new XMLHttpRequest();
  let stall: ReturnType<typeof setTimeout> | null = null;
  let aborted = false;
  const done = new Promise<UploadAnswer>((resolve) => {
    const settle = (answer: UploadAnswer) => {
      if (stall) clearTimeout(stall);
      resolve(answer);
    };
    const noAnswer = () => {
      if (!aborted) markUnreachable();
      settle({ status: 0, body: null });
    };
    const watch = () => {
      if (stall) clearTimeout(stall);
      stall = setTimeout(() => xhr.abort(), STALL_MS);
    };
    xhr.open('PUT', photoUrl(photoId, 'original'));
    xhr.withCredentials = true;
    xhr.setRequestHeader('x-content-sha256', sha256);
    xhr.upload.onprogress = (event) => {
      watch();
      if (event.lengthComputable && event.total > 0) onProgress(event.loaded / event.total);
    };
    xhr.onload = () => {
      let body: unknown = null;
      try {
        body = xhr.responseText ? JSON.parse(xhr.responseText) : null;
      } catch {
        // a proxy's HTML error page: the status says enough
      }
      settle({ status: xhr.status, body });
    };
    xhr.onerror = noAnswer;
    xhr.ontimeout = noAnswer;
    xhr.onabort = () => settle({ status: 0, body: null });
    const form = new FormData();
    if ('blob' in part) form.append('photo', part.blob, part.name);
    else {
      // React Native's FormData takes a file by URI
      const file: NativeFile = { uri: part.uri, name: part.name, type: part.type };
      form.append('photo', file);
    }
    watch();
    xhr.send(form);
  });
  return {
    done,
    abort: () => {
      aborted = true;
      xhr.abort();
    },
  };
}

// ---------- the loop ----------

/** How the replica sees one photo (hooks/use-photos.ts reads it from the query client). */
export interface RowView {
  /** `null`: the building's copy is not on the device */
  row(buildingId: string, photoId: string): { uploaded: boolean } | undefined | null;
  /** its `photo.create` is still in the outbox */
  queued(photoId: string): boolean;
}

export interface UploaderDeps {
  userId: string;
  files: PhotoFileStore;
  /** the replica's photo rows; null until the replica is on the device */
  rows(): RowView | null;
  isOnline(): boolean;
  /** subscribe to changes of the replica, the outbox and the signal; returns the unsubscribe */
  subscribe(onChange: () => void): () => void;
  /** called when the signal returns */
  subscribeOnline(onOnline: () => void): () => void;
  upload?: typeof putPhoto;
  /** fetch the server's thumbnail once, so it is kept for offline use; resolves whether it came */
  warm(photoId: string): Promise<boolean>;
  /** the server took some bytes: pull, so `uploaded` comes down */
  afterStored(): void;
  now?: () => number;
  random?: () => number;
}

/** One stored photo as the screens see it. */
export interface QueuedPhoto {
  photo: LocalPhoto;
  /** object URL (web) or file URI (native) of the bytes on the device */
  uri: string;
  phase: Phase;
  attempt: Attempt;
}

export interface QueueSnapshot {
  /** the store has been read */
  ready: boolean;
  photos: Record<string, QueuedPhoto>;
}

/**
 * Runs the decisions for one user's stored photos: at most one upload at a time, the oldest
 * first. `tick()` is cheap and runs on every change of the replica, the outbox or the signal.
 */
export class PhotoUploader {
  private snapshot: QueueSnapshot = { ready: false, photos: {} };
  private readonly listeners = new Set<() => void>();
  private unsubscribe: (() => void)[] = [];
  private timer: ReturnType<typeof setTimeout> | null = null;
  private current: { id: string; abort(): void } | null = null;
  private ticking = false;
  private again = false;
  private stopped = false;
  private readonly warming = new Set<string>();

  constructor(private readonly deps: UploaderDeps) {}

  private now = () => (this.deps.now ?? Date.now)();

  async start(): Promise<void> {
    const listed = await this.deps.files.list(this.deps.userId).catch(() => []);
    if (this.stopped) return;
    const photos = { ...this.snapshot.photos };
    for (const { photo, uri } of listed) photos[photo.id] ??= { photo, uri, phase: 'unknown', attempt: NEW_ATTEMPT };
    this.set({ ready: true, photos });
    this.unsubscribe = [
      this.deps.subscribe(() => this.tick()),
      this.deps.subscribeOnline(() => {
        // the API answers again: what failed for want of it goes now, not at its backoff
        this.editAll((a) => (a.offline ? { ...a, nextAt: 0, offline: false } : a));
        this.tick();
      }),
    ];
    this.tick();
  }

  stop(): void {
    this.stopped = true;
    this.unsubscribe.forEach((u) => u());
    if (this.timer) clearTimeout(this.timer);
    this.current?.abort();
  }

  getSnapshot = (): QueueSnapshot => this.snapshot;

  subscribeSnapshot = (listener: () => void): (() => void) => {
    this.listeners.add(listener);
    return () => this.listeners.delete(listener);
  };

  /** Keep a new photo's bytes (before its row is queued). Throws when the device cannot keep them. */
  async add(photo: LocalPhoto, source: PhotoSource): Promise<void> {
    const uri = await this.deps.files.put(this.deps.userId, photo, source);
    this.set({ ...this.snapshot, photos: { ...this.snapshot.photos, [photo.id]: { photo, uri, phase: 'unknown', attempt: NEW_ATTEMPT } } });
    this.tick();
  }

  /** Drop a photo's bytes (the photo was deleted on this device). */
  async forget(id: string): Promise<void> {
    if (this.current?.id === id) this.current.abort();
    await this.deps.files.remove(this.deps.userId, id).catch(() => undefined);
    const { [id]: _gone, ...photos } = this.snapshot.photos;
    this.set({ ...this.snapshot, photos });
  }

  /** Evaluate every stored photo; start the next upload; set a timer for the next retry. */
  tick(): void {
    if (this.stopped || !this.snapshot.ready) return;
    if (this.ticking) {
      this.again = true;
      return;
    }
    this.ticking = true;
    try {
      do {
        this.again = false;
        this.evaluate();
      } while (this.again && !this.stopped);
    } finally {
      this.ticking = false;
    }
  }

  private evaluate(): void {
    const view = this.deps.rows();
    if (!view) return;
    const now = this.now();
    const online = this.deps.isOnline();
    const updates: Record<string, { phase: Phase; syncedAt: number | null }> = {};
    let next: QueuedPhoto | null = null;
    let wakeAt = Infinity;
    const ordered = Object.values(this.snapshot.photos).sort((a, b) => a.photo.savedAt - b.photo.savedAt || a.photo.id.localeCompare(b.photo.id));
    for (const entry of ordered) {
      const { photo } = entry;
      const row = view.row(photo.buildingId, photo.id);
      let attempt = entry.attempt;
      // the settle time runs from the first time this device sees the row uploaded
      if (row?.uploaded && attempt.syncedAt === null) attempt = { ...attempt, syncedAt: now };
      const { phase, act } = decide({ local: photo, row, queued: view.queued(photo.id), attempt, online, now });
      let shown = phase;
      if (act === 'upload') {
        if (!next && !this.current) next = entry;
        else shown = 'next';
      }
      if (shown !== entry.phase || attempt.syncedAt !== entry.attempt.syncedAt) updates[photo.id] = { phase: shown, syncedAt: attempt.syncedAt };
      if (phase === 'synced' && attempt.syncedAt !== null && now - attempt.syncedAt < SYNCED_SETTLE_MS) {
        wakeAt = Math.min(wakeAt, attempt.syncedAt + SYNCED_SETTLE_MS);
      }
      if (act === 'forget') void this.forget(photo.id);
      if (act === 'finish') this.finish(photo.id);
      if ((phase === 'retrying' || phase === 'synced') && attempt.nextAt > now) wakeAt = Math.min(wakeAt, attempt.nextAt);
      if (phase === 'accepted' && attempt.acceptedAt !== null) wakeAt = Math.min(wakeAt, attempt.acceptedAt + ACCEPTED_RECHECK_MS);
      if (phase === 'unknown' && photo.savedAt + ORPHAN_GRACE_MS > now) wakeAt = Math.min(wakeAt, photo.savedAt + ORPHAN_GRACE_MS + 1);
    }
    if (Object.keys(updates).length) this.set({ ...this.snapshot, photos: { ...this.snapshot.photos, ...pick(updates, this.snapshot.photos) } });
    if (next) void this.upload(next);
    if (this.timer) clearTimeout(this.timer);
    this.timer = wakeAt < Infinity ? setTimeout(() => this.tick(), Math.max(50, wakeAt - now)) : null;
  }

  private async upload(entry: QueuedPhoto): Promise<void> {
    const { id } = entry.photo;
    const { userId, files } = this.deps;
    // taken before the first await: no second upload starts meanwhile
    this.current = { id, abort: () => undefined };
    this.editAttempt(id, (a) => ({ ...a, inFlight: true, fraction: 0 }), 'uploading');
    let outcome: Outcome;
    try {
      const part = await files.part(userId, id);
      if (!part) {
        // the bytes are gone from the store (cleared by the browser): nothing left to send
        await this.forget(id);
        return;
      }
      const handle = (this.deps.upload ?? putPhoto)(id, part, entry.photo.sha256, (fraction) =>
        this.editAttempt(id, (a) => ({ ...a, fraction })),
      );
      this.current = { id, abort: handle.abort };
      const answer = await handle.done;
      outcome = classifyAnswer(answer.status, answer.body);
    } catch (error) {
      outcome = { kind: 'retry', reason: error instanceof Error ? error.message : 'the upload failed', offline: false };
    } finally {
      this.current = null;
    }
    if (this.stopped || !this.snapshot.photos[id]) return;
    const now = this.now();
    this.editAttempt(id, (a) => afterOutcome(a, outcome, now, this.deps.random));
    if (outcome.kind === 'refused') {
      // in memory at once (a tick before the store's write would send it again), then kept
      const refusal = outcome.refusal;
      this.editPhoto(id, { refused: refusal });
      await files.update(userId, id, { refused: refusal }).catch(() => undefined);
    }
    if (outcome.kind === 'stored') this.deps.afterStored();
    this.tick();
  }

  /** The row says uploaded: keep the server's thumbnail, then let the local bytes go. */
  private finish(id: string): void {
    if (this.warming.has(id)) return;
    this.warming.add(id);
    void this.deps
      .warm(id)
      .catch(() => false)
      .then(async (kept) => {
        this.warming.delete(id);
        if (this.stopped) return;
        if (kept) {
          await this.forget(id);
        } else {
          const now = this.now();
          this.editAttempt(id, (a) => ({ ...a, warmFailures: a.warmFailures + 1, nextAt: now + backoffMs(a.warmFailures + 1, this.deps.random) }));
        }
        this.tick();
      });
  }

  private set(next: QueueSnapshot) {
    this.snapshot = next;
    this.listeners.forEach((l) => l());
  }

  private editAttempt(id: string, edit: (a: Attempt) => Attempt, phase?: Phase) {
    const entry = this.snapshot.photos[id];
    if (!entry) return;
    this.set({ ...this.snapshot, photos: { ...this.snapshot.photos, [id]: { ...entry, attempt: edit(entry.attempt), phase: phase ?? entry.phase } } });
  }

  private editPhoto(id: string, change: Partial<LocalPhoto>) {
    const entry = this.snapshot.photos[id];
    if (!entry) return;
    this.set({ ...this.snapshot, photos: { ...this.snapshot.photos, [id]: { ...entry, photo: { ...entry.photo, ...change } } } });
  }

  private editAll(edit: (a: Attempt) => Attempt) {
    const photos = Object.fromEntries(Object.entries(this.snapshot.photos).map(([id, e]) => [id, { ...e, attempt: edit(e.attempt) }]));
    this.set({ ...this.snapshot, photos });
  }
}

/** The updates applied to the entries still present in `current` (a forget may have run meanwhile). */
function pick(updates: Record<string, { phase: Phase; syncedAt: number | null }>, current: Record<string, QueuedPhoto>): Record<string, QueuedPhoto> {
  const out: Record<string, QueuedPhoto> = {};
  for (const [id, { phase, syncedAt }] of Object.entries(updates)) {
    const entry = current[id];
    if (entry) out[id] = { ...entry, phase, attempt: { ...entry.attempt, syncedAt } };
  }
  return out;
}
