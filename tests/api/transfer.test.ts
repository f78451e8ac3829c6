/**
 * What goes over a weak signal: compressed answers, caching of the web build, and a panel read
 * that does not load the per-field stamps it never sends.
 */
import assert from 'node:assert/strict';
import fs from 'node:fs';
import http from 'node:http';
import type { AddressInfo } from 'node:net';
import os from 'node:os';
import path from 'node:path';
import { after, before, describe, it } from 'node:test';
import zlib from 'node:zlib';
import request from 'supertest';
import type { Logger } from 'typeorm';
import { SCHEMA_VERSION } from '../../shared/sync';
import { createApp } from '../../server/app';
import { readConfig } from '../../server/config';
import { demoIds, makeForeignOrganisation, startApp, type TestContext } from './context';

let ctx: TestContext;
let ids: Awaited<ReturnType<typeof demoIds>>;

before(async () => {
  ctx = await startApp();
  ids = await demoIds(ctx.ds);
});
after(() => ctx.close());

/** A raw request to the app on a real socket, so the encoding on the wire is what we read. */
async function raw(method: string, url: string, headers: Record<string, string>, body?: unknown) {
  const server = ctx.app.listen(0, '127.0.0.1');
  await new Promise((resolve) => server.once('listening', resolve));
  try {
    const { port } = server.address() as AddressInfo;
    const payload = body === undefined ? undefined : JSON.stringify(body);
    return await new Promise<{ status: number; headers: http.IncomingHttpHeaders; bytes: Buffer }>((resolve, reject) => {
      const req = http.request(`http://127.0.0.1:${port}${url}`, {
        method,
        headers: { ...headers, ...(payload && { 'content-type': 'application/json' }) },
      });
      req.on('response', (res) => {
        const chunks: Buffer[] = [];
        res.on('data', (c: Buffer) => chunks.push(c));
        res.on('end', () => resolve({ status: res.statusCode!, headers: res.headers, bytes: Buffer.concat(chunks) }));
      });
      req.on('error', reject);
      req.end(payload);
    });
  } finally {
    server.close();
  }
}

/** A GET whose body is read as the bytes on the wire (no decoding). */
function fetchRaw(url: string, headers: Record<string, string>) {
  return new Promise<{ headers: http.IncomingHttpHeaders; bytes: Buffer }>((resolve, reject) => {
    http
      .get(url, { headers }, (res) => {
        const chunks: Buffer[] = [];
        res.on('data', (c: Buffer) => chunks.push(c));
        res.on('end', () => resolve({ headers: res.headers, bytes: Buffer.concat(chunks) }));
      })
      .on('error', reject);
  });
}

async function sessionCookie(): Promise<string> {
  const res = await request(ctx.app)
    .post('/api/auth/sign-in')
    .send({ email: 'electrician@ampwright.test', password: 'ampwright-demo' })
    .expect(200);
  return (res.headers['set-cookie'] as unknown as string[]).map((c) => c.split(';')[0]).join('; ');
}

describe('compressed answers', () => {
  const pull = { deviceId: 'transfer-test', schemaVersion: SCHEMA_VERSION, cursors: {} };

  for (const [encoding, decode] of [
    ['gzip', zlib.gunzipSync],
    ['br', zlib.brotliDecompressSync],
  ] as const) {
    it(`sends a JSON answer ${encoding}-compressed when the client accepts ${encoding}`, async () => {
      const cookie = await sessionCookie();
      const res = await raw('POST', '/api/sync/pull', { cookie, 'accept-encoding': encoding }, pull);
      assert.equal(res.status, 200);
      assert.equal(res.headers['content-encoding'], encoding);
      assert.match(String(res.headers.vary), /accept-encoding/i);
      const text = decode(res.bytes).toString();
      const body = JSON.parse(text) as { buildings: unknown[] };
      assert.ok(body.buildings.length > 0, 'the pull carries the demo buildings');
      assert.ok(res.bytes.length * 3 < text.length, `${res.bytes.length} B on the wire for ${text.length} B of JSON`);
    });
  }

  it('sends a small JSON answer (a panel read) compressed to what the client takes, the same JSON in every encoding', async () => {
    // server/http/send-json.ts compresses answers up to 64 KB in one call instead of through the
    // middleware's stream, which cost three times as much CPU per panel read
    const cookie = await sessionCookie();
    const url = `/api/panels/${ids.clinicLAId}`;
    const plain = await raw('GET', url, { cookie, 'accept-encoding': 'identity' });
    assert.equal(plain.status, 200);
    assert.equal(plain.headers['content-encoding'], undefined);
    const json = JSON.parse(plain.bytes.toString());
    for (const [accept, encoding, decode] of [
      ['gzip, deflate, br', 'br', zlib.brotliDecompressSync],
      ['gzip', 'gzip', zlib.gunzipSync],
      ['br;q=0.5, gzip;q=1', 'gzip', zlib.gunzipSync],
    ] as const) {
      const res = await raw('GET', url, { cookie, 'accept-encoding': accept });
      assert.equal(res.status, 200, accept);
      assert.equal(res.headers['content-encoding'], encoding, accept);
      assert.match(String(res.headers['content-type']), /^application\/json/, accept);
      assert.match(String(res.headers.vary), /accept-encoding/i, accept);
      assert.equal(Number(res.headers['content-length']), res.bytes.length, accept);
      assert.deepEqual(JSON.parse(decode(res.bytes).toString()), json, accept);
      assert.ok(res.bytes.length * 5 < plain.bytes.length, `${accept}: ${res.bytes.length} B for ${plain.bytes.length} B`);
    }
    // an answer under 1 KB goes as it is, as the middleware does ("nobody signed in", always tiny:
    // a signed-in /api/me grows with what earlier test files gave the demo users)
    const me = await raw('GET', '/api/me', { 'accept-encoding': 'br' });
    assert.equal(me.headers['content-encoding'], undefined);
    assert.deepEqual(JSON.parse(me.bytes.toString()), { user: null });
  });

  it('sends a small answer plain too when the app is made with compression off (the bench baseline)', async () => {
    const cookie = await sessionCookie();
    const plainApp = createApp({ dataSource: ctx.ds, config: readConfig(), compress: false });
    try {
      const res = await request(plainApp).get(`/api/panels/${ids.clinicLAId}`).set('cookie', cookie).set('accept-encoding', 'br, gzip').expect(200);
      assert.equal(res.headers['content-encoding'], undefined);
      assert.ok(res.body.circuits.length > 0);
    } finally {
      await plainApp.closeResources();
    }
  });

  it('sends it plain to a client that accepts no encoding', async () => {
    const cookie = await sessionCookie();
    const res = await raw('POST', '/api/sync/pull', { cookie, 'accept-encoding': 'identity' }, pull);
    assert.equal(res.status, 200);
    assert.equal(res.headers['content-encoding'], undefined);
    assert.ok(JSON.parse(res.bytes.toString()).buildings);
  });
});

describe('caching of the web build', () => {
  const webDir = fs.mkdtempSync(path.join(os.tmpdir(), 'ampwright-web-'));
  const bundle = '_expo/static/js/web/entry-2d7bc55f48e0cf9865d1c7c50533ee1b.js';
  const font = 'assets/fonts/AtkinsonHyperlegible_400Regular.59f0f5543754fa6b68a563036eafaaab.ttf';
  const files: Record<string, string> = {
    'index.html': '<!doctype html><title>Ampwright</title>',
    'sw.js': 'self.addEventListener("fetch", () => {});',
    [bundle]: 'console.log("app");',
    [font]: 'font bytes',
    'favicon.ico': 'icon',
  };
  for (const [file, text] of Object.entries(files)) {
    fs.mkdirSync(path.dirname(path.join(webDir, file)), { recursive: true });
    fs.writeFileSync(path.join(webDir, file), text);
  }
  after(() => fs.rmSync(webDir, { recursive: true, force: true }));
  const app = () => createApp({ dataSource: ctx.ds, config: readConfig(), webDir });

  it('keeps hashed files for a year, immutable', async () => {
    for (const file of [bundle, font]) {
      const res = await request(app()).get(`/${file}`).expect(200);
      assert.equal(res.headers['cache-control'], 'public, max-age=31536000, immutable', file);
    }
  });

  it('makes the browser ask again for index.html, the app routes and the service worker', async () => {
    for (const url of ['/index.html', '/sw.js', '/', '/panels/01a2379d-b2b1-750f-9437-86e74b87aadc']) {
      const res = await request(app()).get(url).expect(200);
      assert.equal(res.headers['cache-control'], 'no-cache', url);
    }
  });

  it('sends the build\'s precompressed file (brotli, else gzip) as it is stored, still immutable', async () => {
    // scripts/precompress.ts writes these at build time at the strongest settings; compressing
    // the 2 MB bundle on the fly at the middleware's quality 4 sent ~100 KB more per first visit
    const stored = { br: Buffer.from('stored brotli bytes'), gzip: Buffer.from('stored gzip bytes') };
    fs.writeFileSync(path.join(webDir, `${bundle}.br`), stored.br);
    fs.writeFileSync(path.join(webDir, `${bundle}.gz`), stored.gzip);
    try {
      for (const [accept, encoding, bytes] of [
        ['gzip, deflate, br', 'br', stored.br],
        ['gzip', 'gzip', stored.gzip],
      ] as const) {
        const served = app().listen(0, '127.0.0.1');
        await new Promise((resolve) => served.once('listening', resolve));
        try {
          const { port } = served.address() as AddressInfo;
          const res = await fetchRaw(`http://127.0.0.1:${port}/${bundle}`, { 'accept-encoding': accept });
          assert.equal(res.headers['content-encoding'], encoding, accept);
          assert.deepEqual(res.bytes, bytes, `${accept}: the stored file, not compressed again`);
          assert.match(String(res.headers['content-type']), /javascript/);
          assert.match(String(res.headers.vary), /accept-encoding/i);
          assert.equal(res.headers['cache-control'], 'public, max-age=31536000, immutable');
        } finally {
          served.close();
        }
      }
      const plain = await request(app()).get(`/${bundle}`).set('accept-encoding', 'identity').expect(200);
      assert.equal(plain.headers['content-encoding'], undefined);
      assert.equal(plain.text, 'console.log("app");');
    } finally {
      fs.rmSync(path.join(webDir, `${bundle}.br`));
      fs.rmSync(path.join(webDir, `${bundle}.gz`));
    }
  });

  it('keeps other files an hour', async () => {
    const res = await request(app()).get('/favicon.ico').expect(200);
    assert.equal(res.headers['cache-control'], 'public, max-age=3600');
  });
});

/** Every SQL statement the DataSource runs while it is on. */
class QueryRecorder implements Logger {
  queries: string[] = [];
  logQuery(query: string) {
    this.queries.push(query);
  }
  logQueryError() {}
  logQuerySlow() {}
  logSchemaBuild() {}
  logMigration() {}
  log() {}
}

describe('GET /api/panels/:id', () => {
  it('answers the panel, its building and circuits without reading field_meta', async () => {
    const electrician = await ctx.signIn('electrician');
    const recorder = new QueryRecorder();
    const quiet = ctx.ds.logger;
    ctx.ds.setOptions({ logger: recorder, logging: ['query'] });
    let res: request.Response;
    try {
      res = await electrician.get(`/api/panels/${ids.clinicLAId}`).expect(200);
    } finally {
      (ctx.ds as unknown as { logger: Logger }).logger = quiet;
    }
    const reads = recorder.queries.filter((q) => /\b(panel|circuit|building)\b/i.test(q));
    assert.ok(reads.length > 0, 'the panel read went through this DataSource');
    for (const q of reads) assert.doesNotMatch(q, /field_meta/i, q);

    // the answer is as before: every field of the shared schemas, none of the stamps
    const { panel, building, circuits } = res.body;
    assert.equal(panel.id, ids.clinicLAId);
    assert.equal(panel.tag, 'LA');
    assert.equal(building.id, ids.clinicId);
    assert.equal(building.role, 'electrician');
    assert.ok(building.panelCount >= 1);
    assert.ok(circuits.length > 0);
    assert.deepEqual(
      circuits.map((c: { position: number }) => c.position),
      [...circuits.map((c: { position: number }) => c.position)].sort((a, b) => a - b),
      'circuits in position order',
    );
    for (const row of [panel, building, ...circuits]) {
      assert.equal(row.fieldMeta, undefined);
      assert.equal(typeof row.version, 'number');
    }
    // the same rows, field for field, as the sync pull serialises them
    const pulled = await electrician
      .post('/api/sync/pull')
      .send({ deviceId: 'transfer-test', schemaVersion: SCHEMA_VERSION, cursors: {} })
      .expect(200);
    const page = pulled.body.buildings.find((b: { buildingId: string }) => b.buildingId === ids.clinicId);
    assert.deepEqual(panel, page.upserts.panels.find((p: { id: string }) => p.id === panel.id));
    const byPosition = (a: { position: number }, b: { position: number }) => a.position - b.position;
    assert.deepEqual(circuits, page.upserts.circuits.filter((c: { panelId: string }) => c.panelId === panel.id).sort(byPosition));
    assert.deepEqual(building, page.building);
  });

  it('answers 404 for a panel of another organisation and for a deleted one, as before', async () => {
    const electrician = await ctx.signIn('electrician');
    const foreign = await makeForeignOrganisation(ctx.ds);
    await electrician.get(`/api/panels/${foreign.panelId}`).expect(404);
    const made = await electrician.post(`/api/buildings/${ids.clinicId}/panels`).send({ tag: 'TX9', system: '208Y/120V-3ph-4w', busRatingA: 100, mainRatingA: 100, spaces: 12 }).expect(201);
    await electrician.get(`/api/panels/${made.body.panel.id}`).expect(200);
    await electrician.delete(`/api/panels/${made.body.panel.id}`).expect(200);
    await electrician.get(`/api/panels/${made.body.panel.id}`).expect(404);
  });
});

describe('session touches', () => {
  it('a read does not rewrite the session row every time (its rolling expiry is written at most every few minutes)', async () => {
    const electrician = await ctx.signIn('electrician');
    const expiry = async () =>
      ((await ctx.ds.query(`SELECT max(expire) AS e FROM session WHERE sess::jsonb ->> 'userId' = (SELECT id::text FROM app_user WHERE email = 'electrician@ampwright.test')`))[0].e as Date).getTime();
    await electrician.get('/api/me').expect(200);
    const first = await expiry();
    // the store keeps whole seconds
    await new Promise((resolve) => setTimeout(resolve, 1100));
    await electrician.get(`/api/panels/${ids.clinicLAId}`).expect(200);
    await electrician.get('/api/me').expect(200);
    assert.equal(await expiry(), first);
  });
});

describe('the actor read with the session', () => {
  it('a role taken away counts from the very next request of a signed-in user', async () => {
    // server/auth/session.ts reads the roles in the session's own statement: never older than it
    const electrician = await ctx.signIn('electrician');
    const userId = (await ctx.ds.query(`SELECT id FROM app_user WHERE email = 'electrician@ampwright.test'`))[0].id as string;
    await electrician.get(`/api/panels/${ids.clinicLAId}`).expect(200);
    await ctx.ds.query(`UPDATE membership SET role = 'owner' WHERE user_id = $1`, [userId]);
    try {
      // an owner sees only buildings granted to them: this one answers as missing
      await electrician.get(`/api/panels/${ids.clinicLAId}`).expect(404);
    } finally {
      await ctx.ds.query(`UPDATE membership SET role = 'electrician' WHERE user_id = $1`, [userId]);
    }
    await electrician.get(`/api/panels/${ids.clinicLAId}`).expect(200);
    const removed = await ctx.ds.query(`DELETE FROM membership WHERE user_id = $1 RETURNING *`, [userId]);
    try {
      await electrician.get(`/api/panels/${ids.clinicLAId}`).expect(404);
    } finally {
      const [m] = removed[0] as { id: string; organisation_id: string; role: string }[];
      await ctx.ds.query(`INSERT INTO membership (id, user_id, organisation_id, role) VALUES ($1, $2, $3, $4)`, [
        m.id,
        userId,
        m.organisation_id,
        m.role,
      ]);
    }
  });

  it('a session signed out elsewhere reads no actor', async () => {
    const electrician = await ctx.signIn('electrician');
    await electrician.get('/api/me').expect(200);
    await ctx.ds.query(`DELETE FROM session WHERE sess::jsonb ->> 'userId' = (SELECT id::text FROM app_user WHERE email = 'electrician@ampwright.test')`);
    await electrician.get(`/api/panels/${ids.clinicLAId}`).expect(401);
  });
});
