/** The photo queue's decisions and its loop against fakes (lib/photo-queue.ts, lib/image-resize-rules.ts). */
import assert from 'node:assert/strict';
import { createHash, randomBytes } from 'node:crypto';
import { describe, it } from 'node:test';
import { exifTimeMs, scaleToLongEdge, takenAtOf } from '../../lib/image-resize-rules';
import {
  ACCEPTED_RECHECK_MS,
  afterOutcome,
  backoffMs,
  classifyAnswer,
  decide,
  describePhase,
  MAX_WARM_FAILURES,
  NEW_ATTEMPT,
  ORPHAN_GRACE_MS,
  PhotoUploader,
  RETRY_BASE_MS,
  RETRY_CAP_MS,
  SYNCED_SETTLE_MS,
  sha256Hex,
  sha256HexSync,
  type Attempt,
  type DecideInput,
  type LocalPhoto,
  type PhotoFileStore,
  type UploadAnswer,
  type UploadPart,
} from '../../lib/photo-queue';

const NOW = 1_800_000_000_000;

describe('backoffMs', () => {
  it('doubles from the base, with jitter between half and all of the step', () => {
    for (const [failures, step] of [[1, RETRY_BASE_MS], [2, 2 * RETRY_BASE_MS], [3, 4 * RETRY_BASE_MS], [5, 16 * RETRY_BASE_MS]]) {
      assert.equal(backoffMs(failures, () => 0), step / 2, `failure ${failures}, least jitter`);
      assert.equal(backoffMs(failures, () => 1), step, `failure ${failures}, most jitter`);
    }
  });
  it('never waits longer than the cap, however many failures', () => {
    for (const failures of [10, 20, 100, 10_000]) {
      const ms = backoffMs(failures, () => 1);
      assert.equal(ms, RETRY_CAP_MS);
      assert.ok(Number.isFinite(ms));
    }
  });
  it('spreads devices that failed together (different random draws, different waits)', () => {
    assert.notEqual(backoffMs(4, () => 0.1), backoffMs(4, () => 0.9));
  });
});

describe('decide', () => {
  const base: DecideInput = {
    local: { savedAt: NOW - 1000, refused: null },
    row: { uploaded: false },
    queued: false,
    attempt: NEW_ATTEMPT,
    online: true,
    now: NOW,
  };
  const settled: Attempt = { ...NEW_ATTEMPT, syncedAt: NOW - SYNCED_SETTLE_MS };
  const cases: [string, Partial<DecideInput>, string, string][] = [
    ['ready and online: upload', {}, 'uploading', 'upload'],
    ['building copy not on the device yet: wait, never delete', { row: null, local: { savedAt: NOW - 10 * ORPHAN_GRACE_MS, refused: null } }, 'unknown', 'none'],
    ['no row just after the bytes were stored: the row is on its way', { row: undefined }, 'unknown', 'none'],
    ['no row long after: the photo was deleted, let the bytes go', { row: undefined, local: { savedAt: NOW - ORPHAN_GRACE_MS - 1, refused: null } }, 'orphan', 'forget'],
    ['its row still in the outbox: the server would say 404', { queued: true }, 'waiting-row', 'none'],
    ['offline', { online: false }, 'waiting-signal', 'none'],
    ['in its backoff', { attempt: { ...NEW_ATTEMPT, failures: 2, nextAt: NOW + 5000 } }, 'retrying', 'none'],
    ['backoff over', { attempt: { ...NEW_ATTEMPT, failures: 2, nextAt: NOW - 1 } }, 'uploading', 'upload'],
    ['already uploading', { attempt: { ...NEW_ATTEMPT, inFlight: true } }, 'uploading', 'none'],
    ['refused: never again by itself', { local: { savedAt: NOW - 1000, refused: { status: 415, reason: 'x' } } }, 'refused', 'none'],
    ['server took it, pull not back yet', { attempt: { ...NEW_ATTEMPT, acceptedAt: NOW - 1000 } }, 'accepted', 'none'],
    ['server took it long ago and the row still says not uploaded: ask again', { attempt: { ...NEW_ATTEMPT, acceptedAt: NOW - ACCEPTED_RECHECK_MS - 1 } }, 'uploading', 'upload'],
    ['row says uploaded (a while ago): keep the server thumbnail, then drop the bytes', { row: { uploaded: true }, attempt: settled }, 'synced', 'finish'],
    ['row just came back uploaded: the bytes stay until the persisted cache surely has the row', { row: { uploaded: true }, attempt: { ...NEW_ATTEMPT, syncedAt: NOW - 100 } }, 'synced', 'none'],
    ['row says uploaded but offline: keep the bytes as the picture', { row: { uploaded: true }, attempt: settled, online: false }, 'synced', 'none'],
    ['uploaded, thumbnail would not load too often: keep the bytes', { row: { uploaded: true }, attempt: { ...settled, warmFailures: MAX_WARM_FAILURES } }, 'synced', 'none'],
    ['uploaded elsewhere while refused here: synced wins', { row: { uploaded: true }, attempt: settled, local: { savedAt: 0, refused: { status: 409, reason: 'x' } } }, 'synced', 'finish'],
  ];
  for (const [name, over, phase, act] of cases) {
    it(name, () => assert.deepEqual(decide({ ...base, ...over }), { phase, act }));
  }
});

describe('classifyAnswer', () => {
  const error = (code: string, message: string) => ({ error: { code, message } });
  it('200 is stored (also the no-op answer for bytes already stored)', () => {
    assert.deepEqual(classifyAnswer(200, { photoId: 'p', uploaded: true, unchanged: true }), { kind: 'stored' });
  });
  const retried: [number, unknown, boolean][] = [
    [0, null, true],
    [404, error('not_found', 'Photo not found'), false],
    [500, null, false],
    [502, null, false],
    [503, null, false],
    [429, error('too_many', 'slow down'), false],
    [401, null, false],
    [400, error('checksum_mismatch', 'damaged'), false],
  ];
  for (const [status, body, offline] of retried) {
    it(`${status} is retried${offline ? ' (and counts as no signal)' : ''}`, () => {
      const outcome = classifyAnswer(status, body);
      assert.equal(outcome.kind, 'retry');
      assert.equal(outcome.kind === 'retry' && outcome.offline, offline);
    });
  }
  const refused: [number, unknown, string][] = [
    [409, error('photo_conflict', 'These bytes are not the photo recorded'), 'These bytes are not the photo recorded'],
    [413, error('too_large', 'A photo may be at most 12 MB'), 'A photo may be at most 12 MB'],
    [415, error('unsupported_type', 'Only JPEG, PNG, WebP and HEIC'), 'Only JPEG, PNG, WebP and HEIC'],
    [400, error('validation', 'Send the photo as the form field "photo"'), 'Send the photo as the form field "photo"'],
    [403, error('forbidden', 'Owners can look at photos but not upload them'), 'Owners can look at photos but not upload them'],
    [413, null, 'the photo is too large'],
    [418, null, 'the server refused it (418)'],
  ];
  for (const [status, body, reason] of refused) {
    it(`${status} stops with the reason "${reason}"`, () => assert.deepEqual(classifyAnswer(status, body), { kind: 'refused', refusal: { status, reason } }));
  }
});

describe('afterOutcome', () => {
  const flying: Attempt = { ...NEW_ATTEMPT, inFlight: true, fraction: 0.6, failures: 3, nextAt: NOW - 10 };
  it('a failure counts, and sets the next attempt by the backoff', () => {
    const next = afterOutcome(flying, { kind: 'retry', reason: 'busy', offline: false }, NOW, () => 1);
    assert.equal(next.failures, 4);
    assert.equal(next.nextAt, NOW + backoffMs(4, () => 1));
    assert.equal(next.inFlight, false);
    assert.equal(next.fraction, 0);
    assert.equal(next.lastError, 'busy');
  });
  it('stored resets the failures and records when', () => {
    const next = afterOutcome(flying, { kind: 'stored' }, NOW);
    assert.deepEqual([next.failures, next.nextAt, next.acceptedAt, next.inFlight], [0, 0, NOW, false]);
  });
  it('no answer is remembered, so the signal coming back retries at once', () => {
    assert.equal(afterOutcome(flying, { kind: 'retry', reason: 'no connection', offline: true }, NOW).offline, true);
  });
});

describe('describePhase', () => {
  it('words for each state, never a colour alone', () => {
    assert.equal(describePhase('waiting-signal', NEW_ATTEMPT, null, NOW, false).word, 'on this device');
    assert.deepEqual(describePhase('uploading', { ...NEW_ATTEMPT, fraction: 0.426 }, null, NOW, false), {
      word: 'uploading', detail: '42 %', fraction: 0.426, tone: 'busy',
    });
    // 100 % is said only once the server has answered
    assert.equal(describePhase('uploading', { ...NEW_ATTEMPT, fraction: 1 }, null, NOW, false).detail, '99 %');
    assert.equal(describePhase('accepted', NEW_ATTEMPT, null, NOW, false).word, 'synced');
    assert.deepEqual(describePhase('refused', NEW_ATTEMPT, { status: 413, reason: 'too large' }, NOW, false), {
      word: 'refused', detail: 'too large', fraction: null, tone: 'refused',
    });
    assert.match(describePhase('retrying', { ...NEW_ATTEMPT, nextAt: NOW + 12_300, lastError: 'busy' }, null, NOW, false).detail, /busy · again in 13 s/);
    assert.match(describePhase('retrying', { ...NEW_ATTEMPT, nextAt: NOW + 240_000 }, null, NOW, false).detail, /4 min/);
  });
  it('a photo not on this device is synced, or waits on the device that took it', () => {
    assert.equal(describePhase(null, NEW_ATTEMPT, null, NOW, true).word, 'synced');
    assert.equal(describePhase(null, NEW_ATTEMPT, null, NOW, false).word, 'not uploaded yet');
  });
});

describe('SHA-256', () => {
  const node = (b: Uint8Array) => createHash('sha256').update(b).digest('hex');
  it('the plain-JS digest equals node:crypto at every padding boundary', () => {
    for (const n of [0, 1, 3, 55, 56, 57, 63, 64, 65, 119, 120, 127, 128, 1000, 4096 + 7]) {
      const bytes = new Uint8Array(randomBytes(n));
      assert.equal(sha256HexSync(bytes), node(bytes), `${n} bytes`);
    }
  });
  it('the known vector for "abc" (FIPS 180-4 example)', () => {
    assert.equal(sha256HexSync(new TextEncoder().encode('abc')), 'ba7816bf8f01cfea414140de5dae2223b00361a396177a9cb410ff61f20015ad');
  });
  it('Web Crypto and the fallback agree', async () => {
    const bytes = new Uint8Array(randomBytes(300_000));
    assert.equal(await sha256Hex(bytes), sha256HexSync(bytes));
  });
});

describe('resize rules', () => {
  it('scales the long edge to 2000 px, keeping proportions', () => {
    assert.deepEqual(scaleToLongEdge(4032, 3024, 2000), { width: 2000, height: 1500, scaled: true });
    assert.deepEqual(scaleToLongEdge(3024, 4032, 2000), { width: 1500, height: 2000, scaled: true });
    assert.deepEqual(scaleToLongEdge(1600, 1200, 2000), { width: 1600, height: 1200, scaled: false });
    assert.deepEqual(scaleToLongEdge(2000, 10, 2000), { width: 2000, height: 10, scaled: false });
    assert.deepEqual(scaleToLongEdge(8000, 1, 2000), { width: 2000, height: 1, scaled: true });
  });
  it('takes the file time when plausible, else now', () => {
    assert.equal(takenAtOf(NOW - 3_600_000, NOW), new Date(NOW - 3_600_000).toISOString());
    assert.equal(takenAtOf(NOW + 86_400_000, NOW), new Date(NOW).toISOString());
    assert.equal(takenAtOf(0, NOW), new Date(NOW).toISOString());
    assert.equal(takenAtOf(undefined, NOW), new Date(NOW).toISOString());
  });
  it('reads EXIF date-times', () => {
    assert.equal(exifTimeMs('2026:03:04 05:06:07'), new Date(2026, 2, 4, 5, 6, 7).getTime());
    assert.equal(exifTimeMs('not a date'), null);
    assert.equal(exifTimeMs(undefined), null);
  });
});

// ---------- the loop, against fakes ----------

function fakeStore(): PhotoFileStore & { kept: Map<string, LocalPhoto> } {
  const kept = new Map<string, LocalPhoto>();
  return {
    kept,
    list: async () => [...kept.values()].map((photo) => ({ photo, uri: `blob:${photo.id}` })),
    put: async (_u, photo) => {
      kept.set(photo.id, photo);
      return `blob:${photo.id}`;
    },
    update: async (_u, id, change) => {
      const p = kept.get(id);
      if (p) kept.set(id, { ...p, ...change });
    },
    part: async (_u, id): Promise<UploadPart | null> => (kept.has(id) ? { uri: `file:${id}`, name: `${id}.jpg`, type: 'image/jpeg' } : null),
    remove: async (_u, id) => {
      kept.delete(id);
    },
  };
}

const flush = async () => {
  for (let i = 0; i < 10; i++) await new Promise((r) => setImmediate(r));
};

function harness(initial: LocalPhoto[] = []) {
  const files = fakeStore();
  for (const p of initial) files.kept.set(p.id, p);
  const state = {
    now: NOW,
    online: true,
    rows: new Map<string, { uploaded: boolean }>(),
    queued: new Set<string>(),
    answers: [] as UploadAnswer[],
    uploads: [] as string[],
    warmOk: true,
    stored: 0,
    onChange: () => undefined as void,
    onOnline: () => undefined as void,
  };
  const uploader = new PhotoUploader({
    userId: 'u1',
    files,
    rows: () => ({ row: (b, id) => (b === 'b1' ? state.rows.get(id) : null), queued: (id) => state.queued.has(id) }),
    isOnline: () => state.online,
    subscribe: (cb) => {
      state.onChange = cb;
      return () => undefined;
    },
    subscribeOnline: (cb) => {
      state.onOnline = cb;
      return () => undefined;
    },
    upload: (id, _part, _sha, onProgress) => {
      state.uploads.push(id);
      onProgress(0.5);
      const answer = state.answers.shift() ?? { status: 200, body: {} };
      return { done: Promise.resolve(answer), abort: () => undefined };
    },
    warm: async () => state.warmOk,
    afterStored: () => void state.stored++,
    now: () => state.now,
    random: () => 1,
  });
  return { files, state, uploader };
}

const photo = (id: string, savedAt = NOW - 1000): LocalPhoto => ({
  id, buildingId: 'b1', sha256: 'a'.repeat(64), bytes: 1234, contentType: 'image/jpeg', savedAt, refused: null,
});

describe('PhotoUploader', () => {
  it('waits for the row, retries a 404 after its backoff, and drops the bytes once the pulled row says uploaded', async () => {
    const { files, state, uploader } = harness();
    await uploader.start();
    await uploader.add(photo('p1'), { uri: 'file:x' });
    // the row is queued but not pushed: no request at all
    state.rows.set('p1', { uploaded: false });
    state.queued.add('p1');
    uploader.tick();
    await flush();
    assert.deepEqual(state.uploads, []);
    assert.equal(uploader.getSnapshot().photos.p1.phase, 'waiting-row');

    // pushed, but the server has not got it yet (another tab's push, a race): 404, then retry
    state.queued.delete('p1');
    state.answers.push({ status: 404, body: { error: { code: 'not_found', message: 'Photo not found' } } });
    uploader.tick();
    await flush();
    assert.deepEqual(state.uploads, ['p1']);
    assert.equal(uploader.getSnapshot().photos.p1.phase, 'retrying');
    uploader.tick();
    await flush();
    assert.equal(state.uploads.length, 1, 'no retry before the backoff');

    state.now += RETRY_BASE_MS + 1;
    uploader.tick();
    await flush();
    assert.equal(state.uploads.length, 2);
    assert.equal(uploader.getSnapshot().photos.p1.phase, 'accepted');
    assert.equal(state.stored, 1, 'a pull is asked for');
    assert.ok(files.kept.has('p1'), 'the bytes stay the picture until the pull says uploaded');

    state.rows.set('p1', { uploaded: true });
    uploader.tick();
    await flush();
    assert.ok(files.kept.has('p1'), 'kept a few seconds more, until the persisted cache has the row');
    state.now += SYNCED_SETTLE_MS;
    uploader.tick();
    await flush();
    assert.equal(files.kept.has('p1'), false);
    assert.equal(uploader.getSnapshot().photos.p1, undefined);
    uploader.stop();
  });

  it('a refusal stops the retries, and is kept with the bytes so a reload does not send them again', async () => {
    const { files, state, uploader } = harness([photo('p1')]);
    state.rows.set('p1', { uploaded: false });
    state.answers.push({ status: 415, body: { error: { code: 'unsupported_type', message: 'Only JPEG, PNG, WebP and HEIC photos are accepted' } } });
    await uploader.start();
    await flush();
    assert.equal(uploader.getSnapshot().photos.p1.phase, 'refused');
    assert.deepEqual(files.kept.get('p1')?.refused, { status: 415, reason: 'Only JPEG, PNG, WebP and HEIC photos are accepted' });
    state.now += RETRY_CAP_MS * 10;
    uploader.tick();
    await flush();
    assert.equal(state.uploads.length, 1);
    uploader.stop();

    const reloaded = new PhotoUploader({
      userId: 'u1', files, rows: () => ({ row: () => ({ uploaded: false }), queued: () => false }), isOnline: () => true,
      subscribe: () => () => undefined, subscribeOnline: () => () => undefined,
      upload: () => assert.fail('a refused photo is not sent again'), warm: async () => true, afterStored: () => undefined,
    });
    await reloaded.start();
    await flush();
    assert.equal(reloaded.getSnapshot().photos.p1.phase, 'refused');
    reloaded.stop();
  });

  it('no answer waits for the signal, then goes at once when the API answers again', async () => {
    const { state, uploader } = harness([photo('p1')]);
    state.rows.set('p1', { uploaded: false });
    state.answers.push({ status: 0, body: null });
    await uploader.start();
    await flush();
    assert.equal(state.uploads.length, 1);
    state.online = false;
    uploader.tick();
    assert.equal(uploader.getSnapshot().photos.p1.phase, 'waiting-signal');
    state.online = true;
    state.onOnline();
    await flush();
    assert.equal(state.uploads.length, 2, 'sent as soon as the signal is back, not after the backoff');
    uploader.stop();
  });

  it('sends one at a time, oldest first, and shows the others as next in line', async () => {
    const { state, uploader } = harness([photo('late', NOW - 10), photo('early', NOW - 500)]);
    state.rows.set('late', { uploaded: false });
    state.rows.set('early', { uploaded: false });
    await uploader.start();
    assert.equal(uploader.getSnapshot().photos.late.phase, 'next');
    await flush();
    assert.deepEqual(state.uploads, ['early', 'late']);
    uploader.stop();
  });

  it('keeps the bytes while the building copy is not on the device, and drops them for a deleted photo', async () => {
    const files = fakeStore();
    files.kept.set('gone', photo('gone', NOW - ORPHAN_GRACE_MS - 5));
    files.kept.set('elsewhere', { ...photo('elsewhere', NOW - ORPHAN_GRACE_MS * 3), buildingId: 'b2' });
    const uploader = new PhotoUploader({
      userId: 'u1', files, rows: () => ({ row: (b) => (b === 'b1' ? undefined : null), queued: () => false }), isOnline: () => true,
      subscribe: () => () => undefined, subscribeOnline: () => () => undefined,
      upload: () => assert.fail('nothing to send'), warm: async () => true, afterStored: () => undefined, now: () => NOW,
    });
    await uploader.start();
    await flush();
    assert.deepEqual([...files.kept.keys()], ['elsewhere']);
    uploader.stop();
  });

  it('keeps the bytes when the server thumbnail would not load, and tries again later', async () => {
    const { files, state, uploader } = harness([photo('p1')]);
    state.rows.set('p1', { uploaded: true });
    state.warmOk = false;
    await uploader.start();
    await flush();
    state.now += SYNCED_SETTLE_MS;
    uploader.tick();
    await flush();
    assert.ok(files.kept.has('p1'));
    assert.equal(uploader.getSnapshot().photos.p1.attempt.warmFailures, 1);
    state.warmOk = true;
    state.now += RETRY_BASE_MS + 1;
    uploader.tick();
    await flush();
    assert.equal(files.kept.has('p1'), false);
    uploader.stop();
  });
});
