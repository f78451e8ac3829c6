/**
 * Rows of another organisation are never linked: a circuit's time-current band (REST and sync,
 * which share server/sync/kinds), a deficiency's assignee, a photo under a reading of a
 * signed inspection; the trip-test judgement never uses another organisation's band; and the
 * replay guard (processed_mutation) is keyed by user, so one account can neither read nor pre-empt
 * another's result for the same device and mutation id.
 */
import assert from 'node:assert/strict';
import { after, before, describe, it } from 'node:test';
import request from 'supertest';
import bcrypt from 'bcryptjs';
import { uuidv7 } from 'uuidv7';
import { type Mutation } from '../../shared/sync';
import { demoIds, makeForeignOrganisation, stamp, startApp, type TestContext, pushAs } from './context';

let ctx: TestContext;
let ids: Awaited<ReturnType<typeof demoIds>>;
let foreign: Awaited<ReturnType<typeof makeForeignOrganisation>>;
let admin: request.Agent;
let inspector: request.Agent;
let foreignBandId: string;
let ownBandId: string;
let foreignUserId: string;
let foreignAdmin: request.Agent;

const DEVICE = 'foreign-links-test';
function m(name: Mutation['name'], entityId: string, fields: Record<string, unknown>, device = DEVICE): Mutation {
  return { id: uuidv7(), name, buildingId: ids.clinicId, entityId, baseVersion: 0, hlc: stamp(device), fields };
}

const push = (agent: request.Agent, mutations: Mutation[], deviceId = DEVICE) => pushAs(agent, deviceId, mutations);

const POINTS = [
  { multiple: 1.5, minS: 30, maxS: 300 },
  { multiple: 3, minS: 5, maxS: 60 },
  { multiple: 10, minS: 0.01, maxS: 2 },
];

before(async () => {
  ctx = await startApp();
  ids = await demoIds(ctx.ds);
  admin = await ctx.signIn('admin');
  inspector = await ctx.signIn('inspector');
  foreign = await makeForeignOrganisation(ctx.ds);
  foreignBandId = uuidv7();
  await ctx.ds.query(
    `INSERT INTO curve_band (id, organisation_id, label, rating_a, points, updated_at) VALUES ($1, $2, 'Elsewhere 20 A', 20, $3, now())`,
    [foreignBandId, foreign.organisationId, JSON.stringify(POINTS)],
  );
  const own = await inspector.post('/api/bands').send({ label: 'Own 20 A (test)', ratingA: 20, points: POINTS }).expect(201);
  ownBandId = own.body.band.id;
  foreignUserId = uuidv7();
  const email = `elsewhere-${foreignUserId.slice(-8)}@example.test`;
  await ctx.ds.query(`INSERT INTO app_user (id, email, name, password_hash) VALUES ($1, $2, 'Elsewhere admin', $3)`, [
    foreignUserId,
    email,
    await bcrypt.hash('elsewhere-password', 4),
  ]);
  await ctx.ds.query(`INSERT INTO membership (id, user_id, organisation_id, role) VALUES ($1, $2, $3, 'admin')`, [
    uuidv7(),
    foreignUserId,
    foreign.organisationId,
  ]);
  foreignAdmin = request.agent(ctx.app);
  await foreignAdmin.post('/api/auth/sign-in').send({ email, password: 'elsewhere-password' }).expect(200);
});
after(() => ctx.close());

describe("a circuit's band is one of its own organisation's", () => {
  it('REST PATCH with another organisation\u2019s band: 400 naming bandId, nothing stored', async () => {
    const circuitId = await ids.circuitAt(ids.clinicLAId, 3);
    const res = await admin.patch(`/api/circuits/${circuitId}`).send({ bandId: foreignBandId });
    assert.equal(res.status, 400, JSON.stringify(res.body));
    assert.ok(res.body.error.fields.bandId, JSON.stringify(res.body));
    const [row] = await ctx.ds.query(`SELECT band_id FROM circuit WHERE id = $1`, [circuitId]);
    assert.notEqual(row.band_id, foreignBandId);
    // its own band is fine
    await admin.patch(`/api/circuits/${circuitId}`).send({ bandId: ownBandId }).expect(200);
    await admin.patch(`/api/circuits/${circuitId}`).send({ bandId: null }).expect(200);
  });

  it('sync circuit.patch and circuit.create with another organisation\u2019s band: rejected naming bandId', async () => {
    const circuitId = await ids.circuitAt(ids.clinicLAId, 5);
    const [patch] = await push(admin, [m('circuit.patch', circuitId, { bandId: foreignBandId })]);
    assert.equal(patch.status, 'rejected', JSON.stringify(patch));
    assert.ok(patch.fields?.bandId, JSON.stringify(patch));
    // two patches in a row take the batch path
    const batch = await push(admin, [
      m('circuit.patch', circuitId, { notes: 'batch' }),
      m('circuit.patch', await ids.circuitAt(ids.clinicLAId, 7), { bandId: foreignBandId }),
    ]);
    assert.equal(batch[1].status, 'rejected', JSON.stringify(batch));
    assert.ok(batch[1].fields?.bandId);
    // a new panel of our own to create a circuit in
    const panelId = uuidv7();
    const panelCreate = { ...m('panel.create', panelId, { tag: `FL${panelId.slice(-4)}`, system: '208Y/120V-3ph-4w', busRatingA: 100, spaces: 12 }), parentId: ids.clinicId };
    const circuitCreate = { ...m('circuit.create', uuidv7(), { position: 1, ratingA: 20, bandId: foreignBandId }), parentId: panelId };
    const [p, c] = await push(admin, [panelCreate, circuitCreate]);
    assert.equal(p.status, 'applied', JSON.stringify(p));
    assert.equal(c.status, 'rejected', JSON.stringify(c));
    assert.ok(c.fields?.bandId);
  });

  it('the trip-test verdict never uses another organisation\u2019s band, even one linked before this rule', async () => {
    const circuitId = await ids.circuitAt(ids.clinicLAId, 9);
    // a link made before the check existed
    await ctx.ds.query(`UPDATE circuit SET band_id = $1 WHERE id = $2`, [foreignBandId, circuitId]);
    try {
      const inspectionId = uuidv7();
      const readingId = uuidv7();
      const results = await push(inspector, [
        m('inspection.create', inspectionId, { kind: 'trip-test', panelIds: [ids.clinicLAId], performedOn: '2026-11-30' }),
        m('reading.create', readingId, {
          inspectionId,
          panelId: ids.clinicLAId,
          kind: 'trip',
          circuitId,
          testCurrentA: 60,
          tripped: true,
          tripTimeS: 20,
        }),
      ]);
      assert.deepEqual(results.map((r) => r.status), ['applied', 'applied'], JSON.stringify(results));
      const res = await inspector.get(`/api/inspections/${inspectionId}`).expect(200);
      const reading = res.body.readings.find((r: { id: string }) => r.id === readingId);
      assert.notEqual(reading.assessment.result?.basis, 'maker-band', JSON.stringify(reading.assessment));
    } finally {
      await ctx.ds.query(`UPDATE circuit SET band_id = NULL WHERE id = $1`, [circuitId]);
    }
  });
});

describe("a deficiency's assignee is a member of the building's organisation", () => {
  it('create and patch assigning a user of another organisation are rejected naming assigneeId', async () => {
    const id = uuidv7();
    const [create] = await push(admin, [
      m('deficiency.create', id, { panelId: ids.clinicLAId, title: 'Cover screw missing', priority: 3, assigneeId: foreignUserId }),
    ]);
    assert.equal(create.status, 'rejected', JSON.stringify(create));
    assert.ok(create.fields?.assigneeId);
    const [ok] = await push(admin, [m('deficiency.create', id, { panelId: ids.clinicLAId, title: 'Cover screw missing', priority: 3 })]);
    assert.equal(ok.status, 'applied', JSON.stringify(ok));
    const [patch] = await push(admin, [m('deficiency.patch', id, { assigneeId: foreignUserId })]);
    assert.equal(patch.status, 'rejected', JSON.stringify(patch));
    assert.ok(patch.fields?.assigneeId);
    const [electrician] = await ctx.ds.query(`SELECT id FROM app_user WHERE email = 'electrician@ampwright.test'`);
    const [own] = await push(admin, [m('deficiency.patch', id, { assigneeId: electrician.id })]);
    assert.equal(own.status, 'applied', JSON.stringify(own));
  });
});

describe('photos of a signed inspection\u2019s readings are frozen with it', () => {
  it('a photo row cannot be added to (or changed under) a reading once its inspection is signed', async () => {
    const inspectionId = uuidv7();
    const readingId = uuidv7();
    const photoId = uuidv7();
    const photo = (id: string) =>
      m('photo.create', id, {
        parentKind: 'reading',
        parentId: readingId,
        purpose: 'thermal',
        sha256: 'a'.repeat(64),
        bytes: 1000,
        contentType: 'image/jpeg',
        takenAt: new Date().toISOString(),
      });
    const setup = await push(inspector, [
      m('inspection.create', inspectionId, { kind: 'visual', panelIds: [ids.clinicLAId], performedOn: '2026-11-30' }),
      m('reading.create', readingId, { inspectionId, panelId: ids.clinicLAId, kind: 'visual', check: 'cover-screws' }),
      photo(photoId),
      m('inspection.sign', inspectionId, {}),
    ]);
    assert.deepEqual(setup.map((r) => r.status), ['applied', 'applied', 'applied', 'applied'], JSON.stringify(setup));
    const [late] = await push(inspector, [photo(uuidv7())]);
    assert.equal(late.status, 'rejected', JSON.stringify(late));
    assert.match(late.reason ?? '', /signed/);
    const [caption] = await push(inspector, [m('photo.patch', photoId, { caption: 'changed after signing' })]);
    assert.equal(caption.status, 'rejected', JSON.stringify(caption));
    const [gone] = await push(inspector, [m('photo.delete', photoId, {})]);
    assert.equal(gone.status, 'rejected', JSON.stringify(gone));
  });
});

describe('the replay guard is per user', () => {
  it('another account cannot pre-empt a mutation id, nor read its stored result', async () => {
    const device = 'shared-device-id';
    const mutationId = uuidv7();
    // B (another organisation) pushes first with A's device id and A's coming mutation id
    const squat = { ...m('building.patch', ids.clinicId, { notes: 'squatted' }, device), id: mutationId };
    const [b] = await push(foreignAdmin, [squat], device);
    assert.equal(b.status, 'rejected', JSON.stringify(b));
    // A's real mutation with that id is applied, not answered as B's duplicate
    const [before] = await ctx.ds.query(`SELECT notes FROM building WHERE id = $1`, [ids.clinicId]);
    const real = { ...m('building.patch', ids.clinicId, { notes: before.notes }, device), id: mutationId };
    const [a] = await push(admin, [real], device);
    assert.equal(a.status, 'applied', JSON.stringify(a));
    // B replaying the id again gets its own answer, never A's
    const [again] = await push(foreignAdmin, [squat], device);
    assert.equal(again.status, 'duplicate');
    assert.equal(again.originalStatus, 'rejected');
    assert.equal(again.version, 0);
    // and a fresh id A used first is not B's to read either
    const second = { ...m('building.patch', ids.clinicId, { notes: before.notes }, device) };
    const [a2] = await push(admin, [second], device);
    assert.equal(a2.status, 'applied');
    const [b2] = await push(foreignAdmin, [second], device);
    assert.notEqual(b2.status, 'duplicate', JSON.stringify(b2));
    assert.equal(b2.status, 'rejected');
  });
});
