/** Creating, changing and deleting buildings, panels and circuits through the REST routes. */
import assert from 'node:assert/strict';
import { after, before, describe, it } from 'node:test';
import type request from 'supertest';
import { demoIds, startApp, type TestContext } from './context';

let ctx: TestContext;
let ids: Awaited<ReturnType<typeof demoIds>>;
let electrician: request.Agent;

before(async () => {
  ctx = await startApp();
  ids = await demoIds(ctx.ds);
  electrician = await ctx.signIn('electrician');
});
after(() => ctx.close());

async function newPanel(system = '208Y/120V-3ph-4w', spaces = 30) {
  const building = await electrician.post('/api/buildings').send({ name: 'Validation annex' }).expect(201);
  const panel = await electrician
    .post(`/api/buildings/${building.body.building.id}/panels`)
    .send({ tag: 'T1', system, busRatingA: 100, mainRatingA: 100, spaces })
    .expect(201);
  return { buildingId: building.body.building.id as string, panelId: panel.body.panel.id as string };
}

describe('create and update', () => {
  it('creates a building, a panel fed from nothing and a circuit, with sync columns', async () => {
    const { buildingId, panelId } = await newPanel();
    const res = await electrician
      .post(`/api/panels/${panelId}/circuits`)
      .send({ position: 1, poles: 2, ratingA: 30, description: 'Water heater WH-9', loadKind: 'appliance' })
      .expect(201);
    const c = res.body.circuit;
    assert.match(c.id, /^[0-9a-f]{8}-[0-9a-f]{4}-7/, 'a UUIDv7');
    assert.match(c.updatedAt, /^\d{4}-\d{2}-\d{2}T\d{2}:\d{2}:\d{2}\.\d{3}Z-[0-9a-f]{4}-server$/);
    assert.equal(c.deletedAt, null);
    assert.ok(c.version > 1);
    const building = await electrician.get(`/api/buildings/${buildingId}`).expect(200);
    assert.equal(building.body.panels.length, 1);
    assert.equal(building.body.building.panelCount, 1);
  });

  it('accepts a client-made id and refuses the same id twice', async () => {
    const { panelId } = await newPanel();
    const id = '01900000-0000-7000-8000-000000000abc';
    await electrician.post(`/api/panels/${panelId}/circuits`).send({ id, position: 5, ratingA: 20 }).expect(201);
    const again = await electrician.post(`/api/panels/${panelId}/circuits`).send({ id, position: 7, ratingA: 20 }).expect(409);
    assert.equal(again.body.error.code, 'exists');
  });

  it('patches only the named fields and stamps each in field_meta', async () => {
    const circuitId = await ids.circuitAt(ids.clinicLAId, 3);
    const before = await electrician.get(`/api/panels/${ids.clinicLAId}`).expect(200);
    const old = before.body.circuits.find((c: { id: string }) => c.id === circuitId);
    const res = await electrician.patch(`/api/circuits/${circuitId}`).send({ description: 'Exam 3 & 4 receptacles (east wall)' }).expect(200);
    assert.equal(res.body.circuit.description, 'Exam 3 & 4 receptacles (east wall)');
    assert.equal(res.body.circuit.ratingA, old.ratingA);
    assert.ok(res.body.circuit.version > old.version);
    const [row] = await ctx.ds.query(`SELECT field_meta FROM circuit WHERE id = $1`, [circuitId]);
    assert.equal(row.field_meta.description.hlc, res.body.circuit.updatedAt);
    assert.notEqual(row.field_meta.ratingA.hlc, res.body.circuit.updatedAt);
  });

  it('bumps the building version on every write', async () => {
    const [{ version: v1 }] = await ctx.ds.query(`SELECT version FROM building WHERE id = $1`, [ids.clinicId]);
    await electrician.patch(`/api/circuits/${await ids.circuitAt(ids.clinicLAId, 5)}`).send({ notes: 'v' }).expect(200);
    const [{ version: v2 }] = await ctx.ds.query(`SELECT version FROM building WHERE id = $1`, [ids.clinicId]);
    assert.equal(Number(v2), Number(v1) + 1);
  });
});

describe('validation names the bad fields', () => {
  it('ratingA not a number', async () => {
    const res = await electrician.patch(`/api/circuits/${await ids.circuitAt(ids.clinicLAId, 1)}`).send({ ratingA: 'twenty' }).expect(400);
    assert.equal(res.body.error.code, 'invalid');
    assert.match(res.body.error.fields.ratingA, /number/);
  });

  it('several bad fields at once, each named', async () => {
    const { panelId } = await newPanel();
    const res = await electrician
      .post(`/api/panels/${panelId}/circuits`)
      .send({ position: 0, poles: 4, ratingA: -5, conductorSize: '13' })
      .expect(400);
    for (const field of ['position', 'poles', 'ratingA', 'conductorSize']) assert.ok(res.body.error.fields[field], field);
  });

  it('a 2-pole breaker overlapping another', async () => {
    const { panelId } = await newPanel();
    await electrician.post(`/api/panels/${panelId}/circuits`).send({ position: 3, ratingA: 20 }).expect(201);
    // a 2-pole at 1 occupies 1 and 3
    const res = await electrician.post(`/api/panels/${panelId}/circuits`).send({ position: 1, poles: 2, ratingA: 30 }).expect(400);
    assert.match(res.body.error.fields.position, /3/);
  });

  it('a breaker past the last space, and a 3-pole on a single-phase panel', async () => {
    const { panelId } = await newPanel('120/240V-1ph-3w', 12);
    const far = await electrician.post(`/api/panels/${panelId}/circuits`).send({ position: 11, poles: 2, ratingA: 30 }).expect(400);
    assert.ok(far.body.error.fields.position);
    const three = await electrician.post(`/api/panels/${panelId}/circuits`).send({ position: 1, poles: 3, ratingA: 30 }).expect(400);
    assert.ok(three.body.error.fields.poles);
  });

  it('moving a breaker onto an occupied position is refused', async () => {
    const res = await electrician
      .patch(`/api/circuits/${await ids.circuitAt(ids.clinicLAId, 1)}`)
      .send({ position: 2 })
      .expect(400);
    assert.ok(res.body.error.fields.position);
  });

  it('a breaker without a rating, a space with one', async () => {
    const { panelId } = await newPanel();
    const noRating = await electrician.post(`/api/panels/${panelId}/circuits`).send({ position: 1, ratingA: null }).expect(400);
    assert.ok(noRating.body.error.fields.ratingA);
    const space = await electrician.post(`/api/panels/${panelId}/circuits`).send({ position: 1, status: 'space', ratingA: 20 }).expect(400);
    assert.ok(space.body.error.fields.ratingA);
  });

  it('shrinking a panel below its circuits is refused', async () => {
    const res = await electrician.patch(`/api/panels/${ids.clinicLAId}`).send({ spaces: 12 }).expect(400);
    assert.ok(res.body.error.fields.spaces);
  });

  it('unknown fields in a patch are refused', async () => {
    const res = await electrician.patch(`/api/panels/${ids.clinicLAId}`).send({ colour: 'red' }).expect(400);
    assert.equal(res.body.error.code, 'invalid');
  });

  it('unknown and malformed ids are 404', async () => {
    await electrician.get('/api/panels/01900000-0000-7000-8000-00000000ffff').expect(404);
    await electrician.get('/api/panels/not-a-uuid').expect(404);
    await electrician.patch('/api/circuits/01900000-0000-7000-8000-00000000ffff').send({ notes: 'x' }).expect(404);
  });
});

describe('deletes are tombstones', () => {
  it('a deleted circuit leaves the schedule but stays in the table, stamped', async () => {
    const { panelId } = await newPanel();
    const created = await electrician.post(`/api/panels/${panelId}/circuits`).send({ position: 9, ratingA: 20, description: 'Temporary lights' }).expect(201);
    const id = created.body.circuit.id;
    const del = await electrician.delete(`/api/circuits/${id}`).expect(200);
    const panel = await electrician.get(`/api/panels/${panelId}`).expect(200);
    assert.ok(!panel.body.circuits.some((c: { id: string }) => c.id === id));
    const [row] = await ctx.ds.query(`SELECT deleted_at, version FROM circuit WHERE id = $1`, [id]);
    assert.ok(row.deleted_at instanceof Date);
    assert.equal(Number(row.version), del.body.version);
    await electrician.patch(`/api/circuits/${id}`).send({ notes: 'x' }).expect(404);
    await electrician.delete(`/api/circuits/${id}`).expect(404);
    // its position is free again
    await electrician.post(`/api/panels/${panelId}/circuits`).send({ position: 9, ratingA: 20 }).expect(201);
  });

  it('deleting a panel tombstones its circuits with it', async () => {
    const { buildingId, panelId } = await newPanel();
    await electrician.post(`/api/panels/${panelId}/circuits`).send({ position: 1, ratingA: 20 }).expect(201);
    await electrician.post(`/api/panels/${panelId}/circuits`).send({ position: 2, ratingA: 20 }).expect(201);
    await electrician.delete(`/api/panels/${panelId}`).expect(200);
    await electrician.get(`/api/panels/${panelId}`).expect(404);
    const rows = await ctx.ds.query(`SELECT deleted_at FROM circuit WHERE panel_id = $1`, [panelId]);
    assert.equal(rows.length, 2);
    assert.ok(rows.every((r: { deleted_at: Date | null }) => r.deleted_at !== null));
    const building = await electrician.get(`/api/buildings/${buildingId}`).expect(200);
    assert.equal(building.body.panels.length, 0);
  });
});
