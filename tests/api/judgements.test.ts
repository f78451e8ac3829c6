/**
 * The fields the judgements of issue 13 added, through the sync push and pull and the API's
 * verdicts, on the real PostgreSQL test cluster: a panel's termination rating and a circuit's
 * override (NEC 110.14(C)(1) [V]), a thermal reading taken during a test pulse (judged raw [CP]),
 * a torque reading's slot length (UL 486A-486B Table I.2, seen in a published copy of NEC Annex I).
 * Rows it changes are its own (a new panel in the clinic) or readings it adds.
 */
import assert from 'node:assert/strict';
import { after, before, describe, it } from 'node:test';
import type request from 'supertest';
import { uuidv7 } from 'uuidv7';
import { SCHEMA_VERSION, type Mutation, type PullResponse } from '../../shared/sync';
import { demoIds, stamp, startApp, type TestContext, pushAs } from './context';

let ctx: TestContext;
let ids: Awaited<ReturnType<typeof demoIds>>;
let electrician: request.Agent;
let inspector: request.Agent;

before(async () => {
  ctx = await startApp();
  ids = await demoIds(ctx.ds);
  [electrician, inspector] = await Promise.all((['electrician', 'inspector'] as const).map((r) => ctx.signIn(r)));
});
after(() => ctx.close());

const DEVICE = 'judgements-test';
const m = (name: Mutation['name'], entityId: string, fields: Record<string, unknown>, parentId?: string): Mutation => ({
  id: uuidv7(), name, buildingId: ids.clinicId, entityId, baseVersion: 0, hlc: stamp(DEVICE), fields, ...(parentId ? { parentId } : {}),
});
const push = async (agent: request.Agent, mutation: Mutation) => (await pushAs(agent, DEVICE, [mutation]))[0];
async function pull(agent: request.Agent) {
  const res = await agent.post('/api/sync/pull').send({ deviceId: DEVICE, schemaVersion: SCHEMA_VERSION, cursors: {} });
  assert.equal(res.status, 200);
  return res.body as PullResponse;
}
const rowsOf = (body: PullResponse, list: 'panels' | 'circuits') =>
  body.buildings.flatMap((b) => b.upserts[list] as { id: string }[]);

describe('termination rating: panel field and circuit override through the sync (NEC 110.14(C)(1) [V])', () => {
  it('pushes, pulls and refuses a rating that does not exist', async () => {
    const panelId = uuidv7();
    const circuitId = uuidv7();
    const created = await push(electrician, m('panel.create', panelId, { tag: 'J13', system: '120/240V-1ph-3w', busRatingA: 100, spaces: 4 }, ids.clinicId));
    assert.equal(created.status, "applied", JSON.stringify(created));
    for (const mutation of [
      m('circuit.create', circuitId, { position: 1, ratingA: 20 }, panelId),
      m('panel.patch', panelId, { terminationTempC: 75 }),
      m('circuit.patch', circuitId, { terminationTempC: 60 }),
    ]) {
      const result = await push(electrician, mutation);
      assert.equal(result.status, 'applied', `${mutation.name}: ${JSON.stringify(result)}`);
    }
    const bad = await push(electrician, m('panel.patch', panelId, { terminationTempC: 70 }));
    assert.equal(bad.status, 'rejected');
    assert.match(JSON.stringify(bad), /termination rating/);

    const body = await pull(electrician);
    const panel = rowsOf(body, 'panels').find((p) => p.id === panelId) as { terminationTempC?: number | null } | undefined;
    const circuit = rowsOf(body, 'circuits').find((c) => c.id === circuitId) as { terminationTempC?: number | null } | undefined;
    assert.equal(panel?.terminationTempC, 75);
    assert.equal(circuit?.terminationTempC, 60);
    // the demo's older load centre records no termination rating (null → 60 °C up to 100 A)
    const [lc1] = await ctx.ds.query(`SELECT termination_temp_c FROM panel WHERE tag = 'LC-1'`);
    assert.equal(lc1.termination_temp_c, null);
  });
});

describe('readings with the new fields, judged by the API (shared/assess.ts)', () => {
  it('a 12 °C rise during a 300 A test pulse stays 12 °C, NETA priority 3 (MTS Table 100.18 [V]); too light is not judged', async () => {
    const inspection = uuidv7();
    await push(inspector, m('inspection.create', inspection, { kind: 'thermal-survey', panelIds: [ids.clinicLAId], performedOn: '2026-11-30', ambientC: 24, loadPct: 65 }));
    const pulse = uuidv7();
    const light = uuidv7();
    const common = { inspectionId: inspection, panelId: ids.clinicLAId, kind: 'thermal', component: 'lug', referenceBasis: 'similar' };
    assert.equal((await push(inspector, m('reading.create', pulse, { ...common, temperatureC: 44, referenceC: 32, loadA: 300, referenceLoadA: 50, duringTestPulse: true }))).status, 'applied');
    assert.equal((await push(inspector, m('reading.create', light, { ...common, temperatureC: 27, referenceC: 25, loadA: 10, referenceLoadA: 100 }))).status, 'applied');
    const res = await inspector.get(`/api/inspections/${inspection}`);
    assert.equal(res.status, 200);
    const byId = new Map((res.body.readings as { id: string; duringTestPulse: boolean; assessment: { priority: number | null; judgedRiseC: number | null; summary: string } }[]).map((r) => [r.id, r]));
    assert.equal(byId.get(pulse)?.duringTestPulse, true);
    assert.equal(byId.get(pulse)?.assessment.judgedRiseC, 12);
    assert.equal(byId.get(pulse)?.assessment.priority, 3);
    assert.equal(byId.get(light)?.assessment.priority, null);
    assert.match(byId.get(light)?.assessment.summary ?? '', /too lightly loaded to judge/);
  });

  it('a slotted set screw under No. 10 keeps its slot length and warns on a maker’s value far above Table I.2', async () => {
    const inspection = uuidv7();
    await push(electrician, m('inspection.create', inspection, { kind: 'torque-audit', panelIds: [ids.clinicLAId], performedOn: '2026-11-30' }));
    const id = uuidv7();
    const base = {
      inspectionId: inspection, panelId: ids.clinicLAId, kind: 'torque', specified: 35.4, unit: 'lbf-in', specSource: 'maker',
      conductorSize: '12', screw: 'slotted-under-10-narrow', asFound: 'held', asLeft: 35.4,
    };
    const missing = await push(electrician, m('reading.create', uuidv7(), base));
    assert.equal(missing.status, 'rejected');
    assert.match(JSON.stringify(missing), /slot length/);
    assert.equal((await push(electrician, m('reading.create', id, { ...base, screwSize: '4.8' }))).status, 'applied');
    const res = await electrician.get(`/api/inspections/${inspection}`);
    const reading = (res.body.readings as { id: string; screwSize: string; assessment: { verdict: { warnings: string[] } } }[]).find((r) => r.id === id);
    assert.equal(reading?.screwSize, '4.8');
    // Table I.2: 0.79 N·m (7 lbf-in); 35.4 lbf-in is 406 % above
    assert.match(reading?.assessment.verdict.warnings.join(' ') ?? '', /Check the maker’s value: 406 % above the UL 486A-486B value for this screw/);
  });
});
