/**
 * The security matrix: every route of the API, read from the Express router itself (a new route
 * is in the matrix without anyone listing it), called by every actor:
 * - anonymous → 401 `unauthorised`, except the public routes listed below with their reason;
 * - another organisation's admin → 403/404 on the first organisation's rows, or a 2xx whose answer
 *   names none of them (its own `me`, lists, a push whose mutations are all rejected); and the
 *   first organisation's rows are unchanged afterwards;
 * - each role of the first organisation (owner, electrician, inspector, admin) → never a 5xx;
 *   people, invitations and settings are admin-only (403 to the others); owners never write
 *   the register or the band library.
 * - with a valid admin cookie, every unsafe route from another origin → 403 `cross_site`, and every
 *   route taking a JSON body, sent as text/plain → 415 (the cases of cross-site.test.ts and
 *   input-hygiene.test.ts, over the whole route list).
 * The first organisation's rows used are made for this file (a scratch building with a panel, a
 * circuit, an inspection and a photo row; a band; a person; an invitation), so the admin's deletes
 * touch nothing the demo or later suites rely on. The tally is printed at the end.
 */
import assert from 'node:assert/strict';
import { after, before, describe, it } from 'node:test';
import bcrypt from 'bcryptjs';
import request from 'supertest';
import { uuidv7 } from 'uuidv7';
import { SCHEMA_VERSION } from '../../shared/sync';
import { demoIds, stamp, startApp, type RoleName, type TestContext } from './context';
import { listRoutes, type RouteInfo } from './routes';

let ctx: TestContext;
let routes: RouteInfo[];
let firstOrg: string;
let scratch: Record<string, string>;
let foreignAdmin: request.Agent;

/** Routes anyone may call, and why. */
const PUBLIC: Record<string, string> = {
  'GET /api/health': 'load balancers probe it without a session',
  'GET /api/me': 'the app asks who is signed in on every cold load: no session is the answer { user: null }',
  'POST /api/auth/sign-in': 'signing in is how a session starts',
  'POST /api/auth/sign-out': 'ending a session that may already have expired',
  'POST /api/auth/forgot-password': 'a person who cannot sign in asks for a reset link',
  'GET /api/password-resets/:token': 'the e-mailed reset link, opened signed out',
  'POST /api/password-resets/:token': 'choosing the new password from that link',
  'GET /api/invitations/:token': 'the e-mailed invitation, opened before any account exists',
  'POST /api/invitations/:token/accept': 'accepting it creates (or joins) the account',
};

/** Admin-only for members of the organisation: everyone else gets 403. */
const ADMIN_ONLY = /^\/api\/organisations\//;
/** The register and the band library: an owner never writes them. */
const OWNER_NEVER_WRITES = /^\/api\/(buildings|panels|circuits|bands)\b/;

const TOKEN = 'T'.repeat(43);

/** A real id of the right kind for each path parameter, from the scratch rows. */
function fill(path: string): string {
  return path.replace(/:(\w+)/g, (_m, name: string, offset: number) => {
    const before = path.slice(0, offset).split('/').filter(Boolean).pop() ?? '';
    const key = name === 'id' ? before : name;
    const byName: Record<string, string | undefined> = {
      token: TOKEN,
      organisationId: firstOrg,
      organisations: firstOrg,
      userId: scratch.userId,
      buildingId: scratch.buildingId,
      buildings: scratch.buildingId,
      panels: scratch.panelId,
      circuits: scratch.circuitId,
      bands: scratch.bandId,
      inspections: scratch.inspectionId,
      invitationId: scratch.invitationId,
      photoId: scratch.photoId,
    };
    const id = byName[key];
    if (!id) throw new Error(`no id maker for :${name} in ${path}: add one to the matrix`);
    return id;
  });
}

/** A valid body for every unsafe route, so a refusal comes from authorisation, not validation. */
function body(key: string): object | undefined {
  const POINTS = [{ multiple: 1.5, minS: 30, maxS: 300 }, { multiple: 10, minS: 0.01, maxS: 2 }];
  const bodies: Record<string, object | undefined> = {
    'POST /api/auth/sign-in': { email: 'nobody@example.test', password: 'not-a-password' },
    'POST /api/auth/sign-out': undefined,
    'POST /api/auth/forgot-password': { email: 'nobody@example.test' },
    'POST /api/password-resets/:token': { password: 'a-long-password' },
    'POST /api/invitations/:token/accept': { name: 'Nobody', password: 'a-long-password' },
    'POST /api/sync/push': {
      deviceId: 'matrix',
      schemaVersion: SCHEMA_VERSION,
      mutations: [
        { id: uuidv7(), name: 'building.patch', buildingId: scratch.buildingId, entityId: scratch.buildingId, baseVersion: 0, hlc: stamp('matrix'), fields: { notes: 'matrix' } },
      ],
    },
    'POST /api/sync/pull': { deviceId: 'matrix', schemaVersion: SCHEMA_VERSION, cursors: { [scratch.buildingId]: 0 } },
    'POST /api/organisations/:organisationId/invitations': { email: `matrix-${uuidv7().slice(-10)}@example.test`, role: 'electrician' },
    'DELETE /api/organisations/:organisationId/invitations/:invitationId': undefined,
    'PATCH /api/organisations/:organisationId/people/:userId': { role: 'inspector' },
    'DELETE /api/organisations/:organisationId/people/:userId': undefined,
    'POST /api/organisations/:organisationId/people/:userId/buildings/:buildingId': undefined,
    'DELETE /api/organisations/:organisationId/people/:userId/buildings/:buildingId': undefined,
    'POST /api/inspections/:id/send-report': {},
    'PUT /api/photos/:photoId': undefined,
    'POST /api/buildings': { name: 'Matrix building', organisationId: firstOrg },
    'PATCH /api/buildings/:id': { notes: 'matrix' },
    'DELETE /api/buildings/:id': undefined,
    'POST /api/buildings/:id/panels': { tag: `M${uuidv7().slice(-5)}`, system: '208Y/120V-3ph-4w', busRatingA: 100, spaces: 12 },
    'PATCH /api/panels/:id': { location: 'matrix' },
    'DELETE /api/panels/:id': undefined,
    'POST /api/panels/:id/circuits': { position: 11, ratingA: 20 },
    'PATCH /api/circuits/:id': { notes: 'matrix' },
    'DELETE /api/circuits/:id': undefined,
    'POST /api/bands': { label: 'Matrix band', ratingA: 20, points: POINTS, organisationId: firstOrg },
    'PATCH /api/bands/:id': { label: 'Matrix band, renamed' },
    'DELETE /api/bands/:id': undefined,
    'PATCH /api/organisations/:id/settings': { keepPhotoLocation: false },
  };
  if (!(key in bodies)) throw new Error(`no body for ${key}: add a valid one to the matrix`);
  return bodies[key];
}

async function call(
  agent: request.Agent | request.SuperTest<request.Test>,
  route: RouteInfo,
  headers: Record<string, string> = {},
): Promise<request.Response> {
  const key = `${route.method} ${route.path}`;
  const url = fill(route.path);
  const verb = route.method.toLowerCase() as 'get' | 'post' | 'put' | 'patch' | 'delete';
  let req = agent[verb](url).set(headers);
  if (route.method === 'PUT') req = req.set('x-content-sha256', 'a'.repeat(64));
  if (route.method === 'GET') return req;
  const payload = body(key);
  lastBody = payload;
  return payload === undefined ? req : req.send(payload);
}
let lastBody: object | undefined;

/** Every id of the first organisation's rows, to look for in answers to the other organisation. */
async function firstOrgIds(): Promise<string[]> {
  const rows: { id: string }[] = await ctx.ds.query(
    `SELECT id::text FROM building WHERE organisation_id = $1
     UNION SELECT p.id::text FROM panel p JOIN building b ON b.id = p.building_id WHERE b.organisation_id = $1
     UNION SELECT c.id::text FROM circuit c JOIN building b ON b.id = c.building_id WHERE b.organisation_id = $1
     UNION SELECT i.id::text FROM inspection i JOIN building b ON b.id = i.building_id WHERE b.organisation_id = $1
     UNION SELECT id::text FROM curve_band WHERE organisation_id = $1
     UNION SELECT user_id::text FROM membership WHERE organisation_id = $1
     UNION SELECT $1::text`,
    [firstOrg],
  );
  return rows.map((r) => r.id);
}

/** A fingerprint of the first organisation's state: any write by an outsider changes it. */
async function fingerprint(): Promise<string> {
  const [row] = await ctx.ds.query(
    `SELECT md5(concat_ws('|',
       (SELECT string_agg(id || ':' || version || ':' || coalesce(deleted_at::text, ''), ',' ORDER BY id) FROM building WHERE organisation_id = $1),
       (SELECT string_agg(id || ':' || updated_at::text || ':' || coalesce(deleted_at::text, ''), ',' ORDER BY id) FROM curve_band WHERE organisation_id = $1),
       (SELECT string_agg(user_id || ':' || role, ',' ORDER BY user_id) FROM membership WHERE organisation_id = $1),
       (SELECT string_agg(id || ':' || expires_at::text, ',' ORDER BY id) FROM invitation WHERE organisation_id = $1),
       (SELECT settings::text FROM organisation WHERE id = $1),
       (SELECT count(*) FROM owner_grant g JOIN building b ON b.id = g.building_id WHERE b.organisation_id = $1)
     )) AS f`,
    [firstOrg],
  );
  return row.f;
}

/** Deletes after the other methods, and signing out last, so one case does not end the next. */
function callOrder(a: RouteInfo, b: RouteInfo): number {
  const rank = (r: RouteInfo) => (r.path === '/api/auth/sign-out' ? 2 : r.method === 'DELETE' ? 1 : 0);
  return rank(a) - rank(b);
}

const tally = { cases: 0, byActor: new Map<string, number>() };
function counted(actor: string) {
  tally.cases++;
  tally.byActor.set(actor, (tally.byActor.get(actor) ?? 0) + 1);
}

before(async () => {
  ctx = await startApp();
  routes = listRoutes(ctx.app).sort(callOrder);
  const ids = await demoIds(ctx.ds);
  const [clinic] = await ctx.ds.query(`SELECT organisation_id FROM building WHERE id = $1`, [ids.clinicId]);
  firstOrg = clinic.organisation_id;
  const admin = await ctx.signIn('admin');

  const building = await admin.post('/api/buildings').send({ name: 'Matrix scratch building', organisationId: firstOrg }).expect(201);
  const buildingId = building.body.building.id as string;
  const panel = await admin
    .post(`/api/buildings/${buildingId}/panels`)
    .send({ tag: 'MX', system: '208Y/120V-3ph-4w', busRatingA: 100, spaces: 12 })
    .expect(201);
  const panelId = panel.body.panel.id as string;
  const circuit = await admin.post(`/api/panels/${panelId}/circuits`).send({ position: 1, ratingA: 20 }).expect(201);
  const band = await admin
    .post('/api/bands')
    .send({ label: 'Matrix scratch band', ratingA: 20, points: [{ multiple: 2, minS: 1, maxS: 10 }, { multiple: 5, minS: 0.1, maxS: 1 }], organisationId: firstOrg })
    .expect(201);
  const inspectionId = uuidv7();
  const photoId = uuidv7();
  const mutation = (name: string, entityId: string, fields: object) => ({
    id: uuidv7(), name, buildingId, entityId, baseVersion: 0, hlc: stamp('matrix-setup'), fields,
  });
  const pushed = await admin.post('/api/sync/push').send({
    deviceId: 'matrix-setup',
    schemaVersion: SCHEMA_VERSION,
    mutations: [
      mutation('inspection.create', inspectionId, { kind: 'visual', panelIds: [panelId], performedOn: '2026-11-30' }),
      mutation('deficiency.create', uuidv7(), { panelId, title: 'Matrix finding', priority: 3 }),
    ],
  });
  assert.deepEqual(pushed.body.results.map((r: { status: string }) => r.status), ['applied', 'applied'], JSON.stringify(pushed.body));
  const [deficiency] = await ctx.ds.query(`SELECT id FROM deficiency WHERE building_id = $1`, [buildingId]);
  const photo = await admin.post('/api/sync/push').send({
    deviceId: 'matrix-setup',
    schemaVersion: SCHEMA_VERSION,
    mutations: [
      mutation('photo.create', photoId, {
        parentKind: 'deficiency', parentId: deficiency.id, purpose: 'finding', sha256: 'a'.repeat(64), bytes: 100,
        contentType: 'image/jpeg', takenAt: new Date().toISOString(),
      }),
    ],
  });
  assert.equal(photo.body.results[0].status, 'applied', JSON.stringify(photo.body));
  const userId = uuidv7();
  await ctx.ds.query(`INSERT INTO app_user (id, email, name, password_hash) VALUES ($1, $2, 'Matrix person', 'x')`, [
    userId,
    `matrix-person-${userId.slice(-8)}@example.test`,
  ]);
  await ctx.ds.query(`INSERT INTO membership (id, user_id, organisation_id, role) VALUES ($1, $2, $3, 'owner')`, [uuidv7(), userId, firstOrg]);
  await admin.post(`/api/organisations/${firstOrg}/invitations`).send({ email: `matrix-invite-${userId.slice(-8)}@example.test`, role: 'inspector' }).expect(201);
  const [invitation] = await ctx.ds.query(`SELECT id FROM invitation WHERE email = $1`, [`matrix-invite-${userId.slice(-8)}@example.test`]);
  scratch = {
    buildingId,
    panelId,
    circuitId: circuit.body.circuit.id,
    bandId: band.body.band.id,
    inspectionId,
    photoId,
    userId,
    invitationId: invitation.id,
  };

  // the other organisation and its admin
  const otherOrg = uuidv7();
  await ctx.ds.query(`INSERT INTO organisation (id, name) VALUES ($1, 'Matrix other organisation')`, [otherOrg]);
  const otherAdmin = uuidv7();
  const email = `matrix-other-${otherAdmin.slice(-8)}@example.test`;
  await ctx.ds.query(`INSERT INTO app_user (id, email, name, password_hash) VALUES ($1, $2, 'Other admin', $3)`, [
    otherAdmin,
    email,
    await bcrypt.hash('other-admin-password', 4),
  ]);
  await ctx.ds.query(`INSERT INTO membership (id, user_id, organisation_id, role) VALUES ($1, $2, $3, 'admin')`, [uuidv7(), otherAdmin, otherOrg]);
  foreignAdmin = request.agent(ctx.app);
  await foreignAdmin.post('/api/auth/sign-in').send({ email, password: 'other-admin-password' }).expect(200);
});

after(async () => {
  const actors = [...tally.byActor].map(([a, n]) => `${a} ${n}`).join(', ');
  // the tally the issue asks for: routes × actors and the cases tried
  process.stdout.write(`# security matrix: ${routes.length} routes, ${tally.byActor.size} callers, ${tally.cases} cases (${actors})\n`);
  await ctx.close();
});

describe('the route list comes from the router', () => {
  it('finds the routes of every mounted router, with their methods', () => {
    const keys = new Set(routes.map((r) => `${r.method} ${r.path}`));
    assert.ok(routes.length >= 40, `only ${routes.length} routes found`);
    for (const known of ['GET /api/health', 'POST /api/sync/push', 'PUT /api/photos/:photoId', 'GET /api/panels/:id/directory.pdf', 'PATCH /api/circuits/:id']) {
      assert.ok(keys.has(known), `${known} in ${[...keys].join(', ')}`);
    }
    for (const key of Object.keys(PUBLIC)) assert.ok(keys.has(key), `the public route ${key} exists`);
  });
});

describe('anonymous', () => {
  it('every route but the public ones answers 401; the public ones never 5xx', async () => {
    const before = await fingerprint();
    for (const route of routes) {
      const key = `${route.method} ${route.path}`;
      const res = await call(request(ctx.app), route);
      counted('anonymous');
      assert.ok(res.status < 500, `${key}: ${res.status} ${JSON.stringify(res.body)}`);
      if (PUBLIC[key]) continue;
      assert.equal(res.status, 401, `${key} answered ${res.status} to anonymous`);
      assert.equal(res.body.error?.code, 'unauthorised', key);
    }
    assert.equal(await fingerprint(), before, 'anonymous changed nothing');
  });
});

describe("another organisation's admin", () => {
  it('gets 403/404 on the first organisation\u2019s rows, or an answer that names none of them; changes nothing', async () => {
    const before = await fingerprint();
    const theirs = await firstOrgIds();
    for (const route of routes) {
      const key = `${route.method} ${route.path}`;
      const res = await call(foreignAdmin, route);
      counted('other organisation admin');
      assert.ok(res.status < 500, `${key}: ${res.status} ${JSON.stringify(res.body)}`);
      if (PUBLIC[key]) continue;
      if (res.status >= 200 && res.status < 300) {
        const text = res.text ?? JSON.stringify(res.body);
        // an id the caller sent itself (a pull cursor answered as `revoked`) discloses nothing
        const sent = `${fill(route.path)} ${JSON.stringify(lastBody ?? {})}`;
        const leaked = theirs.filter((id) => text.includes(id) && !sent.includes(id));
        assert.deepEqual(leaked, [], `${key} answered ${res.status} naming the first organisation's rows`);
        if (key === 'POST /api/sync/push') {
          assert.ok(res.body.results.every((r: { status: string }) => r.status === 'rejected'), JSON.stringify(res.body));
        }
      } else {
        assert.ok([403, 404].includes(res.status), `${key} answered ${res.status}: ${JSON.stringify(res.body)}`);
      }
    }
    assert.equal(await fingerprint(), before, 'the other organisation changed nothing of the first');
  });
});

const UNSAFE = new Set(['POST', 'PUT', 'PATCH', 'DELETE']);

describe('cross-site: every unsafe route, with a valid admin cookie', () => {
  it('a foreign Origin, or Sec-Fetch-Site same-site without Origin, answers 403 cross_site; nothing changes', async () => {
    const admin = await ctx.signIn('admin');
    const before = await fingerprint();
    for (const route of routes.filter((r) => UNSAFE.has(r.method))) {
      const key = `${route.method} ${route.path}`;
      for (const [header, value] of [['Origin', 'http://127.0.0.1:5999'], ['Sec-Fetch-Site', 'same-site']]) {
        const res = await call(admin, route, { [header]: value });
        counted(`cross-site admin (${header})`);
        assert.equal(res.status, 403, `${key} with ${header}: ${value} answered ${res.status}`);
        assert.equal(res.body.error?.code, 'cross_site', key);
      }
    }
    assert.equal(await fingerprint(), before, 'no cross-site request changed anything');
  });
});

describe('content types: every route that takes a JSON body', () => {
  it('the same body sent as text/plain answers 415, never 2xx', async () => {
    const admin = await ctx.signIn('admin');
    for (const route of routes.filter((r) => UNSAFE.has(r.method))) {
      const key = `${route.method} ${route.path}`;
      const payload = body(key);
      if (payload === undefined) continue;
      const verb = route.method.toLowerCase() as 'post' | 'put' | 'patch' | 'delete';
      const res = await admin[verb](fill(route.path)).set('Content-Type', 'text/plain').send(JSON.stringify(payload));
      counted('text/plain admin');
      assert.equal(res.status, 415, `${key} as text/plain answered ${res.status}`);
    }
  });
});

describe('each role of the organisation', () => {
  for (const role of ['owner', 'electrician', 'inspector', 'admin'] as RoleName[]) {
    it(`${role}: never a 5xx; admin-only and owner rules hold`, async () => {
      const agent = await ctx.signIn(role);
      for (const route of routes) {
        const key = `${route.method} ${route.path}`;
        const res = await call(agent, route);
        counted(role);
        assert.ok(res.status < 500, `${key}: ${res.status} ${JSON.stringify(res.body)}`);
        if (PUBLIC[key]) continue;
        assert.notEqual(res.status, 401, `${key}: a signed-in ${role} answered 401`);
        if (role !== 'admin' && ADMIN_ONLY.test(route.path)) {
          assert.equal(res.status, 403, `${key} by ${role}: ${res.status}`);
        }
        if (role === 'owner' && route.method !== 'GET' && OWNER_NEVER_WRITES.test(route.path)) {
          assert.ok([403, 404].includes(res.status), `${key} by owner: ${res.status}`);
        }
      }
    });
  }
});
