/**
 * Photo bytes: `PUT /api/photos/:id`, `GET /api/photos/:id` and `…/thumb` against the real test
 * database and the local fake S3 that `npm test` starts (S3_* in the environment). The photo rows
 * are made here with the Photo entity, as the sync push would make them; the images are made with
 * sharp. `fixtures/gps.heic` is a 64×48 HEIC with GPS EXIF, made once with Debian's `heif-enc`
 * (libheif 1.15 + x265) from a sharp JPEG, because the sharp build from npm cannot encode HEVC.
 */
import assert from 'node:assert/strict';
import fs from 'node:fs';
import path from 'node:path';
import { after, before, describe, it } from 'node:test';
import bcrypt from 'bcryptjs';
import exifr from 'exifr';
import sharp from 'sharp';
import request from 'supertest';
import { uuidv7 } from 'uuidv7';
import { PHOTO_MAX_BYTES, type PhotoType } from '../../shared/records';
import { readConfig } from '../../server/config';
import { Photo } from '../../server/entities';
import { PhotoStore } from '../../server/services/photo-store';
import { sha256Hex } from '../../server/services/photos';
import { demoIds, makeForeignOrganisation, ROLES, startApp, type RoleName, type TestContext } from './context';

let ctx: TestContext;
let ids: Awaited<ReturnType<typeof demoIds>>;
let foreign: Awaited<ReturnType<typeof makeForeignOrganisation>>;
let store: PhotoStore;
const agents = {} as Record<RoleName, request.Agent>;
/** an admin of the other organisation */
let stranger: request.Agent;

const FOREIGN_EMAIL = `stranger-${Date.now()}@elsewhere.test`;
const FOREIGN_PASSWORD = 'elsewhere-password';

before(async () => {
  ctx = await startApp();
  ids = await demoIds(ctx.ds);
  foreign = await makeForeignOrganisation(ctx.ds);
  for (const role of ROLES) agents[role] = await ctx.signIn(role);
  store = new PhotoStore(readConfig());

  const userId = uuidv7();
  await ctx.ds.query(`INSERT INTO app_user (id, email, name, password_hash) VALUES ($1, $2, 'Ida Stranger', $3)`, [
    userId,
    FOREIGN_EMAIL,
    await bcrypt.hash(FOREIGN_PASSWORD, 4),
  ]);
  await ctx.ds.query(`INSERT INTO membership (id, user_id, organisation_id, role) VALUES ($1, $2, $3, 'admin')`, [
    uuidv7(),
    userId,
    foreign.organisationId,
  ]);
  stranger = request.agent(ctx.app);
  await stranger.post('/api/auth/sign-in').send({ email: FOREIGN_EMAIL, password: FOREIGN_PASSWORD }).expect(200);
});
after(async () => {
  store.close();
  await ctx.close();
});

// ---------- helpers ----------

const GPS_EXIF = {
  IFD0: { Make: 'Ampwright test camera' },
  IFD3: { GPSLatitudeRef: 'N', GPSLatitude: '51/1 30/1 0/1', GPSLongitudeRef: 'W', GPSLongitude: '0/1 7/1 0/1' },
};
let pictures = 0;

/** A real image, different from every other one made here (so each has its own hash). */
async function picture(
  format: 'jpeg' | 'png' | 'webp',
  options: { width?: number; height?: number; gps?: boolean } = {},
): Promise<Buffer> {
  pictures += 1;
  let image = sharp({
    create: {
      width: options.width ?? 1200,
      height: options.height ?? 900,
      channels: 3,
      background: { r: (pictures * 37) % 256, g: (pictures * 91) % 256, b: 120 },
    },
  });
  if (options.gps) image = image.withExif(GPS_EXIF);
  return image.toFormat(format).toBuffer();
}

/** A photo row in a building, as the sync push makes it: not uploaded, version 1. */
async function photoRow(bytes: Buffer, contentType: PhotoType, buildingId = ids.clinicId): Promise<string> {
  const id = uuidv7();
  await ctx.ds.getRepository(Photo).insert({
    id,
    buildingId,
    parentKind: 'deficiency',
    parentId: uuidv7(),
    purpose: 'finding',
    sha256: sha256Hex(bytes),
    bytes: bytes.length,
    contentType,
    width: null,
    height: null,
    takenAt: new Date('2026-03-02T09:30:00Z'),
    caption: '',
    uploaded: false,
    updatedAt: '2026-03-02T09:30:00.000Z-0000-test',
    updatedBy: null,
    deletedAt: null,
    version: '1',
    fieldMeta: {},
  });
  return id;
}

function upload(
  agent: request.Agent,
  photoId: string,
  bytes: Buffer,
  options: { filename?: string; partType?: string; sha?: string } = {},
) {
  return agent
    .put(`/api/photos/${photoId}`)
    .set('x-content-sha256', options.sha ?? sha256Hex(bytes))
    .attach('photo', bytes, { filename: options.filename ?? 'photo.jpg', contentType: options.partType ?? 'image/jpeg' });
}

/** Read an image answer as bytes (supertest would otherwise leave the body empty). */
function download(agent: request.Agent, url: string) {
  return agent
    .get(url)
    .buffer(true)
    .parse((res, done) => {
      const chunks: Buffer[] = [];
      res.on('data', (chunk: Buffer) => chunks.push(chunk));
      res.on('end', () => done(null, Buffer.concat(chunks)));
    });
}

async function photoState(photoId: string) {
  const [row] = await ctx.ds.query(
    `SELECT p.uploaded, p.version::int AS version, p.updated_at, p.field_meta, b.version::int AS building_version
       FROM photo p JOIN building b ON b.id = p.building_id WHERE p.id = $1`,
    [photoId],
  );
  return row as { uploaded: boolean; version: number; updated_at: string; field_meta: Record<string, unknown>; building_version: number };
}

/** A refused upload leaves no object in S3 and the row not uploaded. */
async function assertNothingStored(photoId: string) {
  assert.equal(await store.head(photoId, 'original'), null, 'no original in S3');
  assert.equal(await store.head(photoId, 'thumb'), null, 'no thumbnail in S3');
  assert.equal((await photoState(photoId)).uploaded, false, 'the row is still not uploaded');
}

function assertError(res: request.Response, status: number, code: string) {
  assert.equal(res.status, status, JSON.stringify(res.body));
  assert.equal(res.body.error.code, code);
  assert.equal(typeof res.body.error.message, 'string');
}

/** GPS as a reader independent of the server's ExifTool sees it: sharp extracts EXIF, exifr parses it. */
async function gpsOf(bytes: Buffer) {
  const exif = (await sharp(bytes).metadata()).exif;
  if (!exif) return { gps: undefined, make: undefined };
  const tiff = exif.subarray(0, 6).toString('latin1') === 'Exif\0\0' ? exif.subarray(6) : exif;
  return { gps: await exifr.gps(tiff), make: (await exifr.parse(tiff, ['Make']))?.Make as string | undefined };
}

async function setKeepLocation(keep: boolean) {
  const [org] = await ctx.ds.query(`SELECT organisation_id FROM building WHERE id = $1`, [ids.clinicId]);
  await ctx.ds.query(
    `UPDATE organisation SET settings = settings || jsonb_build_object('keepPhotoLocation', $2::boolean) WHERE id = $1`,
    [org.organisation_id, keep],
  );
}

// ---------- tests ----------

describe('uploading a photo', () => {
  it('a JPEG uploads: the row becomes uploaded with a new version, and both variants download', async () => {
    const jpeg = await picture('jpeg');
    const id = await photoRow(jpeg, 'image/jpeg');
    const before = await photoState(id);

    // nothing to see before the bytes arrive
    assertError(await agents.inspector.get(`/api/photos/${id}`), 404, 'not_uploaded');
    assertError(await agents.inspector.get(`/api/photos/${id}/thumb`), 404, 'not_uploaded');

    const res = await upload(agents.electrician, id, jpeg).expect(200);
    assert.equal(res.body.uploaded, true);
    assert.equal(res.body.unchanged, false);
    assert.equal(res.body.thumbnail, true);

    const afterUpload = await photoState(id);
    assert.equal(afterUpload.uploaded, true);
    assert.ok(afterUpload.version > before.version, 'the photo version rose, so devices pull it');
    assert.equal(afterUpload.version, afterUpload.building_version, 'stamped with the bumped building version');
    assert.equal(res.body.version, afterUpload.version);
    assert.ok(afterUpload.updated_at > before.updated_at, 'a fresh server stamp');
    assert.ok(afterUpload.field_meta.uploaded, 'the field is stamped for the merge');

    const original = await download(agents.inspector, `/api/photos/${id}`).expect(200);
    assert.equal(original.headers['content-type'], 'image/jpeg');
    assert.match(original.headers['cache-control'], /^private\b/);
    const meta = await sharp(original.body as Buffer).metadata();
    assert.equal(meta.format, 'jpeg');
    assert.deepEqual([meta.width, meta.height], [1200, 900]);

    const thumb = await download(agents.admin, `/api/photos/${id}/thumb`).expect(200);
    assert.equal(thumb.headers['content-type'], 'image/webp');
    assert.match(thumb.headers['cache-control'], /^private\b/);
    const thumbMeta = await sharp(thumb.body as Buffer).metadata();
    assert.equal(thumbMeta.format, 'webp');
    assert.deepEqual([thumbMeta.width, thumbMeta.height], [320, 240]);

    // the owner to whom the clinic is granted may look
    await download(agents.owner, `/api/photos/${id}`).expect(200);
  });

  for (const [format, type] of [
    ['png', 'image/png'],
    ['webp', 'image/webp'],
  ] as const) {
    it(`a ${format.toUpperCase()} is accepted and served as ${type}`, async () => {
      const bytes = await picture(format, { width: 400, height: 800 });
      const id = await photoRow(bytes, type);
      await upload(agents.admin, id, bytes, { filename: `photo.${format}`, partType: type }).expect(200);
      const original = await download(agents.electrician, `/api/photos/${id}`).expect(200);
      assert.equal(original.headers['content-type'], type);
      assert.equal((await sharp(original.body as Buffer).metadata()).format, format);
      const thumb = await download(agents.electrician, `/api/photos/${id}/thumb`).expect(200);
      const thumbMeta = await sharp(thumb.body as Buffer).metadata();
      assert.deepEqual([thumbMeta.width, thumbMeta.height], [160, 320]);
    });
  }

  it('the bytes decide, not the name: a real JPEG sent as x.txt (text/plain) is accepted when its row says JPEG', async () => {
    const jpeg = await picture('jpeg', { width: 200, height: 100 });
    const id = await photoRow(jpeg, 'image/jpeg');
    await upload(agents.inspector, id, jpeg, { filename: 'x.txt', partType: 'text/plain' }).expect(200);
    const original = await download(agents.inspector, `/api/photos/${id}`).expect(200);
    assert.equal(original.headers['content-type'], 'image/jpeg');
  });

  it('a real image of another type than its row records is refused with 415 type_mismatch', async () => {
    const jpeg = await picture('jpeg', { width: 200, height: 100 });
    const id = await photoRow(jpeg, 'image/png');
    const res = await upload(agents.inspector, id, jpeg, { filename: 'x.png', partType: 'image/png' });
    assertError(res, 415, 'type_mismatch');
    assert.match(res.body.error.message, /recorded as PNG but the file is a JPEG/);
    await assertNothingStored(id);
  });

  it('a text file named .jpg is refused with 415 and a clear message', async () => {
    const text = Buffer.from('These are my notes about panel LA, not a picture.\n');
    const id = await photoRow(text, 'image/jpeg');
    const res = await upload(agents.electrician, id, text, { filename: 'panel.jpg', partType: 'image/jpeg' });
    assertError(res, 415, 'unsupported_type');
    assert.match(res.body.error.message, /Only JPEG, PNG, WebP and HEIC/);
    await assertNothingStored(id);
  });

  it('a file that starts like a JPEG but is cut off early is refused with 415', async () => {
    const jpeg = await picture('jpeg');
    const truncated = jpeg.subarray(0, 400);
    const id = await photoRow(truncated, 'image/jpeg');
    assertError(await upload(agents.electrician, id, truncated), 415, 'unreadable_photo');
    await assertNothingStored(id);
  });

  it('0 bytes are refused with 400', async () => {
    const empty = Buffer.alloc(0);
    const id = await photoRow(empty, 'image/jpeg');
    assertError(await upload(agents.electrician, id, empty), 400, 'invalid');
    await assertNothingStored(id);
  });

  it('a request without the photo field is refused with 400', async () => {
    const jpeg = await picture('jpeg', { width: 50, height: 50 });
    const id = await photoRow(jpeg, 'image/jpeg');
    const res = await agents.electrician.put(`/api/photos/${id}`).set('x-content-sha256', sha256Hex(jpeg)).field('note', 'x');
    assertError(res, 400, 'invalid');
    await assertNothingStored(id);
  });

  it('more than PHOTO_MAX_BYTES is refused with 413 in the API error shape', async () => {
    const jpeg = await picture('jpeg', { width: 64, height: 64 });
    const big = Buffer.concat([jpeg, Buffer.alloc(PHOTO_MAX_BYTES + 1 - jpeg.length, 7)]);
    const id = await photoRow(big, 'image/jpeg');
    const res = await upload(agents.electrician, id, big);
    assertError(res, 413, 'too_large');
    await assertNothingStored(id);
  });

  it('bytes that do not match x-content-sha256 (damaged on the way) are refused with 400', async () => {
    const jpeg = await picture('jpeg', { width: 300, height: 200 });
    const id = await photoRow(jpeg, 'image/jpeg');
    const damaged = Buffer.from(jpeg);
    damaged[damaged.length - 10] ^= 0xff;
    assertError(await upload(agents.electrician, id, damaged, { sha: sha256Hex(jpeg) }), 400, 'checksum_mismatch');
    await assertNothingStored(id);
  });

  it('a missing or malformed x-content-sha256 is refused with 400', async () => {
    const jpeg = await picture('jpeg', { width: 60, height: 40 });
    const id = await photoRow(jpeg, 'image/jpeg');
    const res = await agents.electrician.put(`/api/photos/${id}`).attach('photo', jpeg, 'photo.jpg');
    assertError(res, 400, 'invalid');
    assert.ok(res.body.error.fields['x-content-sha256']);
    assertError(await upload(agents.electrician, id, jpeg, { sha: 'abc' }), 400, 'invalid');
    await assertNothingStored(id);
  });

  it('bytes other than the ones the row records are a 409, before and after an upload', async () => {
    const recorded = await picture('jpeg', { width: 300, height: 200 });
    const other = await picture('jpeg', { width: 300, height: 200 });
    const id = await photoRow(recorded, 'image/jpeg');
    assertError(await upload(agents.electrician, id, other), 409, 'photo_conflict');
    await assertNothingStored(id);

    await upload(agents.electrician, id, recorded).expect(200);
    const stored = await store.head(id, 'original');
    const state = await photoState(id);
    assertError(await upload(agents.electrician, id, other), 409, 'photo_conflict');
    assert.deepEqual(await store.head(id, 'original'), stored, 'the stored photo is untouched');
    assert.equal((await photoState(id)).version, state.version);
  });

  it('the same bytes again are a 200 no-op: no new version, nothing rewritten', async () => {
    const jpeg = await picture('jpeg', { width: 300, height: 200 });
    const id = await photoRow(jpeg, 'image/jpeg');
    const first = await upload(agents.electrician, id, jpeg).expect(200);
    const state = await photoState(id);
    const again = await upload(agents.inspector, id, jpeg).expect(200);
    assert.equal(again.body.unchanged, true);
    assert.equal(again.body.version, first.body.version);
    const now = await photoState(id);
    assert.equal(now.version, state.version);
    assert.equal(now.building_version, state.building_version, 'the building was not bumped');
  });
});

describe('who may upload and look', () => {
  it('signed out: 401', async () => {
    const jpeg = await picture('jpeg', { width: 40, height: 40 });
    const id = await photoRow(jpeg, 'image/jpeg');
    assertError(await upload(request.agent(ctx.app), id, jpeg), 401, 'unauthorised');
    assertError(await request(ctx.app).get(`/api/photos/${id}`), 401, 'unauthorised');
  });

  it('an owner may look at a granted building but not upload (403)', async () => {
    const jpeg = await picture('jpeg', { width: 40, height: 40 });
    const id = await photoRow(jpeg, 'image/jpeg');
    assertError(await upload(agents.owner, id, jpeg), 403, 'forbidden');
    await assertNothingStored(id);
  });

  it('an owner gets 404 for a building not granted, on GET and PUT', async () => {
    const jpeg = await picture('jpeg', { width: 40, height: 40 });
    const id = await photoRow(jpeg, 'image/jpeg', ids.loftsId);
    assertError(await upload(agents.owner, id, jpeg), 404, 'not_found');
    await assertNothingStored(id);
    await upload(agents.admin, id, jpeg).expect(200);
    assertError(await agents.owner.get(`/api/photos/${id}`), 404, 'not_found');
    assertError(await agents.owner.get(`/api/photos/${id}/thumb`), 404, 'not_found');
    await download(agents.inspector, `/api/photos/${id}`).expect(200);
  });

  it('a user of another organisation gets 404 on GET and PUT, and ours get 404 for theirs', async () => {
    const jpeg = await picture('jpeg', { width: 40, height: 40 });
    const ours = await photoRow(jpeg, 'image/jpeg');
    assertError(await upload(stranger, ours, jpeg), 404, 'not_found');
    await assertNothingStored(ours);
    await upload(agents.admin, ours, jpeg).expect(200);
    assertError(await stranger.get(`/api/photos/${ours}`), 404, 'not_found');
    assertError(await stranger.get(`/api/photos/${ours}/thumb`), 404, 'not_found');

    const theirsBytes = await picture('jpeg', { width: 40, height: 40 });
    const theirs = await photoRow(theirsBytes, 'image/jpeg', foreign.buildingId);
    assertError(await upload(agents.admin, theirs, theirsBytes), 404, 'not_found');
    await assertNothingStored(theirs);
    await upload(stranger, theirs, theirsBytes).expect(200);
    assertError(await agents.admin.get(`/api/photos/${theirs}`), 404, 'not_found');
  });

  it('an unknown photo id or one that is not a UUID: 404', async () => {
    const jpeg = await picture('jpeg', { width: 40, height: 40 });
    assertError(await upload(agents.admin, uuidv7(), jpeg), 404, 'not_found');
    assertError(await agents.admin.get(`/api/photos/${uuidv7()}`), 404, 'not_found');
    assertError(await agents.admin.get('/api/photos/not-a-uuid'), 404, 'not_found');
  });

  it('a deleted photo is not served', async () => {
    const jpeg = await picture('jpeg', { width: 40, height: 40 });
    const id = await photoRow(jpeg, 'image/jpeg');
    await upload(agents.admin, id, jpeg).expect(200);
    await ctx.ds.query(`UPDATE photo SET deleted_at = now() WHERE id = $1`, [id]);
    assertError(await agents.admin.get(`/api/photos/${id}`), 404, 'not_found');
  });
});

describe('location metadata', () => {
  for (const format of ['jpeg', 'png', 'webp'] as const) {
    it(`GPS is removed from a ${format.toUpperCase()} by default; the rest of its metadata stays`, async () => {
      const bytes = await picture(format, { width: 640, height: 480, gps: true });
      assert.equal((await gpsOf(bytes)).gps?.latitude, 51.5, 'the test picture carries GPS');
      const type = `image/${format}` as PhotoType;
      const id = await photoRow(bytes, type);
      await upload(agents.electrician, id, bytes, { filename: `p.${format}`, partType: type }).expect(200);

      const original = (await download(agents.admin, `/api/photos/${id}`).expect(200)).body as Buffer;
      const seen = await gpsOf(original);
      assert.equal(seen.gps, undefined, 'no GPS in the stored photo');
      assert.equal(seen.make, 'Ampwright test camera', 'other EXIF is kept');
      const pixels = await sharp(original).metadata();
      assert.deepEqual([pixels.format, pixels.width, pixels.height], [format, 640, 480]);

      const thumb = (await download(agents.admin, `/api/photos/${id}/thumb`).expect(200)).body as Buffer;
      assert.equal((await sharp(thumb).metadata()).exif, undefined, 'the thumbnail has no EXIF at all');
    });
  }

  it('GPS is kept, and the bytes stored as sent, when the organisation keeps photo location', async () => {
    await setKeepLocation(true);
    try {
      const jpeg = await picture('jpeg', { width: 640, height: 480, gps: true });
      const id = await photoRow(jpeg, 'image/jpeg');
      await upload(agents.electrician, id, jpeg).expect(200);
      const original = (await download(agents.admin, `/api/photos/${id}`).expect(200)).body as Buffer;
      assert.equal(sha256Hex(original), sha256Hex(jpeg), 'stored exactly as sent');
      const seen = await gpsOf(original);
      assert.equal(seen.gps?.latitude, 51.5);
      assert.ok(Math.abs((seen.gps?.longitude ?? 0) + 0.11667) < 1e-4);
      const thumb = (await download(agents.admin, `/api/photos/${id}/thumb`).expect(200)).body as Buffer;
      assert.equal((await sharp(thumb).metadata()).exif, undefined, 'thumbnails never carry metadata');
    } finally {
      await setKeepLocation(false);
    }
  });
});

describe('HEIC', () => {
  const heic = fs.readFileSync(path.join(__dirname, 'fixtures', 'gps.heic'));

  it('is accepted and stored with GPS removed, but has no thumbnail (404 no_thumbnail)', async () => {
    assert.equal((await gpsOf(heic)).gps?.latitude, 51.5, 'the fixture carries GPS');
    const id = await photoRow(heic, 'image/heic');
    const res = await upload(agents.inspector, id, heic, { filename: 'IMG_0001.HEIC', partType: 'image/heic' }).expect(200);
    assert.equal(res.body.thumbnail, false);
    assert.equal((await photoState(id)).uploaded, true);

    const original = await download(agents.admin, `/api/photos/${id}`).expect(200);
    assert.equal(original.headers['content-type'], 'image/heic');
    const seen = await gpsOf(original.body as Buffer);
    assert.equal(seen.gps, undefined, 'no GPS in the stored HEIC');
    assert.equal(seen.make, 'Ampwright test', 'other EXIF is kept');
    const meta = await sharp(original.body as Buffer).metadata();
    assert.deepEqual([meta.width, meta.height, meta.compression], [64, 48, 'hevc']);

    assertError(await agents.admin.get(`/api/photos/${id}/thumb`), 404, 'no_thumbnail');
    assert.equal(await store.head(id, 'thumb'), null);
  });
});
