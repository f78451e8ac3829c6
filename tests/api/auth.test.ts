import assert from 'node:assert/strict';
import { after, before, describe, it } from 'node:test';
import request from 'supertest';
import { createApp } from '../../server/app';
import { readConfig } from '../../server/config';
import { makeDataSource } from '../../server/data-source';
import { startApp, type TestContext } from './context';

describe('health', () => {
  let ctx: TestContext;
  before(async () => (ctx = await startApp()));
  after(() => ctx.close());

  it('answers ok with the database up', async () => {
    const res = await request(ctx.app).get('/api/health').expect(200);
    assert.deepEqual(res.body, { ok: true, db: 'up' });
  });

  it('answers 503 when the database is down', async () => {
    // a DataSource pointed at a port where nothing listens, never connected
    const deadDb = makeDataSource('postgres://nobody:x@127.0.0.1:1/none');
    const app = createApp({ dataSource: deadDb, config: readConfig() });
    const res = await request(app).get('/api/health').expect(503);
    assert.deepEqual(res.body, { ok: false, db: 'down' });
    await app.closeResources();
  });
});

describe('sign-in, sign-out and me', () => {
  let ctx: TestContext;
  before(async () => (ctx = await startApp()));
  after(() => ctx.close());

  it('signs in with the demo password and sets a httpOnly SameSite=Lax cookie', async () => {
    const res = await request(ctx.app)
      .post('/api/auth/sign-in')
      .send({ email: 'Electrician@Ampwright.test', password: 'ampwright-demo' })
      .expect(200);
    assert.equal(res.body.user.email, 'electrician@ampwright.test');
    assert.equal(res.body.memberships.length, 1);
    assert.equal(res.body.memberships[0].role, 'electrician');
    assert.equal(res.body.user.passwordHash, undefined);
    const cookie = String(res.headers['set-cookie']);
    assert.match(cookie, /ampwright\.sid=/);
    assert.match(cookie, /HttpOnly/i);
    assert.match(cookie, /SameSite=Lax/i);
    assert.doesNotMatch(cookie, /Secure/i, 'plain http on loopback: no Secure flag');
  });

  it('marks the cookie Secure when served over https behind a trusted proxy', async () => {
    const config = { ...readConfig(), TRUST_PROXY: '1' as const };
    const app = createApp({ dataSource: ctx.ds, config });
    const res = await request(app)
      .post('/api/auth/sign-in')
      .set('X-Forwarded-Proto', 'https')
      .send({ email: 'admin@ampwright.test', password: 'ampwright-demo' })
      .expect(200);
    assert.match(String(res.headers['set-cookie']), /Secure/);
    await app.closeResources();
  });

  it('stores the session in PostgreSQL', async () => {
    const agent = await ctx.signIn('inspector');
    const [{ n }] = await ctx.ds.query(`SELECT count(*)::int AS n FROM session WHERE sess::text LIKE '%userId%'`);
    assert.ok(n >= 1);
    await agent.get('/api/me').expect(200);
  });

  it('refuses a wrong password with 401 and the error shape', async () => {
    const res = await request(ctx.app)
      .post('/api/auth/sign-in')
      .send({ email: 'electrician@ampwright.test', password: 'wrong' })
      .expect(401);
    assert.equal(res.body.error.code, 'bad_credentials');
    assert.equal(typeof res.body.error.message, 'string');
    assert.equal(res.headers['set-cookie'], undefined);
  });

  it('refuses an unknown e-mail the same way', async () => {
    const res = await request(ctx.app)
      .post('/api/auth/sign-in')
      .send({ email: 'nobody@ampwright.test', password: 'ampwright-demo' })
      .expect(401);
    assert.equal(res.body.error.code, 'bad_credentials');
  });

  it('names the bad fields of a malformed sign-in', async () => {
    const res = await request(ctx.app).post('/api/auth/sign-in').send({ email: 'not-an-email' }).expect(400);
    assert.equal(res.body.error.code, 'invalid');
    assert.ok(res.body.error.fields.email);
    assert.ok(res.body.error.fields.password);
  });

  it('answers unreadable JSON with 400 and no stack trace', async () => {
    const res = await request(ctx.app)
      .post('/api/auth/sign-in')
      .set('content-type', 'application/json')
      .send('{"email": ')
      .expect(400);
    assert.equal(res.body.error.code, 'bad_request');
    assert.doesNotMatch(JSON.stringify(res.body), /at .*\.(ts|js):\d+/);
  });

  it('GET /api/me answers 200 with no user signed out (a cold load logs no error) and describes the user signed in', async () => {
    const signedOut = await request(ctx.app).get('/api/me').expect(200);
    assert.deepEqual(signedOut.body, { user: null });
    // every other route still refuses an anonymous caller
    await request(ctx.app).get('/api/buildings').expect(401);
    const agent = await ctx.signIn('owner');
    const res = await agent.get('/api/me').expect(200);
    assert.equal(res.body.user.email, 'owner@ampwright.test');
    assert.equal(res.body.memberships[0].role, 'owner');
  });

  it('signs out: the same cookie is no longer a session', async () => {
    const agent = await ctx.signIn('admin');
    await agent.get('/api/me').expect(200);
    await agent.post('/api/auth/sign-out').expect(200);
    assert.equal((await agent.get('/api/me').expect(200)).body.user, null);
    await agent.get('/api/buildings').expect(401);
  });
});

describe('sign-in rate limit', () => {
  let ctx: TestContext;
  before(async () => (ctx = await startApp({ signInLimit: 3 })));
  after(() => ctx.close());

  it('answers 429 after too many attempts for one address and e-mail', async () => {
    const attempt = () =>
      request(ctx.app).post('/api/auth/sign-in').send({ email: 'inspector@ampwright.test', password: 'guess' });
    for (let i = 0; i < 3; i++) assert.equal((await attempt()).status, 401);
    const limited = await attempt();
    assert.equal(limited.status, 429);
    assert.equal(limited.body.error.code, 'too_many_attempts');
  });
});
