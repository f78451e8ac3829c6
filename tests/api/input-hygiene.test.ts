/**
 * Bad dates, bad text, bad content types and lossy numbers, through REST and sync alike: every
 * one is a 4xx naming the field (400, or 415 for a body that is not JSON), or for sync a
 * `rejected` result with `fields`; never a 500, never stored. Lengths and loads come back exactly
 * as sent (double precision columns).
 */
import assert from 'node:assert/strict';
import { after, before, describe, it } from 'node:test';
import type request from 'supertest';
import { uuidv7 } from 'uuidv7';
import { SCHEMA_VERSION, type Mutation, type PullResponse } from '../../shared/sync';
import { demoIds, stamp, startApp, type TestContext, pushAs } from './context';

let ctx: TestContext;
let ids: Awaited<ReturnType<typeof demoIds>>;
let admin: request.Agent;
let inspector: request.Agent;

const DEVICE = 'input-hygiene-test';
function m(name: Mutation['name'], entityId: string, fields: Record<string, unknown>, parentId?: string): Mutation {
  return { id: uuidv7(), name, buildingId: ids.clinicId, entityId, baseVersion: 0, hlc: stamp(DEVICE), fields, ...(parentId && { parentId }) };
}
const push = (agent: request.Agent, ...mutations: Mutation[]) => pushAs(agent, DEVICE, mutations);

before(async () => {
  ctx = await startApp();
  ids = await demoIds(ctx.ds);
  admin = await ctx.signIn('admin');
  inspector = await ctx.signIn('inspector');
});
after(() => ctx.close());

const BAD_DATES = ['2026-13-45', '2026-02-31', '2025-02-29', '0000-01-01'];
const BAD_TEXT: [string, string][] = [
  ['a NUL character', 'Panel\u0000room'],
  ['a lone surrogate', 'Panel \ud800 room'],
  ['a control character', 'Panel\u001b[2Jroom'],
];

describe('impossible calendar dates', () => {
  for (const date of BAD_DATES) {
    it(`REST panel installedOn ${date} (a date column): 400 naming installedOn`, async () => {
      const res = await admin.patch(`/api/panels/${ids.clinicLAId}`).send({ installedOn: date });
      assert.equal(res.status, 400, JSON.stringify(res.body));
      assert.ok(res.body.error.fields.installedOn, JSON.stringify(res.body));
    });

    it(`sync inspection performedOn and deficiency dueOn ${date} (text columns): rejected naming the field`, async () => {
      const [inspection, deficiency] = await push(
        inspector,
        m('inspection.create', uuidv7(), { kind: 'visual', panelIds: [ids.clinicLAId], performedOn: date }),
        m('deficiency.create', uuidv7(), { panelId: ids.clinicLAId, title: 'Date check', priority: 3, dueOn: date }),
      );
      assert.equal(inspection.status, 'rejected', JSON.stringify(inspection));
      assert.ok(inspection.fields?.performedOn, JSON.stringify(inspection));
      assert.equal(deficiency.status, 'rejected', JSON.stringify(deficiency));
      assert.ok(deficiency.fields?.dueOn, JSON.stringify(deficiency));
    });
  }

  it('a real leap day is fine', async () => {
    const res = await admin.patch(`/api/panels/${ids.clinicLAId}`).send({ installedOn: '2024-02-29' });
    assert.equal(res.status, 200, JSON.stringify(res.body));
    assert.equal(res.body.panel.installedOn, '2024-02-29');
  });
});

describe('text with NUL, control characters or lone surrogates', () => {
  for (const [what, value] of BAD_TEXT) {
    it(`REST building name and panel location with ${what}: 400 naming the field`, async () => {
      const building = await admin.patch(`/api/buildings/${ids.clinicId}`).send({ name: value });
      assert.equal(building.status, 400, JSON.stringify(building.body));
      assert.ok(building.body.error.fields.name);
      const panel = await admin.patch(`/api/panels/${ids.clinicLAId}`).send({ location: value });
      assert.equal(panel.status, 400, JSON.stringify(panel.body));
      assert.ok(panel.body.error.fields.location);
    });

    it(`sync circuit notes, inspection notes and a comment with ${what}: rejected naming the field`, async () => {
      const circuitId = await ids.circuitAt(ids.clinicLAId, 11);
      const results = await push(
        inspector,
        m('inspection.create', uuidv7(), { kind: 'visual', panelIds: [ids.clinicLAId], performedOn: '2026-11-30', notes: value }),
      );
      const [circuit] = await push(admin, m('circuit.patch', circuitId, { description: value }));
      for (const [r, field] of [[results[0], 'notes'], [circuit, 'description']] as const) {
        assert.equal(r.status, 'rejected', JSON.stringify(r));
        assert.ok(r.fields?.[field], `${field} named: ${JSON.stringify(r)}`);
      }
    });
  }

  it('multi-line text keeps its newlines and tabs; a single-line field refuses them', async () => {
    const notes = 'Line one\n\tindented line two\r\nthree';
    const ok = await admin.patch(`/api/buildings/${ids.clinicId}`).send({ notes });
    assert.equal(ok.status, 200, JSON.stringify(ok.body));
    assert.equal(ok.body.building.notes, notes);
    const bad = await admin.patch(`/api/buildings/${ids.clinicId}`).send({ name: 'Two\nlines' });
    assert.equal(bad.status, 400);
    assert.ok(bad.body.error.fields.name);
  });
});

describe('content types', () => {
  it('a PATCH sent as text/plain: 415, nothing changed', async () => {
    const [before] = await ctx.ds.query(`SELECT notes FROM building WHERE id = $1`, [ids.clinicId]);
    const res = await admin
      .patch(`/api/buildings/${ids.clinicId}`)
      .set('Content-Type', 'text/plain')
      .send(JSON.stringify({ notes: 'as text' }));
    assert.equal(res.status, 415, JSON.stringify(res.body));
    assert.equal(res.body.error.code, 'unsupported_media_type');
    const [now] = await ctx.ds.query(`SELECT notes FROM building WHERE id = $1`, [ids.clinicId]);
    assert.equal(now.notes, before.notes);
  });

  it('a form-encoded POST to a JSON route: 415', async () => {
    const res = await admin.post(`/api/buildings`).type('form').send('name=Form+building');
    assert.equal(res.status, 415, JSON.stringify(res.body));
  });

  it('a POST without a body and a DELETE are not refused for their (absent) content type', async () => {
    await admin.post('/api/auth/sign-in').send({ email: 'x@example.test', password: 'y' }).expect(401);
    const res = await admin.get('/api/me');
    assert.equal(res.status, 200);
  });
});

describe('numbers come back as sent', () => {
  it('circuit length and load (REST), reading values (sync, pulled): exact round trip', async () => {
    const circuitId = await ids.circuitAt(ids.clinicLAId, 13);
    const res = await admin.patch(`/api/circuits/${circuitId}`).send({ lengthFt: 363.000362, loadVA: 1234.56789 });
    assert.equal(res.status, 200, JSON.stringify(res.body));
    const panel = await admin.get(`/api/panels/${ids.clinicLAId}`).expect(200);
    const circuit = panel.body.circuits.find((c: { id: string }) => c.id === circuitId);
    assert.equal(circuit.lengthFt, 363.000362);
    assert.equal(circuit.loadVA, 1234.56789);

    const inspectionId = uuidv7();
    const readingId = uuidv7();
    const results = await push(
      inspector,
      m('inspection.create', inspectionId, { kind: 'thermal-survey', panelIds: [ids.clinicLAId], performedOn: '2026-11-30', ambientC: 21.123456789, loadPct: 67.891234 }),
      m('reading.create', readingId, {
        inspectionId,
        panelId: ids.clinicLAId,
        kind: 'thermal',
        component: 'lug',
        temperatureC: 48.300001,
        referenceC: 31.700002,
        referenceBasis: 'similar',
        loadA: 17.000003,
        referenceLoadA: 23.456789,
      }),
    );
    assert.deepEqual(results.map((r) => r.status), ['applied', 'applied'], JSON.stringify(results));
    const pulled = await inspector.post('/api/sync/pull').send({ deviceId: DEVICE, schemaVersion: SCHEMA_VERSION, cursors: { [ids.clinicId]: 0 } });
    assert.equal(pulled.status, 200, JSON.stringify(pulled.body).slice(0, 300));
    const page = (pulled.body as PullResponse).buildings.find((b) => b.buildingId === ids.clinicId)!;
    const reading = page.upserts.readings.find((r) => r.id === readingId)!;
    assert.equal(reading.temperatureC, 48.300001);
    assert.equal(reading.referenceC, 31.700002);
    assert.equal(reading.loadA, 17.000003);
    assert.equal(reading.referenceLoadA, 23.456789);
    const inspection = page.upserts.inspections.find((i) => i.id === inspectionId)!;
    assert.equal(inspection.ambientC, 21.123456789);
    assert.equal(inspection.loadPct, 67.891234);
  });
});
