/**
 * Cross-site request refusal (server/http/same-origin.ts): a page on another origin — another
 * port of the same host, a sibling subdomain — must not be able to change anything with the
 * signed-in user's cookie (SameSite=Lax lets same-site requests through). Each case is a real
 * signed-in agent; the building's name shows whether the write landed.
 */
import assert from 'node:assert/strict';
import { after, before, describe, it } from 'node:test';
import type request from 'supertest';
import { readConfig } from '../../server/config';
import { demoIds, startApp, type TestContext } from './context';

let ctx: TestContext;
let ids: Awaited<ReturnType<typeof demoIds>>;
let admin: request.Agent;

const FOREIGN = 'http://127.0.0.1:5999';
const SIBLING = 'https://evil.ampwright.example';

before(async () => {
  ctx = await startApp();
  ids = await demoIds(ctx.ds);
  admin = await ctx.signIn('admin');
});
after(() => ctx.close());

async function buildingNotes(): Promise<string> {
  const [row] = await ctx.ds.query(`SELECT notes FROM building WHERE id = $1`, [ids.clinicId]);
  return row.notes;
}

function refused(res: request.Response) {
  assert.equal(res.status, 403, JSON.stringify(res.body));
  assert.equal(res.body.error.code, 'cross_site');
}

describe('cross-site requests with a valid cookie', () => {
  it('JSON PATCH from a foreign Origin is refused and changes nothing', async () => {
    const before = await buildingNotes();
    const res = await admin
      .patch(`/api/buildings/${ids.clinicId}`)
      .set('Origin', FOREIGN)
      .send({ notes: 'written from another site' });
    refused(res);
    assert.equal(await buildingNotes(), before);
  });

  it('a form-encoded POST (what a plain HTML form sends) from a foreign Origin is refused', async () => {
    const res = await admin
      .post('/api/auth/sign-out')
      .set('Origin', SIBLING)
      .type('form')
      .send('x=1');
    refused(res);
    // still signed in: the sign-out did not happen
    await admin.get('/api/me').expect(200);
  });

  it('a text/plain POST (the other body a form may send) from a foreign Origin is refused', async () => {
    const res = await admin
      .post('/api/sync/push')
      .set('Origin', FOREIGN)
      .set('Content-Type', 'text/plain')
      .send(JSON.stringify({ deviceId: 'x', schemaVersion: 1, mutations: [] }));
    refused(res);
  });

  it('DELETE with Origin "null" (a sandboxed page) is refused', async () => {
    const res = await admin.delete(`/api/buildings/${ids.loftsId}`).set('Origin', 'null');
    refused(res);
    const [row] = await ctx.ds.query(`SELECT deleted_at FROM building WHERE id = $1`, [ids.loftsId]);
    assert.equal(row.deleted_at, null);
  });

  it('without Origin, Sec-Fetch-Site same-site or cross-site is refused', async () => {
    for (const site of ['same-site', 'cross-site']) {
      const res = await admin
        .patch(`/api/buildings/${ids.clinicId}`)
        .set('Sec-Fetch-Site', site)
        .send({ notes: `from a ${site} page` });
      refused(res);
    }
  });

  it('the app itself: Origin equal to the request host, or Sec-Fetch-Site same-origin, is let through', async () => {
    const notes = await buildingNotes();
    const own = await admin
      .patch(`/api/buildings/${ids.clinicId}`)
      .set('Host', 'ampwright.local:8443')
      .set('Origin', 'https://ampwright.local:8443')
      .send({ notes });
    assert.equal(own.status, 200, JSON.stringify(own.body));
    const fetchMeta = await admin
      .patch(`/api/buildings/${ids.clinicId}`)
      .set('Sec-Fetch-Site', 'same-origin')
      .send({ notes });
    assert.equal(fetchMeta.status, 200, JSON.stringify(fetchMeta.body));
  });

  it('no Origin and no Sec-Fetch-Site (curl, a native app): let through, since every browser sends one of them', async () => {
    const notes = await buildingNotes();
    const res = await admin.patch(`/api/buildings/${ids.clinicId}`).send({ notes });
    assert.equal(res.status, 200, JSON.stringify(res.body));
  });

  it('reads are not refused (GET from another origin changes nothing)', async () => {
    await admin.get('/api/buildings').set('Origin', FOREIGN).expect(200);
  });

  it('an origin named in ALLOWED_ORIGINS (a second address of the app) is let through', async () => {
    const other = await startApp({ config: { ALLOWED_ORIGINS: ['https://field.example.net'] } });
    try {
      const agent = await other.signIn('admin');
      const notes = await buildingNotes();
      const ok = await agent.patch(`/api/buildings/${ids.clinicId}`).set('Origin', 'https://field.example.net').send({ notes });
      assert.equal(ok.status, 200, JSON.stringify(ok.body));
      refused(await agent.patch(`/api/buildings/${ids.clinicId}`).set('Origin', 'https://field.example.net:8443').send({ notes }));
    } finally {
      await other.close();
    }
  });

  it('ALLOWED_ORIGINS, APP_URL and PUBLIC_URL name further origins of the app', () => {
    const config = readConfig({
      ...process.env,
      ALLOWED_ORIGINS: 'https://a.example.net, https://b.example.net:8443/',
      APP_URL: 'https://app.example.net/some/path',
    });
    assert.deepEqual(config.ALLOWED_ORIGINS, ['https://a.example.net', 'https://b.example.net:8443']);
    assert.throws(() => readConfig({ ...process.env, ALLOWED_ORIGINS: 'not a url' }), /ALLOWED_ORIGINS/);
  });
});
