/**
 * A big building whose rows all share one version (as after a seed or an import) arrives in pages
 * that fit a phone, cut by row inside the version, with nothing missed or sent twice — even when a
 * push changes the building between two pages. The device side is the app's own pull logic
 * (lib/replica.ts).
 */
import assert from 'node:assert/strict';
import { after, before, describe, it } from 'node:test';
import bcrypt from 'bcryptjs';
import request from 'supertest';
import { uuidv7 } from 'uuidv7';
import { SCHEMA_VERSION, type Mutation, type PullResponse, type PushResponse } from '../../shared/sync';
import { applyPull, cursorsOf, EMPTY_REPLICA, resumesOf, type Replica } from '../../lib/replica';
import { stamp, startApp, type TestContext } from './context';

const PANELS = 120;
const POSITIONS = 42;
const ONE_MB = 1024 * 1024;

let ctx: TestContext;
const organisationId = uuidv7();
const userId = uuidv7();
const buildingId = uuidv7();
const email = `big-${userId}@ampwright.test`;
let agent: request.Agent;

before(async () => {
  ctx = await startApp();
  const hlc = stamp('seed');
  // a user of their own organisation, so this building stays out of the other tests' pulls
  await ctx.ds.query(`INSERT INTO organisation (id, name) VALUES ($1, 'Tower Works')`, [organisationId]);
  await ctx.ds.query(`INSERT INTO app_user (id, email, name, password_hash) VALUES ($1, $2, 'Tam Tower', $3)`, [
    userId,
    email,
    await bcrypt.hash('tower-password', 4),
  ]);
  await ctx.ds.query(`INSERT INTO membership (id, user_id, organisation_id, role) VALUES ($1, $2, $3, 'electrician')`, [uuidv7(), userId, organisationId]);
  await ctx.ds.query(`INSERT INTO building (id, organisation_id, name, updated_at, version) VALUES ($1, $2, 'Tower', $3, 1)`, [buildingId, organisationId, hlc]);
  const panelIds = Array.from({ length: PANELS }, () => uuidv7());
  await ctx.ds.query(
    `INSERT INTO panel (id, building_id, tag, kind, system, bus_rating_a, spaces, updated_at, version)
     SELECT p.id, $2, 'T' || p.n, 'panelboard', '208Y/120V-3ph-4w', 225, 48, $3, 1
       FROM unnest($1::uuid[]) WITH ORDINALITY AS p(id, n)`,
    [panelIds, buildingId, hlc],
  );
  // every row at version 1, and one circuit already deleted then (a snapshot leaves it out)
  await ctx.ds.query(
    `INSERT INTO circuit (id, panel_id, building_id, position, poles, rating_a, breaker_type, description, load_kind,
                          load_va, status, updated_at, version, deleted_at)
     SELECT gen_random_uuid(), p.id, $2, pos, 1, 20, 'standard', 'Receptacles room ' || p.n || '-' || pos, 'receptacles',
            720, 'in-use', $3, 1, CASE WHEN p.n = 1 AND pos = 42 THEN now() END
       FROM unnest($1::uuid[]) WITH ORDINALITY AS p(id, n), generate_series(1, ${POSITIONS}) AS pos`,
    [panelIds, buildingId, hlc],
  );
  agent = request.agent(ctx.app);
  await agent.post('/api/auth/sign-in').send({ email, password: 'tower-password' }).expect(200);
});

after(async () => {
  for (const table of ['conflict_log', 'circuit', 'panel']) await ctx.ds.query(`DELETE FROM ${table} WHERE building_id = $1`, [buildingId]);
  await ctx.ds.query('DELETE FROM building WHERE id = $1', [buildingId]);
  await ctx.ds.query('DELETE FROM processed_mutation WHERE user_id = $1', [userId]);
  await ctx.ds.query('DELETE FROM membership WHERE user_id = $1', [userId]);
  await ctx.ds.query('DELETE FROM app_user WHERE id = $1', [userId]);
  await ctx.ds.query('DELETE FROM organisation WHERE id = $1', [organisationId]);
  await ctx.close();
});

/** One pull as the app sends it: cursors and resume tokens from the device's copy. */
async function pullOnce(replica: Replica, deviceId: string) {
  const res = await agent
    .post('/api/sync/pull')
    .send({ deviceId, schemaVersion: SCHEMA_VERSION, cursors: cursorsOf(replica), resume: resumesOf(replica) });
  assert.equal(res.status, 200, res.text.slice(0, 300));
  return { body: res.body as PullResponse, jsonBytes: Buffer.byteLength(res.text) };
}

function mutation(name: Mutation['name'], entityId: string, fields: Record<string, unknown>, baseVersion: number, parentId?: string): Mutation {
  return { id: uuidv7(), name, buildingId, entityId, baseVersion, hlc: stamp('tower-tablet'), fields, ...(parentId && { parentId }) };
}

async function liveRows(table: 'panel' | 'circuit'): Promise<Map<string, number>> {
  const rows: { id: string; version: string }[] = await ctx.ds.query(
    `SELECT id, version FROM ${table} WHERE building_id = $1 AND deleted_at IS NULL`,
    [buildingId],
  );
  return new Map(rows.map((r) => [r.id, Number(r.version)]));
}

describe('a big building in pages', () => {
  it('comes in pages under 1 MB of JSON whose union is the building, with a push between pages', async () => {
    let replica = EMPTY_REPLICA;
    const seen = new Map<string, number>(); // `id@version` → times sent
    const count = (rows: { id: string; version: number }[]) => {
      for (const r of rows) seen.set(`${r.id}@${r.version}`, (seen.get(`${r.id}@${r.version}`) ?? 0) + 1);
    };
    const remaining: number[] = [];
    let pages = 0;
    let pushed = false;
    const changed: Record<string, string> = {};
    for (let more = true; more; ) {
      assert.ok(pages < 100, 'the pull ends');
      const { body, jsonBytes } = await pullOnce(replica, 'tower-phone');
      pages++;
      assert.ok(jsonBytes < ONE_MB, `page ${pages} is ${jsonBytes} bytes of JSON`);
      const page = body.buildings.find((b) => b.buildingId === buildingId)!;
      count(page.upserts.panels);
      count(page.upserts.circuits);
      if (page.remaining !== undefined) remaining.push(page.remaining);
      replica = applyPull(replica, body);
      more = body.buildings.some((b) => b.hasMore);
      if (page.hasMore) {
        assert.ok(page.resume, 'a page that stops inside a version says where to resume');
        assert.equal(replica.buildings[buildingId].resume, page.resume, 'the device keeps the resume token');
      }

      if (pages === 1 && more && !pushed) {
        // another device changes the building between two pages: a circuit already delivered, one
        // still to come, a delete of a delivered one and a new circuit
        pushed = true;
        const copy = replica.buildings[buildingId];
        const delivered = Object.values(copy.circuits);
        const all = await liveRows('circuit');
        const pending = [...all.keys()].filter((id) => !copy.circuits[id]).sort();
        assert.ok(delivered.length > 2 && pending.length > 0, 'the first page holds part of the building');
        changed.early = delivered[0].id;
        changed.late = pending[pending.length - 1];
        changed.gone = delivered[1].id;
        changed.made = uuidv7();
        const base = Number((await ctx.ds.query('SELECT version FROM building WHERE id = $1', [buildingId]))[0].version);
        const res = await agent.post('/api/sync/push').send({
          deviceId: 'tower-tablet',
          schemaVersion: SCHEMA_VERSION,
          mutations: [
            mutation('circuit.patch', changed.early, { description: 'Changed after it was sent' }, base),
            mutation('circuit.patch', changed.late, { description: 'Changed before it was sent' }, base),
            mutation('circuit.delete', changed.gone, {}, base),
            mutation('circuit.create', changed.made, { position: 43, poles: 1, ratingA: 15, description: 'New between pages', loadKind: 'lighting' }, 0, delivered[0].panelId),
          ],
        });
        assert.equal(res.status, 200);
        assert.deepEqual((res.body as PushResponse).results.map((r) => r.status), ['applied', 'applied', 'applied', 'applied']);
      }
    }
    assert.ok(pages >= 3, `a building of ${PANELS * POSITIONS} circuits takes several pages (took ${pages})`);

    // nothing doubled: a row comes again only with a newer version
    const doubled = [...seen].filter(([, n]) => n > 1);
    assert.deepEqual(doubled, []);

    // the union is the building as it is now: every live row once, at its latest version
    const copy = replica.buildings[buildingId];
    assert.equal(copy.resume, undefined, 'no resume token once the building is complete');
    for (const [table, rows] of [['panel', copy.panels], ['circuit', copy.circuits]] as const) {
      const truth = await liveRows(table);
      assert.equal(Object.keys(rows).length, truth.size, `${table}s on the device`);
      for (const [id, version] of truth) assert.equal(rows[id]?.version, version, `${table} ${id}`);
    }
    assert.equal(copy.circuits[changed.early].description, 'Changed after it was sent');
    assert.equal(copy.circuits[changed.late].description, 'Changed before it was sent');
    assert.equal(copy.circuits[changed.gone], undefined, 'the delete between pages reached the device');
    assert.equal(copy.circuits[changed.made].description, 'New between pages');
    const version = Number((await ctx.ds.query('SELECT version FROM building WHERE id = $1', [buildingId]))[0].version);
    assert.equal(copy.cursor, version);

    // progress: the rows still to come shrink page by page, to none
    assert.ok(remaining.length >= 3);
    assert.equal(remaining[remaining.length - 1], 0);
    assert.ok(remaining[0] > remaining[1], `remaining ${remaining.join(', ')}`);
  });

  it('a token the server did not issue is ignored: the version is sent again, nothing is lost', async () => {
    const res = await agent
      .post('/api/sync/pull')
      .send({ deviceId: 'tower-phone-2', schemaVersion: SCHEMA_VERSION, cursors: {}, resume: { [buildingId]: 'not-a-token' } })
      .expect(200);
    const page = (res.body as PullResponse).buildings.find((b) => b.buildingId === buildingId)!;
    assert.equal(page.upserts.panels.length > 0, true, 'starts at the beginning');
    const bad = await agent
      .post('/api/sync/pull')
      .send({ deviceId: 'tower-phone-2', schemaVersion: SCHEMA_VERSION, cursors: {}, resume: { [buildingId]: 'x'.repeat(500) } });
    assert.equal(bad.status, 400);
    assert.match(bad.text, /resume/);
  });
});
