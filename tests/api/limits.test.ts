/**
 * Limits against abuse: sign-in per address across accounts (password spraying) and per account,
 * counting failures only; password-reset e-mails per address; uploads at once per user; the pixel
 * count of a photo; the declared size of a photo against its bytes; the Secure session cookie in
 * production. Every request here comes from one address (loopback), which is the point.
 */
import assert from 'node:assert/strict';
import http from 'node:http';
import type { AddressInfo } from 'node:net';
import { after, before, describe, it } from 'node:test';
import { crc32, deflateSync } from 'node:zlib';
import sharp from 'sharp';
import request from 'supertest';
import { uuidv7 } from 'uuidv7';
import { createApp } from '../../server/app';
import { readConfig, type Config } from '../../server/config';
import { Photo } from '../../server/entities';
import { sha256Hex } from '../../server/services/photos';
import { DEMO_PASSWORD } from '../../scripts/demo-data';
import { demoIds, startApp, type TestContext } from './context';

/** The limits a server gets when the environment sets none. */
const DEFAULTS = readConfig({ NODE_ENV: 'test' });

const signIn = (app: TestContext['app'], email: string, password: string) =>
  request(app).post('/api/auth/sign-in').send({ email, password });

describe('sign-in limits', () => {
  it('limits one address signing in to many accounts (password spraying), with the default limits', async () => {
    const ctx = await startApp({
      config: {
        SIGN_IN_LIMIT: DEFAULTS.SIGN_IN_LIMIT,
        SIGN_IN_ADDRESS_LIMIT: DEFAULTS.SIGN_IN_ADDRESS_LIMIT,
        RESET_LIMIT: DEFAULTS.RESET_LIMIT,
      },
    });
    try {
      const statuses: number[] = [];
      let limited: request.Response | undefined;
      for (let i = 0; i < 60; i++) {
        const res = await signIn(ctx.app, `sprayed-${i}@example.test`, 'Summer2026!');
        statuses.push(res.status);
        if (res.status === 429) limited ??= res;
      }
      assert.ok(limited, `60 accounts from one address were never limited: ${statuses.join(' ')}`);
      assert.equal(limited.body.error.code, 'too_many_attempts');
      assert.ok(Number(limited.headers['retry-after']) > 0, 'Retry-After on the 429');
      assert.ok(statuses.every((s) => s === 401 || s === 429), statuses.join(' '));
      // a real account from that address is limited as well until the window passes
      assert.equal((await signIn(ctx.app, 'inspector@ampwright.test', DEMO_PASSWORD)).status, 429);
    } finally {
      await ctx.close();
    }
  });

  it('counts failed sign-ins only: a user signing in often is never locked out', async () => {
    const ctx = await startApp({ config: { SIGN_IN_LIMIT: 3, SIGN_IN_ADDRESS_LIMIT: 4 } });
    try {
      for (let i = 0; i < 8; i++) {
        assert.equal((await signIn(ctx.app, 'inspector@ampwright.test', DEMO_PASSWORD)).status, 200, `sign-in ${i + 1}`);
      }
      // failures still count: three for one account, then that account is limited
      for (let i = 0; i < 3; i++) assert.equal((await signIn(ctx.app, 'inspector@ampwright.test', 'guess')).status, 401);
      assert.equal((await signIn(ctx.app, 'inspector@ampwright.test', 'guess')).status, 429);
      // and one more failure elsewhere reaches the address's limit of four
      assert.equal((await signIn(ctx.app, 'owner@ampwright.test', 'guess')).status, 401);
      assert.equal((await signIn(ctx.app, 'admin@ampwright.test', DEMO_PASSWORD)).status, 429);
    } finally {
      await ctx.close();
    }
  });
});

describe('password-reset limits', () => {
  it('limits reset e-mails from one address to many addresses, with the default limits', async () => {
    const ctx = await startApp({
      config: { SIGN_IN_LIMIT: DEFAULTS.SIGN_IN_LIMIT, RESET_LIMIT: DEFAULTS.RESET_LIMIT },
    });
    try {
      const statuses: number[] = [];
      let limited: request.Response | undefined;
      for (let i = 0; i < 40; i++) {
        const res = await request(ctx.app).post('/api/auth/forgot-password').send({ email: `flood-${i}@example.test` });
        statuses.push(res.status);
        if (res.status === 429) limited ??= res;
      }
      assert.ok(limited, `40 reset e-mails from one address were never limited: ${statuses.join(' ')}`);
      assert.equal(limited.body.error.code, 'too_many_attempts');
      assert.ok(Number(limited.headers['retry-after']) > 0, 'Retry-After on the 429');
    } finally {
      await ctx.close();
    }
  });

  it('takes its limit from the configuration', async () => {
    const ctx = await startApp({ config: { RESET_LIMIT: 2 } });
    try {
      const ask = (email: string) => request(ctx.app).post('/api/auth/forgot-password').send({ email });
      assert.equal((await ask('one@example.test')).status, 200);
      assert.equal((await ask('two@example.test')).status, 200);
      assert.equal((await ask('three@example.test')).status, 429);
    } finally {
      await ctx.close();
    }
  });
});

describe('the session cookie in production', () => {
  let ctx: TestContext;
  before(async () => (ctx = await startApp()));
  after(() => ctx.close());

  const production = (extra: Partial<Config> = {}) =>
    createApp({ dataSource: ctx.ds, config: { ...readConfig(), NODE_ENV: 'production', ...extra } });
  const sessionCookie = (res: request.Response) =>
    ((res.headers['set-cookie'] as unknown as string[] | undefined) ?? []).find((c) => c.startsWith('ampwright.sid='));

  it('is Secure by default: never sent over plain http, Secure over https through a trusted proxy', async () => {
    const plain = production();
    try {
      const res = await request(plain).post('/api/auth/sign-in').send({ email: 'admin@ampwright.test', password: DEMO_PASSWORD });
      const cookie = sessionCookie(res);
      assert.ok(!cookie || /;\s*Secure/i.test(cookie), `a session cookie without Secure in production: ${cookie}`);
    } finally {
      await plain.closeResources();
    }
    const proxied = production({ TRUST_PROXY: '1' });
    try {
      const res = await request(proxied)
        .post('/api/auth/sign-in')
        .set('X-Forwarded-Proto', 'https')
        .send({ email: 'admin@ampwright.test', password: DEMO_PASSWORD })
        .expect(200);
      assert.match(sessionCookie(res) ?? '', /;\s*Secure/i);
    } finally {
      await proxied.closeResources();
    }
  });

  it('COOKIE_SECURE=0 turns it off for a plain-http setup', async () => {
    const app = production({ COOKIE_SECURE: '0' });
    try {
      const res = await request(app)
        .post('/api/auth/sign-in')
        .send({ email: 'admin@ampwright.test', password: DEMO_PASSWORD })
        .expect(200);
      const cookie = sessionCookie(res);
      assert.ok(cookie, 'a session cookie');
      assert.doesNotMatch(cookie, /;\s*Secure/i);
    } finally {
      await app.closeResources();
    }
  });
});

// ---------- uploads ----------

/** A valid PNG, 1-bit grey, built by hand (zlib) so that a huge pixel count costs no encoding time. */
function bigPng(width: number, height: number): Buffer {
  const chunk = (type: string, data: Buffer) => {
    const body = Buffer.concat([Buffer.from(type, 'latin1'), data]);
    const length = Buffer.alloc(4);
    length.writeUInt32BE(data.length);
    const crc = Buffer.alloc(4);
    crc.writeUInt32BE(crc32(body));
    return Buffer.concat([length, body, crc]);
  };
  const header = Buffer.alloc(13);
  header.writeUInt32BE(width, 0);
  header.writeUInt32BE(height, 4);
  header[8] = 1; // bit depth
  header[9] = 0; // greyscale
  // every row: filter byte 0, then width bits of black
  const raw = Buffer.alloc(height * (1 + Math.ceil(width / 8)));
  return Buffer.concat([
    Buffer.from([0x89, 0x50, 0x4e, 0x47, 0x0d, 0x0a, 0x1a, 0x0a]),
    chunk('IHDR', header),
    chunk('IDAT', deflateSync(raw, { level: 9 })),
    chunk('IEND', Buffer.alloc(0)),
  ]);
}

let pictures = 0;
async function jpeg(): Promise<Buffer> {
  pictures += 1;
  return sharp({ create: { width: 400, height: 300, channels: 3, background: { r: pictures * 40, g: 90, b: 200 } } })
    .jpeg()
    .toBuffer();
}

describe('upload limits', () => {
  let ctx: TestContext;
  let clinicId: string;
  let server: http.Server;
  let base: string;
  let cookie: string;

  before(async () => {
    ctx = await startApp();
    clinicId = (await demoIds(ctx.ds)).clinicId;
    server = ctx.app.listen(0, '127.0.0.1');
    await new Promise((r) => server.once('listening', r));
    base = `http://127.0.0.1:${(server.address() as AddressInfo).port}`;
    const res = await fetch(`${base}/api/auth/sign-in`, {
      method: 'POST',
      headers: { 'content-type': 'application/json' },
      body: JSON.stringify({ email: 'electrician@ampwright.test', password: DEMO_PASSWORD }),
    });
    cookie = res.headers.getSetCookie()[0].split(';')[0];
  });
  after(async () => {
    server.closeAllConnections();
    await new Promise((r) => server.close(r));
    await ctx.close();
  });

  async function photoRow(bytes: Buffer, contentType: 'image/jpeg' | 'image/png', declaredBytes = bytes.length) {
    const id = uuidv7();
    await ctx.ds.getRepository(Photo).insert({
      id,
      buildingId: clinicId,
      parentKind: 'deficiency',
      parentId: uuidv7(),
      purpose: 'finding',
      sha256: sha256Hex(bytes),
      bytes: declaredBytes,
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

  function multipart(bytes: Buffer, type: string) {
    const boundary = `----ampwright${uuidv7()}`;
    const head = Buffer.from(
      `--${boundary}\r\nContent-Disposition: form-data; name="photo"; filename="p"\r\nContent-Type: ${type}\r\n\r\n`,
    );
    return { body: Buffer.concat([head, bytes, Buffer.from(`\r\n--${boundary}--\r\n`)]), type: `multipart/form-data; boundary=${boundary}` };
  }

  async function upload(photoId: string, bytes: Buffer, type = 'image/jpeg') {
    const form = multipart(bytes, type);
    const res = await fetch(`${base}/api/photos/${photoId}`, {
      method: 'PUT',
      headers: { cookie, 'content-type': form.type, 'x-content-sha256': sha256Hex(bytes) },
      body: form.body,
    });
    return { status: res.status, headers: res.headers, body: (await res.json()) as { error?: { code: string; message: string; fields?: Record<string, string> } } };
  }

  /** An upload whose body stops halfway: the server waits for the rest, the upload stays in flight. */
  function stalledUpload(photoId: string, bytes: Buffer): Promise<http.ClientRequest> {
    const form = multipart(bytes, 'image/jpeg');
    const req = http.request(`${base}/api/photos/${photoId}`, {
      method: 'PUT',
      headers: {
        cookie,
        'content-type': form.type,
        'content-length': String(form.body.length),
        'x-content-sha256': sha256Hex(bytes),
      },
    });
    req.on('error', () => undefined); // aborted on purpose below
    req.write(form.body.subarray(0, form.body.length >> 1));
    // give the server the time to take it in (it reads the headers and waits for the body)
    return new Promise((resolve) => setTimeout(() => resolve(req), 300));
  }

  it('takes at most three uploads at once from one user: the fourth answers 429 with Retry-After', async () => {
    const stalled: http.ClientRequest[] = [];
    try {
      for (let i = 0; i < 3; i++) {
        const bytes = await jpeg();
        stalled.push(await stalledUpload(await photoRow(bytes, 'image/jpeg'), bytes));
      }
      const bytes = await jpeg();
      const id = await photoRow(bytes, 'image/jpeg');
      const res = await upload(id, bytes);
      assert.equal(res.status, 429, JSON.stringify(res.body));
      assert.equal(res.body.error?.code, 'too_many_uploads');
      assert.ok(Number(res.headers.get('retry-after')) > 0, 'Retry-After');

      // the stalled ones give up: their places free up, and the same upload goes through
      for (const req of stalled.splice(0)) req.destroy();
      let status = 0;
      for (let i = 0; i < 20 && status !== 200; i++) {
        status = (await upload(id, bytes)).status;
        if (status !== 200) await new Promise((r) => setTimeout(r, 100));
      }
      assert.equal(status, 200);
    } finally {
      for (const req of stalled) req.destroy();
    }
  });

  it('refuses a photo of more than 50 megapixels with 413 too_many_pixels', async () => {
    const png = bigPng(8000, 6500); // 52 MP
    const id = await photoRow(png, 'image/png');
    const res = await upload(id, png, 'image/png');
    assert.equal(res.status, 413, JSON.stringify(res.body));
    assert.equal(res.body.error?.code, 'too_many_pixels');
    assert.match(res.body.error?.message ?? '', /8000 × 6500/);
    // 48 MP is still a photo
    const fine = bigPng(8000, 6000);
    assert.equal((await upload(await photoRow(fine, 'image/png'), fine, 'image/png')).status, 200);
  });

  it('checks the size the photo row declares against the bytes received: 400 naming bytes', async () => {
    const bytes = await jpeg();
    const id = await photoRow(bytes, 'image/jpeg', bytes.length + 1);
    const res = await upload(id, bytes);
    assert.equal(res.status, 400, JSON.stringify(res.body));
    assert.ok(res.body.error?.fields?.bytes, JSON.stringify(res.body));
    assert.match(res.body.error?.fields?.bytes ?? '', new RegExp(`${bytes.length + 1}.*${bytes.length}`));
  });
});
