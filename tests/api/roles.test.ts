/**
 * The role matrix: each role × read/write × own organisation (granted or not) / foreign
 * organisation. Foreign rows answer 404, never 403, so their existence is not disclosed.
 */
import assert from 'node:assert/strict';
import { after, before, describe, it } from 'node:test';
import type request from 'supertest';
import { demoIds, makeForeignOrganisation, ROLES, startApp, type RoleName, type TestContext } from './context';

let ctx: TestContext;
let ids: Awaited<ReturnType<typeof demoIds>>;
let foreign: Awaited<ReturnType<typeof makeForeignOrganisation>>;
const agents = {} as Record<RoleName, request.Agent>;
/** an empty panel in the clinic (the demo panels have every position filled) */
let emptyPanelId: string;

before(async () => {
  ctx = await startApp();
  ids = await demoIds(ctx.ds);
  foreign = await makeForeignOrganisation(ctx.ds);
  for (const role of ROLES) agents[role] = await ctx.signIn(role);
  const panel = await agents.admin
    .post(`/api/buildings/${ids.clinicId}/panels`)
    .send({ tag: 'RT', system: '208Y/120V-3ph-4w', busRatingA: 100, spaces: 30 })
    .expect(201);
  emptyPanelId = panel.body.panel.id;
});
after(() => ctx.close());

/** expected status for [read own granted, read own not granted, write own granted, write own not granted] */
const MATRIX: Record<RoleName, { read: [number, number]; write: [number, number] }> = {
  admin: { read: [200, 200], write: [200, 200] },
  electrician: { read: [200, 200], write: [200, 200] },
  inspector: { read: [200, 200], write: [403, 403] },
  owner: { read: [200, 404], write: [403, 404] },
};

describe('reads in the own organisation', () => {
  for (const role of ROLES) {
    it(`${role}: building list shows exactly the buildings the role may see`, async () => {
      const res = await agents[role].get('/api/buildings').expect(200);
      const names = res.body.buildings.map((b: { name: string }) => b.name);
      const demo = ['Brackenfold Family Clinic', 'Copperwick Lofts', 'Wrenfold Cottage'];
      if (role === 'owner') assert.deepEqual(names, ['Brackenfold Family Clinic']);
      else for (const name of demo) assert.ok(names.includes(name), name);
      assert.ok(!names.includes('Elsewhere Depot'));
    });

    it(`${role}: building and panel reads (granted clinic / ungranted lofts)`, async () => {
      const [granted, ungranted] = MATRIX[role].read;
      await agents[role].get(`/api/buildings/${ids.clinicId}`).expect(granted);
      await agents[role].get(`/api/panels/${ids.clinicLAId}`).expect(granted);
      await agents[role].get(`/api/buildings/${ids.loftsId}`).expect(ungranted);
      await agents[role].get(`/api/panels/${ids.loftsPanelId}`).expect(ungranted);
    });
  }

  it('a panel read returns its circuits in position order', async () => {
    const res = await agents.inspector.get(`/api/panels/${ids.clinicLAId}`).expect(200);
    assert.equal(res.body.panel.tag, 'LA');
    const positions = res.body.circuits.map((c: { position: number }) => c.position);
    assert.deepEqual(positions, [...positions].sort((a, b) => a - b));
    assert.ok(positions.length > 20);
  });
});

describe('writes in the own organisation', () => {
  for (const role of ROLES) {
    it(`${role}: circuit patch on the granted clinic / ungranted lofts`, async () => {
      const [granted, ungranted] = MATRIX[role].write;
      const clinicCircuit = await ids.circuitAt(ids.clinicLAId, 1);
      const loftsCircuit = await ids.circuitAt(ids.loftsPanelId, 1);
      const res = await agents[role]
        .patch(`/api/circuits/${clinicCircuit}`)
        .send({ notes: `checked by ${role}` })
        .expect(granted);
      if (granted === 403) assert.equal(res.body.error.code, 'forbidden');
      await agents[role].patch(`/api/circuits/${loftsCircuit}`).send({ notes: `by ${role}` }).expect(ungranted);
    });

    it(`${role}: panel patch and circuit create`, async () => {
      const [granted] = MATRIX[role].write;
      await agents[role].patch(`/api/panels/${ids.clinicLAId}`).send({ location: `Corridor (${role})` }).expect(granted);
      const created = await agents[role]
        .post(`/api/panels/${emptyPanelId}/circuits`)
        .send({ position: 1, ratingA: 20, description: `Test circuit by ${role}` });
      assert.equal(created.status, granted === 200 ? 201 : granted);
      if (created.status === 201) {
        await agents[role].delete(`/api/circuits/${created.body.circuit.id}`).expect(200);
      }
    });
  }

  it('owners are told plainly that they cannot edit schedules', async () => {
    const circuit = await ids.circuitAt(ids.clinicLAId, 1);
    const res = await agents.owner.patch(`/api/circuits/${circuit}`).send({ description: 'x' }).expect(403);
    assert.match(res.body.error.message, /owners cannot edit schedules/i);
  });

  it('only an admin may delete a building', async () => {
    const created = await agents.electrician.post('/api/buildings').send({ name: 'Role test annex' }).expect(201);
    const id = created.body.building.id;
    await agents.electrician.delete(`/api/buildings/${id}`).expect(403);
    await agents.admin.delete(`/api/buildings/${id}`).expect(200);
    await agents.admin.get(`/api/buildings/${id}`).expect(404);
  });
});

describe('another organisation is invisible: 404 for every role', () => {
  for (const role of ROLES) {
    it(`${role}: reads and writes of foreign rows are 404`, async () => {
      const a = agents[role];
      await a.get(`/api/buildings/${foreign.buildingId}`).expect(404);
      await a.get(`/api/panels/${foreign.panelId}`).expect(404);
      await a.patch(`/api/buildings/${foreign.buildingId}`).send({ name: 'mine now' }).expect(404);
      await a.patch(`/api/panels/${foreign.panelId}`).send({ tag: 'Y' }).expect(404);
      await a.patch(`/api/circuits/${foreign.circuitId}`).send({ description: 'mine' }).expect(404);
      await a.post(`/api/buildings/${foreign.buildingId}/panels`).send({ tag: 'Z', system: '208Y/120V-3ph-4w', busRatingA: 100, spaces: 30 }).expect(404);
      await a.post(`/api/panels/${foreign.panelId}/circuits`).send({ position: 3, ratingA: 20 }).expect(404);
      await a.delete(`/api/circuits/${foreign.circuitId}`).expect(404);
      await a.delete(`/api/panels/${foreign.panelId}`).expect(404);
      await a.delete(`/api/buildings/${foreign.buildingId}`).expect(404);
    });
  }

  it('the foreign rows were not touched', async () => {
    const [c] = await ctx.ds.query(`SELECT description, deleted_at FROM circuit WHERE id = $1`, [foreign.circuitId]);
    assert.equal(c.description, 'Depot lights');
    assert.equal(c.deleted_at, null);
  });
});

describe('signed out', () => {
  it('every register route is 401', async () => {
    const { default: request } = await import('supertest');
    const anon = request(ctx.app);
    await anon.get('/api/buildings').expect(401);
    await anon.get(`/api/buildings/${ids.clinicId}`).expect(401);
    await anon.get(`/api/panels/${ids.clinicLAId}`).expect(401);
    await anon.patch(`/api/circuits/${await ids.circuitAt(ids.clinicLAId, 1)}`).send({ notes: 'x' }).expect(401);
  });
});
