/**
 * The condition record through the sync push and the REST reads, on the real PostgreSQL test
 * cluster: each reading's verdict as the API answers it (checked against the published values of
 * ../shared/REFERENCES.md, source named beside each check), the deficiency workflow and its role
 * rules, the sign-off freeze, and who may see what. The tests work in the demo clinic; every row
 * they add is their own (new inspections, readings, deficiencies).
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

const DEVICE = 'records-test';
function m(name: Mutation['name'], entityId: string, fields: Record<string, unknown>, buildingId = ids.clinicId): Mutation {
  return { id: uuidv7(), name, buildingId, entityId, baseVersion: 0, hlc: stamp(DEVICE), fields };
}

const push = (agent: request.Agent, ...mutations: Mutation[]) => pushAs(agent, DEVICE, mutations);

/** Push one mutation and expect it applied. */
async function applied(agent: request.Agent, mutation: Mutation) {
  const [result] = await push(agent, mutation);
  assert.equal(result.status, 'applied', JSON.stringify(result));
  return result;
}

async function rejected(agent: request.Agent, mutation: Mutation) {
  const [result] = await push(agent, mutation);
  assert.equal(result.status, 'rejected', JSON.stringify(result));
  return result;
}

async function newInspection(kind = 'full-maintenance', agent = inspector) {
  const id = uuidv7();
  await applied(agent, m('inspection.create', id, { kind, panelIds: [ids.clinicLAId], performedOn: '2026-11-30', ambientC: 24, loadPct: 65 }));
  return id;
}

interface ReadingAnswer {
  id: string;
  assessment: {
    kind: string;
    priority: number | null;
    riseC?: number;
    correctedRiseC?: number | null;
    verdict?: { asFound: string | null; asLeft: string; fallback: { lbfIn: number } | null };
    result?: { verdict: string | null; basis: string; expected: { minS: number; maxS: number } | null };
    basis: string;
  };
}

async function readingsOf(inspectionId: string, agent = inspector): Promise<Map<string, ReadingAnswer>> {
  const res = await agent.get(`/api/inspections/${inspectionId}`);
  assert.equal(res.status, 200, JSON.stringify(res.body));
  return new Map((res.body.readings as ReadingAnswer[]).map((r) => [r.id, r]));
}

const thermal = (inspectionId: string, over: Record<string, unknown>) => ({
  inspectionId,
  panelId: ids.clinicLAId,
  kind: 'thermal',
  component: 'lug',
  phase: 'B',
  ...over,
});

describe('readings and their verdicts', () => {
  it('thermal: the NETA priority of the rise, with load correction', async () => {
    const inspection = await newInspection('thermal-survey');
    const cases = [
      // ANSI/NETA MTS Table 100.18: over ambient > 40 °C → priority 1
      { id: uuidv7(), fields: { temperatureC: 85, referenceC: 40, referenceBasis: 'ambient' }, priority: 1, rise: 45 },
      // MTS 100.18, similar components: 4–15 °C → priority 3
      { id: uuidv7(), fields: { temperatureC: 50, referenceC: 40, referenceBasis: 'similar' }, priority: 3, rise: 10 },
      // MTS 100.18, similar components: 1–3 °C → priority 4
      { id: uuidv7(), fields: { temperatureC: 42, referenceC: 40, referenceBasis: 'similar' }, priority: 4, rise: 2 },
      // load correction ΔT × (I_ref / I_meas)^2 (Infraspection Institute, 2023, exponent 2 [CP]):
      // 10 °C at 50 A → 40 °C at 100 A; over ambient 21–40 °C → priority 2 (MTS 100.18)
      {
        id: uuidv7(),
        fields: { temperatureC: 50, referenceC: 40, referenceBasis: 'ambient', loadA: 50, referenceLoadA: 100 },
        priority: 2,
        rise: 10,
        corrected: 40,
      },
    ];
    for (const c of cases) await applied(inspector, m('reading.create', c.id, thermal(inspection, c.fields)));
    const answers = await readingsOf(inspection);
    for (const c of cases) {
      const a = answers.get(c.id)!.assessment;
      assert.equal(a.kind, 'thermal');
      assert.equal(a.riseC, c.rise);
      assert.equal(a.priority, c.priority, JSON.stringify(c.fields));
      if (c.corrected !== undefined) assert.equal(a.correctedRiseC, c.corrected);
      assert.match(a.basis, /NETA MTS Table 100\.18/);
    }
  });

  it('torque: the UL 486A-486B fallback, as found loose, as left in the window', async () => {
    const inspection = await newInspection('torque-audit', electrician);
    const circuitId = await ids.circuitAt(ids.clinicLAId, 1);
    const id = uuidv7();
    // UL 486A-486B as printed in NEC Informative Annex I: 14–10 AWG, slotted screw ≤ 5/32 in → 20 lbf-in
    await applied(
      electrician,
      m('reading.create', id, {
        inspectionId: inspection,
        panelId: ids.clinicLAId,
        kind: 'torque',
        circuitId,
        fastener: 'breaker load terminal',
        specified: 20,
        unit: 'lbf-in',
        specSource: 'fallback-table',
        conductorSize: '12',
        screw: 'slotted-small',
        asFound: 'turned',
        asFoundValue: 12,
        asLeft: 20,
      }),
    );
    const a = (await readingsOf(inspection, electrician)).get(id)!.assessment;
    assert.equal(a.verdict?.asFound, 'loose'); // 12 is 40 % under 20, outside ±10 % [CP]
    assert.equal(a.verdict?.asLeft, 'ok');
    assert.equal(a.verdict?.fallback?.lbfIn, 20);
    assert.equal(a.priority, 2);
    assert.match(a.basis, /UL 486A-486B/);
  });

  it('trip test: against the maker\u2019s band from the library, and the 100 % carry rule', async () => {
    // band points are test data standing for a maker's published curve (ANSI/NETA ATS 7.6.1.1:
    // judge against the maker's curve first); the judgement rule is what is checked
    const band = await inspector.post('/api/bands').send({
      label: 'Test curve 20 A',
      ratingA: 20,
      source: 'test data',
      points: [
        { multiple: 1.5, minS: 30, maxS: 300 },
        { multiple: 3, minS: 5, maxS: 40 },
        { multiple: 10, minS: 0.01, maxS: 2 },
      ],
    });
    assert.equal(band.status, 201, JSON.stringify(band.body));
    const bandId = band.body.band.id as string;
    const inspection = await newInspection('trip-test');
    // clinic LA position 3 is a 20 A breaker in the demo
    const circuitId = await ids.circuitAt(ids.clinicLAId, 3);
    const [{ rating_a }] = await ctx.ds.query('SELECT rating_a FROM circuit WHERE id = $1', [circuitId]);
    assert.equal(rating_a, 20);
    const trip = (over: Record<string, unknown>) => ({
      inspectionId: inspection,
      panelId: ids.clinicLAId,
      kind: 'trip',
      circuitId,
      bandId,
      ...over,
    });
    const pass = uuidv7();
    const slow = uuidv7();
    const none = uuidv7();
    const carry = uuidv7();
    await applied(inspector, m('reading.create', pass, trip({ testCurrentA: 60, tripped: true, tripTimeS: 9 })));
    await applied(inspector, m('reading.create', slow, trip({ testCurrentA: 60, tripped: true, tripTimeS: 60 })));
    await applied(inspector, m('reading.create', none, trip({ testCurrentA: 60, tripped: false })));
    await applied(inspector, m('reading.create', carry, trip({ testCurrentA: 20, tripped: true, tripTimeS: 500 })));
    const answers = await readingsOf(inspection);
    const at300 = answers.get(pass)!.assessment.result!;
    assert.equal(at300.verdict, 'pass');
    assert.equal(at300.basis, 'maker-band');
    assert.deepEqual(at300.expected, { minS: 5, maxS: 40 });
    assert.equal(answers.get(slow)!.assessment.result!.verdict, 'slow');
    assert.equal(answers.get(slow)!.assessment.priority, 1);
    assert.equal(answers.get(none)!.assessment.result!.verdict, 'no-trip');
    // UL 489: at 100 % of rating a breaker must carry the current indefinitely
    assert.equal(answers.get(carry)!.assessment.result!.verdict, 'unexpected-trip');
  });

  it('a reading that misses its kind\u2019s fields is rejected field by field', async () => {
    const inspection = await newInspection();
    const result = await rejected(inspector, m('reading.create', uuidv7(), thermal(inspection, { temperatureC: 60 })));
    assert.ok(result.reason?.includes('referenceC'), result.reason);
    const trip = await rejected(
      inspector,
      m('reading.create', uuidv7(), { inspectionId: inspection, panelId: ids.clinicLAId, kind: 'trip', testCurrentA: 60, tripped: true }),
    );
    assert.ok(trip.reason?.includes('circuitId') && trip.reason.includes('tripTimeS'), trip.reason);
  });

  it('a signed inspection is frozen: no new readings, no edits', async () => {
    const inspection = await newInspection();
    const reading = uuidv7();
    await applied(inspector, m('reading.create', reading, thermal(inspection, { temperatureC: 50, referenceC: 40, referenceBasis: 'similar' })));
    await rejected(electrician, m('inspection.sign', inspection, {})); // only inspectors and admins sign
    await applied(inspector, m('inspection.sign', inspection, {}));
    const [row] = await ctx.ds.query('SELECT signed_at, signed_by_name FROM inspection WHERE id = $1', [inspection]);
    assert.ok(row.signed_at);
    assert.ok(row.signed_by_name);
    const late = await rejected(inspector, m('reading.create', uuidv7(), thermal(inspection, { temperatureC: 60, referenceC: 40, referenceBasis: 'similar' })));
    assert.match(late.reason ?? '', /signed/);
    await rejected(inspector, m('reading.patch', reading, { temperatureC: 45 }));
    await rejected(inspector, m('inspection.patch', inspection, { notes: 'afterthought' }));
  });

  it('owners record nothing; another organisation\u2019s building is not found', async () => {
    const owned = await rejected(owner, m('inspection.create', uuidv7(), { kind: 'visual', panelIds: [ids.clinicLAId], performedOn: '2026-11-30' }));
    assert.match(owned.reason ?? '', /Owners cannot/);
    const foreign = await makeForeignOrganisation(ctx.ds);
    const result = await rejected(
      inspector,
      m('inspection.create', uuidv7(), { kind: 'visual', panelIds: [foreign.panelId], performedOn: '2026-11-30' }, foreign.buildingId),
    );
    assert.match(result.reason ?? '', /not found/i);
  });
});

describe('deficiencies', () => {
  async function raise(over: Record<string, unknown> = {}) {
    const id = uuidv7();
    await applied(inspector, m('deficiency.create', id, { title: 'Hot lug on LA 13', priority: 1, panelId: ids.clinicLAId, ...over }));
    return id;
  }
  const row = async (id: string) => (await ctx.ds.query('SELECT * FROM deficiency WHERE id = $1', [id]))[0];

  it('the due date follows the priority: 0 / 30 / 90 / 365 days by default (P1 now: due the day raised)', async () => {
    const today = new Date().toISOString().slice(0, 10);
    const plus = (days: number) => {
      const d = new Date(`${today}T00:00:00Z`);
      d.setUTCDate(d.getUTCDate() + days);
      return d.toISOString().slice(0, 10);
    };
    assert.equal((await row(await raise({ priority: 1 }))).due_on, plus(0));
    assert.equal((await row(await raise({ priority: 4 }))).due_on, plus(365));
    // a new priority moves it, and needs a reason
    const id = await raise({ priority: 3 });
    const noReason = await rejected(inspector, m('deficiency.patch', id, { priority: 2 }));
    assert.match(noReason.reason ?? '', /priorityReason/);
    await applied(inspector, m('deficiency.patch', id, { priority: 2, priorityReason: 'load grows in winter' }));
    assert.equal((await row(id)).due_on, plus(30));
  });

  it('the organisation\u2019s own due days, set by an admin, apply to new deficiencies', async () => {
    const me = (await admin.get('/api/me')).body;
    const orgId = me.memberships[0].organisationId as string;
    // P1 "now" is due the day it is raised (defaults 0/30/90/365 [CP])
    assert.deepEqual(me.memberships[0].settings.dueDays, { 1: 0, 2: 30, 3: 90, 4: 365 });
    const denied = await inspector.patch(`/api/organisations/${orgId}/settings`).send({ dueDays: { 1: 1, 2: 2, 3: 3, 4: 4 } });
    assert.equal(denied.status, 403);
    const bad = await admin.patch(`/api/organisations/${orgId}/settings`).send({ dueDays: { 1: -1, 2: 2, 3: 3, 4: 4 } });
    assert.equal(bad.status, 400);
    assert.ok(bad.body.error.fields['dueDays.1'], JSON.stringify(bad.body));
    // a lower priority never due sooner than a higher one: the field out of order is named
    const unordered = await admin.patch(`/api/organisations/${orgId}/settings`).send({ dueDays: { 1: 0, 2: 30, 3: 14, 4: 365 } });
    assert.equal(unordered.status, 400);
    assert.deepEqual(Object.keys(unordered.body.error.fields), ['dueDays.3'], JSON.stringify(unordered.body));
    const set = await admin.patch(`/api/organisations/${orgId}/settings`).send({ dueDays: { 1: 2, 2: 14, 3: 60, 4: 180 } });
    assert.equal(set.status, 200, JSON.stringify(set.body));
    try {
      const id = await raise({ priority: 1 });
      const d = new Date(`${new Date().toISOString().slice(0, 10)}T00:00:00Z`);
      d.setUTCDate(d.getUTCDate() + 2);
      assert.equal((await row(id)).due_on, d.toISOString().slice(0, 10));
    } finally {
      await admin.patch(`/api/organisations/${orgId}/settings`).send({ dueDays: { 1: 0, 2: 30, 3: 90, 4: 365 } });
    }
  });

  it('only inspectors and admins raise', async () => {
    const byElectrician = await rejected(electrician, m('deficiency.create', uuidv7(), { title: 'x', priority: 2 }));
    assert.match(byElectrician.reason ?? '', /Electricians cannot raise/);
    await rejected(owner, m('deficiency.create', uuidv7(), { title: 'x', priority: 2 }));
    const byAdmin = uuidv7();
    await applied(admin, m('deficiency.create', byAdmin, { title: 'Missing filler plate', priority: 2 }));
  });

  it('open → scheduled → repaired (with evidence) → verified, each step by its role', async () => {
    const id = await raise();
    const people: { id: string; role: string }[] = (await electrician.get('/api/me')).body.memberships[0].people;
    const me = people.find((p) => p.role === 'electrician')!;
    await applied(electrician, m('deficiency.patch', id, { status: 'scheduled', assigneeId: me.id }));
    await rejected(owner, m('deficiency.patch', id, { status: 'repaired', repairNote: 'done' }));
    const bare = await rejected(electrician, m('deficiency.patch', id, { status: 'repaired' }));
    assert.match(bare.reason ?? '', /repairNote/);
    await applied(electrician, m('deficiency.patch', id, { status: 'repaired', repairNote: 'Re-terminated and torqued to the maker\u2019s value' }));
    const notYours = await rejected(electrician, m('deficiency.patch', id, { status: 'verified' }));
    assert.match(notYours.reason ?? '', /Electricians cannot verify/);
    await applied(inspector, m('deficiency.patch', id, { status: 'verified' }));
    assert.equal((await row(id)).status, 'verified');
    // a verified deficiency cannot be deferred (only reopened)
    const late = await rejected(owner, m('deficiency.patch', id, { status: 'deferred', deferReason: 'budget', reviewOn: '2027-03-01' }));
    assert.match(late.reason ?? '', /cannot become deferred|cannot defer/);
  });

  it('a repair photo is evidence enough', async () => {
    const id = await raise({ priority: 2 });
    await applied(
      electrician,
      m('photo.create', uuidv7(), {
        parentKind: 'deficiency',
        parentId: id,
        purpose: 'repair',
        sha256: 'a'.repeat(64),
        bytes: 1000,
        contentType: 'image/jpeg',
        takenAt: new Date().toISOString(),
      }),
    );
    await applied(electrician, m('deficiency.patch', id, { status: 'repaired' }));
  });

  it('owners defer with a reason and a review date, accept a plan, and comment', async () => {
    const id = await raise({ priority: 3 });
    const bare = await rejected(owner, m('deficiency.patch', id, { status: 'deferred' }));
    assert.match(bare.reason ?? '', /deferReason/);
    assert.match(bare.reason ?? '', /reviewOn/);
    await applied(owner, m('deficiency.patch', id, { status: 'deferred', deferReason: 'Replacing the panel in spring', reviewOn: '2027-04-01' }));
    await applied(owner, m('deficiency.patch', id, { status: 'open' }));
    await applied(owner, m('deficiency.patch', id, { acceptedAt: new Date().toISOString() }));
    const cannot = await rejected(owner, m('deficiency.patch', id, { title: 'Renamed' }));
    assert.match(cannot.reason ?? '', /Owners cannot edit/);
    const commentId = uuidv7();
    await applied(owner, m('comment.create', commentId, { deficiencyId: id, text: 'Please call before the visit' }));

    // the whole history, synced down: the raise, each change, the comment
    const res = await owner.post('/api/sync/pull').send({ deviceId: 'owner-phone', schemaVersion: SCHEMA_VERSION, cursors: {} });
    const page = (res.body as PullResponse).buildings.find((b) => b.buildingId === ids.clinicId)!;
    const entries = page.upserts.entries.filter((e) => e.deficiencyId === id);
    assert.equal(entries[0].text, 'raised');
    assert.deepEqual(
      entries.filter((e) => e.kind === 'change').map((e) => e.changes.status?.[1]).filter(Boolean),
      ['open', 'deferred', 'open'],
    );
    const comment = entries.find((e) => e.id === commentId)!;
    assert.equal(comment.kind, 'comment');
    assert.ok(comment.userName.length > 0);
    assert.ok(page.upserts.deficiencies.some((d) => d.id === id && d.acceptedAt));
  });

  it('a deleted deficiency leaves the device as a tombstone', async () => {
    const id = await raise();
    const before = await inspector.post('/api/sync/pull').send({ deviceId: 'insp-2', schemaVersion: SCHEMA_VERSION, cursors: {} });
    const cursor = (before.body as PullResponse).buildings.find((b) => b.buildingId === ids.clinicId)!.toVersion;
    await rejected(electrician, m('deficiency.delete', id, {}));
    await applied(inspector, m('deficiency.delete', id, {}));
    const after = await inspector
      .post('/api/sync/pull')
      .send({ deviceId: 'insp-2', schemaVersion: SCHEMA_VERSION, cursors: { [ids.clinicId]: cursor } });
    const page = (after.body as PullResponse).buildings.find((b) => b.buildingId === ids.clinicId)!;
    assert.deepEqual(page.tombstones.deficiencies, [id]);
  });
});

describe('recorded trips', () => {
  it('a trip is recorded on a circuit of its panel and synced down', async () => {
    const circuitId = await ids.circuitAt(ids.clinicLAId, 5);
    const id = uuidv7();
    await applied(electrician, m('trip.create', id, { panelId: ids.clinicLAId, circuitId, occurredAt: '2026-11-28T14:30:00.000Z', loadA: 6, circumstances: 'autoclave warming up' }));
    const wrongPanel = await rejected(electrician, m('trip.create', uuidv7(), { panelId: ids.loftsPanelId, circuitId, occurredAt: '2026-11-28T14:30:00.000Z' }));
    assert.match(wrongPanel.reason ?? '', /circuitId/);
    const [row] = await ctx.ds.query('SELECT load_a, circumstances FROM trip_event WHERE id = $1', [id]);
    assert.equal(row.load_a, 6);
  });
});
