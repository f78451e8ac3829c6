/**
 * The fields the panel checks of issue 13 (items 7–11 and 13) need, through the sync push and pull
 * on the real PostgreSQL test cluster: a panel's available fault current (NEC 110.24 label, utility
 * or engineer [V]), its series rating (240.86 [V]), feeder rating and measured demand (220.87 [V]),
 * its clamp readings; a circuit's breaker identity, interrupting rating (110.9 [V]), ambient and
 * conductor count (310.15(B)(1), (C)(1) [V]) and "verified at the panel"; a thermal reading's
 * emissivity, reflected temperature, distance and camera; photos of a circuit and of a panel.
 * Rows it changes are its own (a new panel in the clinic).
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
let inspector: request.Agent;
let electricianId: string;
let panelId: string;
let circuitId: string;

const DEVICE = 'panel-checks-test';
const m = (name: Mutation['name'], entityId: string, fields: Record<string, unknown>, parentId?: string): Mutation => ({
  id: uuidv7(), name, buildingId: ids.clinicId, entityId, baseVersion: 0, hlc: stamp(DEVICE), fields, ...(parentId ? { parentId } : {}),
});
const push = async (agent: request.Agent, mutation: Mutation) => (await pushAs(agent, DEVICE, [mutation]))[0];
async function applied(agent: request.Agent, mutation: Mutation) {
  const result = await push(agent, mutation);
  assert.equal(result.status, 'applied', `${mutation.name}: ${JSON.stringify(result)}`);
}
async function rejected(agent: request.Agent, mutation: Mutation, field: string, message: RegExp) {
  const result = await push(agent, mutation);
  assert.equal(result.status, 'rejected', `${mutation.name} ${JSON.stringify(mutation.fields)}: ${JSON.stringify(result)}`);
  const fields = (result as { fields?: Record<string, string> }).fields ?? {};
  assert.ok(field in fields, `expected a message for ${field}, got ${JSON.stringify(result)}`);
  assert.match(fields[field], message);
}
async function pulled<T>(agent: request.Agent, list: 'panels' | 'circuits' | 'readings' | 'photos', id: string): Promise<T> {
  const res = await agent.post('/api/sync/pull').send({ deviceId: DEVICE, schemaVersion: SCHEMA_VERSION, cursors: {} });
  assert.equal(res.status, 200);
  const rows = (res.body as PullResponse).buildings.flatMap((b) => (b.upserts[list] ?? []) as { id: string }[]);
  const row = rows.find((r) => r.id === id);
  assert.ok(row, `${list} ${id} pulled`);
  return row as T;
}

before(async () => {
  ctx = await startApp();
  ids = await demoIds(ctx.ds);
  [electrician, inspector] = await Promise.all((['electrician', 'inspector'] as const).map((r) => ctx.signIn(r)));
  [{ id: electricianId }] = await ctx.ds.query(`SELECT id FROM app_user WHERE email = 'electrician@ampwright.test'`);
  panelId = uuidv7();
  circuitId = uuidv7();
  await applied(electrician, m('panel.create', panelId, { tag: 'PC13', system: '208Y/120V-3ph-4w', busRatingA: 225, spaces: 30 }, ids.clinicId));
  await applied(electrician, m('circuit.create', circuitId, { position: 1, ratingA: 20, description: 'Exam room receptacles' }, panelId));
});
after(() => ctx.close());

describe('panel: fault current, series rating, feeder and measured demand, clamp readings', () => {
  it('a new panel has none of them recorded', async () => {
    const panel = await pulled<Record<string, unknown>>(electrician, 'panels', panelId);
    assert.equal(panel.availableFaultKA, null);
    assert.equal(panel.seriesRated, false);
    assert.equal(panel.feederRatingA, null);
    assert.equal(panel.peakDemand, null);
    assert.equal(panel.measuredA, null);
  });

  it('pushes and pulls every field', async () => {
    await applied(electrician, m('panel.patch', panelId, {
      availableFaultKA: 22, availableFaultOn: '2025-03-01', availableFaultSource: 'label', shortCircuitKA: 22,
      seriesRated: true, seriesRatingNote: 'Marked 22 kA with the 225 A main', feederRatingA: 200,
      peakDemand: 31.5, peakDemandUnit: 'kVA', peakDemandBasis: 'year', peakDemandOn: '2026-10-31',
    }));
    await applied(electrician, m('panel.patch', panelId, { measuredA: 41.2, measuredB: 38, measuredC: 29.5, measuredN: 12, measuredOn: '2026-11-30' }));
    const panel = await pulled<Record<string, unknown>>(electrician, 'panels', panelId);
    assert.deepEqual(
      [panel.availableFaultKA, panel.availableFaultOn, panel.availableFaultSource, panel.seriesRated, panel.seriesRatingNote, panel.feederRatingA],
      [22, '2025-03-01', 'label', true, 'Marked 22 kA with the 225 A main', 200],
    );
    assert.deepEqual([panel.peakDemand, panel.peakDemandUnit, panel.peakDemandBasis, panel.peakDemandOn], [31.5, 'kVA', 'year', '2026-10-31']);
    assert.deepEqual([panel.measuredA, panel.measuredB, panel.measuredC, panel.measuredN, panel.measuredOn], [41.2, 38, 29.5, 12, '2026-11-30']);
    // the panel read (one statement) carries them too
    const read = await electrician.get(`/api/panels/${panelId}`);
    assert.equal(read.status, 200);
    assert.equal(read.body.panel.availableFaultKA, 22);
    assert.equal(read.body.panel.measuredN, 12);
  });

  it('refuses bad values field by field', async () => {
    await rejected(electrician, m('panel.patch', panelId, { availableFaultKA: -5 }), 'availableFaultKA', /more than 0/);
    await rejected(electrician, m('panel.patch', panelId, { availableFaultKA: 500 }), 'availableFaultKA', /at most 200 kA/);
    await rejected(electrician, m('panel.patch', panelId, { availableFaultSource: 'guess' }), 'availableFaultSource', /label, utility, engineer/);
    await rejected(electrician, m('panel.patch', panelId, { availableFaultOn: '2025-02-30' }), 'availableFaultOn', /not a day of the calendar/);
    await rejected(electrician, m('panel.patch', panelId, { peakDemandBasis: 'week' }), 'peakDemandBasis', /year, 30-day/);
    await rejected(electrician, m('panel.patch', panelId, { measuredB: -1 }), 'measuredB', /cannot be negative/);
    await rejected(electrician, m('panel.patch', panelId, { feederRatingA: 0 }), 'feederRatingA', /more than 0/);
  });

  it('a fault current needs its date and source; a peak its basis, unit and date; clamp readings their date', async () => {
    const other = uuidv7();
    await rejected(electrician, m('panel.create', other, { tag: 'PC13b', system: '120/240V-1ph-3w', busRatingA: 100, spaces: 4, availableFaultKA: 10 }, ids.clinicId), 'availableFaultOn', /date/);
    await rejected(electrician, m('panel.patch', panelId, { availableFaultSource: null }), 'availableFaultSource', /where the figure comes from/);
    await rejected(electrician, m('panel.patch', panelId, { peakDemandOn: null }), 'peakDemandOn', /date/);
    await rejected(electrician, m('panel.patch', panelId, { measuredOn: null }), 'measuredOn', /date/);
    // clearing the figure clears the need
    await applied(electrician, m('panel.patch', panelId, { measuredA: null, measuredB: null, measuredC: null, measuredN: null, measuredOn: null }));
    await applied(electrician, m('panel.patch', panelId, { measuredA: 41.2, measuredB: 38, measuredC: 29.5, measuredN: 12, measuredOn: '2026-11-30' }));
  });
});

describe('circuit: breaker identity, interrupting rating, corrections, verified at the panel', () => {
  it('pushes and pulls every field; the verifier is a person of the organisation', async () => {
    await applied(electrician, m('circuit.patch', circuitId, {
      interruptingKA: 10, breakerMake: 'Acme Electric', catalogueNumber: 'QX120', ambientC: 45, currentCarrying: 6,
    }));
    await applied(electrician, m('circuit.patch', circuitId, { verifiedOn: '2026-12-02', verifiedBy: electricianId }));
    const circuit = await pulled<Record<string, unknown>>(electrician, 'circuits', circuitId);
    assert.deepEqual(
      [circuit.interruptingKA, circuit.breakerMake, circuit.catalogueNumber, circuit.ambientC, circuit.currentCarrying, circuit.verifiedOn, circuit.verifiedBy],
      [10, 'Acme Electric', 'QX120', 45, 6, '2026-12-02', electricianId],
    );
  });

  it('refuses bad values field by field', async () => {
    await rejected(electrician, m('circuit.patch', circuitId, { interruptingKA: 0 }), 'interruptingKA', /more than 0/);
    await rejected(electrician, m('circuit.patch', circuitId, { ambientC: 95 }), 'ambientC', /at most 80/);
    await rejected(electrician, m('circuit.patch', circuitId, { currentCarrying: 2.5 }), 'currentCarrying', /whole number/);
    await rejected(electrician, m('circuit.patch', circuitId, { verifiedOn: '2026-12-02', verifiedBy: null }), 'verifiedBy', /who verified/);
    await rejected(electrician, m('circuit.patch', circuitId, { verifiedOn: null, verifiedBy: electricianId }), 'verifiedOn', /date/);
  });

  it('refuses a verifier of another organisation, and a photo of another organisation’s circuit', async () => {
    const foreign = await makeForeignOrganisation(ctx.ds);
    const userId = uuidv7();
    await ctx.ds.query(`INSERT INTO app_user (id, email, name, password_hash) VALUES ($1, $2, 'Elsewhere Tech', 'x')`, [userId, `${userId}@elsewhere.test`]);
    await ctx.ds.query(`INSERT INTO membership (id, user_id, organisation_id, role) VALUES ($1, $2, $3, 'electrician')`, [uuidv7(), userId, foreign.organisationId]);
    await rejected(electrician, m('circuit.patch', circuitId, { verifiedOn: '2026-12-02', verifiedBy: userId }), 'verifiedBy', /not a person of this organisation/);
    const photo = { parentKind: 'circuit', parentId: foreign.circuitId, purpose: 'equipment', sha256: 'a'.repeat(64), bytes: 1000, contentType: 'image/jpeg', takenAt: '2026-12-02T10:00:00.000Z' };
    await rejected(inspector, m('photo.create', uuidv7(), photo), 'parentId', /no such circuit in this building/);
  });
});

describe('photos of a circuit and of a panel (parents besides readings and deficiencies)', () => {
  it('a circuit and a panel take an equipment photo; other purposes are refused', async () => {
    const base = { purpose: 'equipment', sha256: 'b'.repeat(64), bytes: 1000, contentType: 'image/jpeg', takenAt: '2026-12-02T10:00:00.000Z' };
    const ofCircuit = uuidv7();
    const ofPanel = uuidv7();
    await applied(inspector, m('photo.create', ofCircuit, { ...base, parentKind: 'circuit', parentId: circuitId }));
    await applied(electrician, m('photo.create', ofPanel, { ...base, parentKind: 'panel', parentId: panelId }));
    await rejected(inspector, m('photo.create', uuidv7(), { ...base, parentKind: 'panel', parentId: panelId, purpose: 'repair' }), 'purpose', /equipment/);
    const photo = await pulled<{ parentKind: string; parentId: string }>(electrician, 'photos', ofCircuit);
    assert.deepEqual([photo.parentKind, photo.parentId], ['circuit', circuitId]);
  });
});

describe('thermal reading: what a thermographer records with the image', () => {
  it('pushes and pulls emissivity, reflected temperature, distance and camera; refuses bad ones', async () => {
    const inspection = uuidv7();
    await applied(inspector, m('inspection.create', inspection, { kind: 'thermal-survey', panelIds: [panelId], performedOn: '2026-11-30' }));
    const id = uuidv7();
    const reading = {
      inspectionId: inspection, panelId, circuitId, kind: 'thermal', component: 'lug', referenceBasis: 'similar', temperatureC: 48, referenceC: 33,
    };
    await applied(inspector, m('reading.create', id, { ...reading, emissivity: 0.95, reflectedC: 22, distanceM: 1.2, camera: 'Handheld IR 320' }));
    const row = await pulled<Record<string, unknown>>(inspector, 'readings', id);
    assert.deepEqual([row.emissivity, row.reflectedC, row.distanceM, row.camera], [0.95, 22, 1.2, 'Handheld IR 320']);
    await rejected(inspector, m('reading.patch', id, { emissivity: 1.2 }), 'emissivity', /at most 1/);
    await rejected(inspector, m('reading.patch', id, { distanceM: 0 }), 'distanceM', /more than 0/);
  });
});
