/**
 * A panel's arc-flash label through the sync push and pull (server/sync/kinds/arc-flash.ts), on
 * the real PostgreSQL test cluster: electricians and admins write it, inspectors and owners read
 * it (shared/permissions.ts `arc-flash.edit`); the checks of NFPA 70E 130.5(H) [2021 ed.,
 * REFERENCES.md V] — one of incident energy and PPE category, not both — hold for a patch as
 * stored after the merge; a panel of another organisation is never linked.
 */
import assert from 'node:assert/strict';
import { after, before, describe, it } from 'node:test';
import type request from 'supertest';
import { uuidv7 } from 'uuidv7';
import { SCHEMA_VERSION, type Mutation, type PullResponse } from '../../shared/sync';
import { demoIds, makeForeignOrganisation, stamp, startApp, type TestContext, pushAs } from './context';

let ctx: TestContext;
let ids: Awaited<ReturnType<typeof demoIds>>;
let electrician: request.Agent;
let admin: request.Agent;
let inspector: request.Agent;
let owner: request.Agent;

before(async () => {
  ctx = await startApp();
  ids = await demoIds(ctx.ds);
  [electrician, admin, inspector, owner] = await Promise.all(
    (['electrician', 'admin', 'inspector', 'owner'] as const).map((r) => ctx.signIn(r)),
  );
});
after(() => ctx.close());

const DEVICE = 'arc-flash-test';
function m(name: Mutation['name'], entityId: string, fields: Record<string, unknown>, buildingId = ids.clinicId): Mutation {
  return { id: uuidv7(), name, buildingId, entityId, baseVersion: 0, hlc: stamp(DEVICE), fields };
}

const push = (agent: request.Agent, ...mutations: Mutation[]) => pushAs(agent, DEVICE, mutations);

async function one(agent: request.Agent, mutation: Mutation, status: 'applied' | 'rejected') {
  const [result] = await push(agent, mutation);
  assert.equal(result.status, status, JSON.stringify(result));
  return result;
}

async function labelsPulled(agent: request.Agent) {
  const res = await agent.post('/api/sync/pull').send({ deviceId: `${DEVICE}-pull`, schemaVersion: SCHEMA_VERSION, cursors: {} });
  assert.equal(res.status, 200, JSON.stringify(res.body));
  const page = (res.body as PullResponse).buildings.find((b) => b.buildingId === ids.clinicId);
  assert.ok(page, 'the clinic is pulled');
  return page.upserts.arcFlashLabels;
}

const label = (over: Record<string, unknown> = {}) => ({
  panelId: ids.clinicLAId,
  studyDate: '2023-04-12',
  incidentEnergyCalCm2: 4.2,
  boundaryIn: 36,
  workingDistanceIn: 18,
  nominalV: 208,
  studyBy: 'Study Engineering LLC',
  ...over,
});

describe('arc-flash labels through the sync', () => {
  it('an electrician adds one; inspectors and owners pull it', async () => {
    const id = uuidv7();
    await one(electrician, m('arc-flash.create', id, label()), 'applied');
    for (const reader of [inspector, owner]) {
      const row = (await labelsPulled(reader)).find((l) => l.id === id);
      assert.ok(row, 'pulled');
      assert.equal(row.studyDate, '2023-04-12');
      assert.equal(row.incidentEnergyCalCm2, 4.2);
      assert.equal(row.ppeCategory, null);
      assert.equal(row.panelId, ids.clinicLAId);
    }
  });

  it('inspectors and owners may not write one (403-like refusal in the push)', async () => {
    for (const agent of [inspector, owner]) {
      const result = await one(agent, m('arc-flash.create', uuidv7(), label()), 'rejected');
      assert.match(result.reason ?? '', /cannot record an arc-flash label/i);
    }
    const id = uuidv7();
    await one(admin, m('arc-flash.create', id, label({ incidentEnergyCalCm2: null, ppeCategory: 2 })), 'applied');
    await one(inspector, m('arc-flash.patch', id, { nominalV: 480 }), 'rejected');
    await one(owner, m('arc-flash.delete', id, {}), 'rejected');
  });

  it('refuses bad figures field by field', async () => {
    const result = await one(
      electrician,
      m('arc-flash.create', uuidv7(), label({ incidentEnergyCalCm2: -1, boundaryIn: 0, workingDistanceIn: 0, studyDate: '2999-01-01' })),
      'rejected',
    );
    assert.deepEqual(Object.keys(result.fields ?? {}).sort(), ['boundaryIn', 'incidentEnergyCalCm2', 'studyDate', 'workingDistanceIn']);
    const neither = await one(electrician, m('arc-flash.create', uuidv7(), label({ incidentEnergyCalCm2: null })), 'rejected');
    assert.ok(neither.fields?.incidentEnergyCalCm2 && neither.fields.ppeCategory, JSON.stringify(neither));
    const category = await one(electrician, m('arc-flash.create', uuidv7(), label({ incidentEnergyCalCm2: null, ppeCategory: 5 })), 'rejected');
    assert.ok(category.fields?.ppeCategory, JSON.stringify(category));
  });

  it('a patch is checked as the label would be stored: a category on top of an energy is refused (130.5(H))', async () => {
    const id = uuidv7();
    await one(electrician, m('arc-flash.create', id, label()), 'applied');
    const both = await one(electrician, m('arc-flash.patch', id, { ppeCategory: 2 }), 'rejected');
    assert.match(both.fields?.ppeCategory ?? '', /not both/);
    // the category in place of the energy, in one patch, is a label
    await one(electrician, m('arc-flash.patch', id, { ppeCategory: 2, incidentEnergyCalCm2: null }), 'applied');
    // a run of patches goes through the kind's batch planner: both land, in order
    const results = await push(electrician, m('arc-flash.patch', id, { nominalV: 480 }), m('arc-flash.patch', id, { boundaryIn: 48 }));
    assert.deepEqual(results.map((r) => r.status), ['applied', 'applied']);
    const row = (await labelsPulled(electrician)).find((l) => l.id === id);
    assert.deepEqual([row?.ppeCategory, row?.incidentEnergyCalCm2, row?.nominalV, row?.boundaryIn], [2, null, 480, 48]);
  });

  it('never links a panel of another organisation', async () => {
    const foreign = await makeForeignOrganisation(ctx.ds);
    // their panel named in our building: no such panel here
    const inOurs = await one(electrician, m('arc-flash.create', uuidv7(), label({ panelId: foreign.panelId })), 'rejected');
    assert.ok(inOurs.fields?.panelId, JSON.stringify(inOurs));
    // their building itself: not found, as every row of another organisation
    const inTheirs = await one(
      electrician,
      m('arc-flash.create', uuidv7(), label({ panelId: foreign.panelId }), foreign.buildingId),
      'rejected',
    );
    assert.match(inTheirs.reason ?? '', /not found/i);
    const [{ n }] = await ctx.ds.query(`SELECT count(*)::int AS n FROM arc_flash_label WHERE panel_id = $1`, [foreign.panelId]);
    assert.equal(n, 0);
  });

  it('a delete is a tombstone the next pull carries', async () => {
    const id = uuidv7();
    await one(electrician, m('arc-flash.create', id, label()), 'applied');
    const before = await electrician.post('/api/sync/pull').send({ deviceId: `${DEVICE}-d`, schemaVersion: SCHEMA_VERSION, cursors: {} });
    const cursor = (before.body as PullResponse).buildings.find((b) => b.buildingId === ids.clinicId)!.toVersion;
    await one(electrician, m('arc-flash.delete', id, {}), 'applied');
    const res = await electrician
      .post('/api/sync/pull')
      .send({ deviceId: `${DEVICE}-d`, schemaVersion: SCHEMA_VERSION, cursors: { [ids.clinicId]: cursor } });
    const page = (res.body as PullResponse).buildings.find((b) => b.buildingId === ids.clinicId)!;
    assert.deepEqual(page.tombstones.arcFlashLabels, [id]);
  });
});
