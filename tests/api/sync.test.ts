/**
 * Offline sync through POST /api/sync/push and /api/sync/pull (SYNC.md), on the real PostgreSQL
 * test cluster. Each test makes its own building through push, so the demo scenario stays as the
 * other suites expect it (the owner's grant is put back after the revocation test).
 */
import assert from 'node:assert/strict';
import { after, before, describe, it } from 'node:test';
import bcrypt from 'bcryptjs';
import request from 'supertest';
import { uuidv7 } from 'uuidv7';
import { parseHlc } from '../../shared/hlc';
import { SCHEMA_VERSION, type Mutation, type PullResponse, type PushResponse } from '../../shared/sync';
import { loadActor } from '../../server/auth/access';
import { applyPush } from '../../server/sync/push';
import { demoIds, stamp, startApp, type TestContext } from './context';

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

// ---------- helpers ----------

type Name = Mutation['name'];
function mutation(
  name: Name,
  buildingId: string,
  entityId: string,
  fields: Record<string, unknown>,
  options: { device?: string; baseVersion?: number; parentId?: string; hlc?: string } = {},
): Mutation {
  const device = options.device ?? 'fixture';
  return {
    id: uuidv7(),
    name,
    buildingId,
    entityId,
    baseVersion: options.baseVersion ?? 0,
    hlc: options.hlc ?? stamp(device),
    fields,
    ...(options.parentId && { parentId: options.parentId }),
  };
}

async function push(agent: request.Agent, deviceId: string, mutations: unknown[], expected = 200) {
  const res = await agent.post('/api/sync/push').send({ deviceId, schemaVersion: SCHEMA_VERSION, mutations });
  assert.equal(res.status, expected, JSON.stringify(res.body));
  return res.body as PushResponse;
}

async function pull(agent: request.Agent, deviceId: string, cursors: Record<string, number> = {}) {
  const res = await agent.post('/api/sync/pull').send({ deviceId, schemaVersion: SCHEMA_VERSION, cursors });
  assert.equal(res.status, 200, JSON.stringify(res.body));
  return res.body as PullResponse;
}

function pageOf(body: PullResponse, buildingId: string) {
  const page = body.buildings.find((b) => b.buildingId === buildingId);
  assert.ok(page, `building ${buildingId} in the pull`);
  return page;
}

let schedules = 0;
/** A building with one 42-space panel and `count` 1-pole circuits at positions 1…count, made by push. */
async function newSchedule(count = 6) {
  const buildingId = uuidv7();
  const panelId = uuidv7();
  const circuitIds = Array.from({ length: count }, () => uuidv7());
  const body = await push(electrician, 'fixture', [
    mutation('building.create', buildingId, buildingId, { name: `Sync test building ${++schedules}` }),
    mutation('panel.create', buildingId, panelId, { tag: 'S1', system: '208Y/120V-3ph-4w', busRatingA: 225, spaces: 42 }, { parentId: buildingId }),
    ...circuitIds.map((id, i) =>
      mutation('circuit.create', buildingId, id, { position: i + 1, ratingA: 20, description: `Circuit ${i + 1}` }, { parentId: panelId }),
    ),
  ]);
  assert.deepEqual(new Set(body.results.map((r) => r.status)), new Set(['applied']), JSON.stringify(body.results));
  return { buildingId, panelId, circuitIds, version: await buildingVersion(buildingId) };
}

async function buildingVersion(id: string): Promise<number> {
  const [row] = await ctx.ds.query('SELECT version FROM building WHERE id = $1', [id]);
  return Number(row.version);
}

async function circuitRow(id: string) {
  const [row] = await ctx.ds.query('SELECT * FROM circuit WHERE id = $1', [id]);
  return row;
}

async function conflictRows(entityId: string) {
  return ctx.ds.query('SELECT * FROM conflict_log WHERE entity_id = $1 ORDER BY id', [entityId]);
}

// ---------- push ----------

describe('push: idempotent, per-mutation results', () => {
  it('applies a mutation once: the same mutation id again is a duplicate and changes nothing', async () => {
    const s = await newSchedule(1);
    const m = mutation('circuit.patch', s.buildingId, s.circuitIds[0], { description: 'Replayed lights' }, { baseVersion: s.version });
    const first = await push(electrician, 'fixture', [m]);
    assert.equal(first.results[0].status, 'applied');
    assert.equal(first.results[0].version, s.version + 1);
    const afterFirst = await buildingVersion(s.buildingId);
    const rowAfterFirst = await circuitRow(s.circuitIds[0]);

    const again = await push(electrician, 'fixture', [m]);
    assert.deepEqual(again.results[0], { id: m.id, status: 'duplicate', version: first.results[0].version, originalStatus: 'applied' });
    assert.equal(await buildingVersion(s.buildingId), afterFirst, 'a replay bumps nothing');
    assert.deepEqual(await circuitRow(s.circuitIds[0]), rowAfterFirst, 'a replay changes nothing');
    const [{ n }] = await ctx.ds.query('SELECT count(*)::int AS n FROM processed_mutation WHERE mutation_id = $1', [m.id]);
    assert.equal(n, 1);
  });

  it('the same mutation twice in one push is applied once', async () => {
    const s = await newSchedule(1);
    const m = mutation('circuit.patch', s.buildingId, s.circuitIds[0], { notes: 'once' }, { baseVersion: s.version });
    const body = await push(electrician, 'fixture', [m, m]);
    assert.deepEqual(body.results.map((r) => r.status), ['applied', 'duplicate']);
  });

  it('a bad mutation is rejected with its reason while the rest of the batch applies (200)', async () => {
    const s = await newSchedule(3);
    const body = await push(electrician, 'fixture', [
      mutation('circuit.patch', s.buildingId, s.circuitIds[0], { ratingA: 'twenty' }, { baseVersion: s.version }),
      mutation('circuit.patch', s.buildingId, s.circuitIds[1], { description: 'Good change' }, { baseVersion: s.version }),
      mutation('circuit.patch', s.buildingId, uuidv7(), { notes: 'nowhere' }, { baseVersion: s.version }),
      mutation('circuit.patch', s.buildingId, s.circuitIds[2], { position: 1 }, { baseVersion: s.version }),
      { id: uuidv7(), name: 'circuit.explode', buildingId: s.buildingId },
    ]);
    assert.deepEqual(body.results.map((r) => r.status), ['rejected', 'applied', 'rejected', 'rejected', 'rejected']);
    assert.match(body.results[0].reason!, /ratingA: must be a number of amperes/);
    assert.match(body.results[2].reason!, /Circuit not found/);
    assert.match(body.results[3].reason!, /position 1 is taken/);
    assert.match(body.results[4].reason!, /name/);
    assert.equal((await circuitRow(s.circuitIds[1])).description, 'Good change');
    assert.equal((await circuitRow(s.circuitIds[0])).rating_a, 20, 'the rejected change left no trace');
    assert.equal((await circuitRow(s.circuitIds[2])).position, 3);
  });

  it('owners and inspectors are rejected with the reason, never a 4xx for the batch', async () => {
    const s = await newSchedule(1);
    const clinicCircuit = await ids.circuitAt(ids.clinicLAId, 1);
    const before = await circuitRow(clinicCircuit);
    const byOwner = await push(owner, 'owner-phone', [
      mutation('circuit.patch', ids.clinicId, clinicCircuit, { description: 'Owner edit' }, { device: 'owner-phone' }),
    ]);
    assert.equal(byOwner.results[0].status, 'rejected');
    assert.match(byOwner.results[0].reason!, /owners cannot edit schedules/i);
    assert.deepEqual(await circuitRow(clinicCircuit), before);

    const byInspector = await push(inspector, 'inspector-tablet', [
      mutation('circuit.patch', s.buildingId, s.circuitIds[0], { notes: 'Inspector edit' }, { device: 'inspector-tablet' }),
      mutation('panel.delete', s.buildingId, s.panelId, {}, { device: 'inspector-tablet' }),
    ]);
    assert.deepEqual(byInspector.results.map((r) => r.status), ['rejected', 'rejected']);
    assert.match(byInspector.results[0].reason!, /inspectors read schedules/i);
    assert.equal((await circuitRow(s.circuitIds[0])).notes, '');
  });

  it('a mutation naming the wrong building, or a stamp from another device, is rejected', async () => {
    const a = await newSchedule(1);
    const b = await newSchedule(1);
    const body = await push(electrician, 'fixture', [
      mutation('circuit.patch', b.buildingId, a.circuitIds[0], { notes: 'wrong building' }),
      mutation('circuit.patch', a.buildingId, a.circuitIds[0], { notes: 'x' }, { hlc: stamp('someone-else') }),
    ]);
    assert.deepEqual(body.results.map((r) => r.status), ['rejected', 'rejected']);
    assert.match(body.results[1].reason!, /device/);
  });

  it('a push of more than 500 mutations is 413 with the error shape', async () => {
    const s = await newSchedule(1);
    const many = Array.from({ length: 501 }, () => mutation('circuit.patch', s.buildingId, s.circuitIds[0], { notes: 'n' }));
    const res = await electrician.post('/api/sync/push').send({ deviceId: 'fixture', schemaVersion: SCHEMA_VERSION, mutations: many });
    assert.equal(res.status, 413);
    assert.equal(res.body.error.code, 'too_large');
    assert.equal((await circuitRow(s.circuitIds[0])).notes, '');
    const ok = await push(electrician, 'fixture', many.slice(0, 500));
    assert.equal(ok.results.length, 500);
  });

  it('another schema version is 409 schema_version, for push and pull; signed out is 401', async () => {
    const res = await electrician.post('/api/sync/push').send({ deviceId: 'fixture', schemaVersion: SCHEMA_VERSION + 1, mutations: [] });
    assert.equal(res.status, 409);
    assert.equal(res.body.error.code, 'schema_version');
    const pulled = await electrician.post('/api/sync/pull').send({ deviceId: 'fixture', schemaVersion: 0, cursors: {} });
    assert.equal(pulled.status, 409);
    assert.equal(pulled.body.error.code, 'schema_version');
    await request(ctx.app).post('/api/sync/pull').send({ deviceId: 'x', schemaVersion: SCHEMA_VERSION }).expect(401);
  });

  it('one push bumps its building once and stamps every touched row with that version', async () => {
    const s = await newSchedule(3);
    const body = await push(electrician, 'fixture', [
      ...s.circuitIds.map((id) => mutation('circuit.patch', s.buildingId, id, { loadVA: 360 }, { baseVersion: s.version })),
      mutation('panel.patch', s.buildingId, s.panelId, { location: 'Basement' }, { baseVersion: s.version }),
    ]);
    assert.deepEqual(new Set(body.results.map((r) => r.version)), new Set([s.version + 1]));
    assert.equal(await buildingVersion(s.buildingId), s.version + 1);
    for (const id of s.circuitIds) assert.equal(Number((await circuitRow(id)).version), s.version + 1);
  });
});

// ---------- merge ----------

describe('last writer wins per field, across two devices', () => {
  it('different fields from two devices both survive, with no conflict', async () => {
    const s = await newSchedule(1);
    const id = s.circuitIds[0];
    const a = await push(electrician, 'dev-a', [mutation('circuit.patch', s.buildingId, id, { description: 'Kitchen receptacles' }, { device: 'dev-a', baseVersion: s.version })]);
    const b = await push(admin, 'dev-b', [mutation('circuit.patch', s.buildingId, id, { notes: 'GFCI upstream' }, { device: 'dev-b', baseVersion: s.version })]);
    assert.equal(a.results[0].status, 'applied');
    assert.equal(b.results[0].status, 'applied');
    const row = await circuitRow(id);
    assert.equal(row.description, 'Kitchen receptacles');
    assert.equal(row.notes, 'GFCI upstream');
    assert.equal(row.field_meta.description.device, 'dev-a');
    assert.equal(row.field_meta.notes.device, 'dev-b');
    assert.deepEqual(await conflictRows(id), []);
  });

  for (const order of ['earlier stamp arrives first', 'later stamp arrives first'] as const) {
    it(`same field: the later HLC wins and the loser is logged (${order})`, async () => {
      const s = await newSchedule(1);
      const id = s.circuitIds[0];
      const early = mutation('circuit.patch', s.buildingId, id, { description: 'Boiler room (A)' }, { device: 'dev-a', baseVersion: s.version });
      const late = mutation('circuit.patch', s.buildingId, id, { description: 'Boiler room (B)' }, { device: 'dev-b', baseVersion: s.version });
      const sends: [request.Agent, string, Mutation][] = [[electrician, 'dev-a', early], [admin, 'dev-b', late]];
      if (order === 'later stamp arrives first') sends.reverse();
      const first = await push(sends[0][0], sends[0][1], [sends[0][2]]);
      const second = await push(sends[1][0], sends[1][1], [sends[1][2]]);
      assert.equal(first.results[0].status, 'applied');
      assert.equal(second.results[0].status, 'conflict');
      assert.equal(second.results[0].conflictIds?.length, 1);

      assert.equal((await circuitRow(id)).description, 'Boiler room (B)');
      const [conflict] = await conflictRows(id);
      assert.equal(conflict.id, second.results[0].conflictIds![0]);
      assert.equal(conflict.kind, 'concurrent');
      assert.equal(conflict.field, 'description');
      assert.deepEqual(conflict.winner_value, { description: 'Boiler room (B)' });
      assert.deepEqual(conflict.loser_value, { description: 'Boiler room (A)' });
      assert.equal(conflict.loser_hlc, early.hlc);
      assert.equal(conflict.winner_hlc, late.hlc);
      assert.equal(conflict.loser_device, 'dev-a');
      assert.equal(conflict.mutation_id, sends[1][2].id);

      // both devices see it under needs review after their next pull
      for (const [agent, device] of [[electrician, 'dev-a'], [admin, 'dev-b']] as const) {
        const page = pageOf(await pull(agent, device, { [s.buildingId]: s.version }), s.buildingId);
        const shown = page.upserts.conflicts.find((c) => c.id === conflict.id);
        assert.ok(shown, `conflict reaches ${device}`);
        assert.deepEqual(shown.loserValue, { description: 'Boiler room (A)' });
        assert.ok(shown.winnerUserName && shown.loserUserName, 'both names for the review list');
        assert.equal(page.upserts.circuits.find((c) => c.id === id)?.description, 'Boiler room (B)');
      }
    });
  }

  it('position and poles are decided together: a losing group write moves nothing', async () => {
    const s = await newSchedule(2);
    const id = s.circuitIds[0];
    const early = mutation('circuit.patch', s.buildingId, id, { position: 9, poles: 2 }, { device: 'dev-a', baseVersion: s.version });
    const late = mutation('circuit.patch', s.buildingId, id, { position: 11, poles: 1 }, { device: 'dev-b', baseVersion: s.version });
    await push(admin, 'dev-b', [late]);
    const body = await push(electrician, 'dev-a', [early]);
    assert.equal(body.results[0].status, 'conflict');
    const row = await circuitRow(id);
    assert.equal(row.position, 11);
    assert.equal(row.poles, 1);
    assert.equal(row.field_meta.position.hlc, late.hlc);
    assert.equal(row.field_meta.poles.hlc, late.hlc);
    const [conflict] = await conflictRows(id);
    assert.equal(conflict.field, 'position+poles');
    assert.deepEqual(conflict.loser_value, { position: 9, poles: 2 });
  });

  it('a device clock hours ahead is re-stamped, so another device’s later edit still wins', async () => {
    const s = await newSchedule(1);
    const id = s.circuitIds[0];
    const threeHours = 3 * 3600_000;
    const skewed = mutation('circuit.patch', s.buildingId, id, { description: 'From the fast clock' }, { device: 'dev-fast', hlc: stamp('dev-fast', threeHours), baseVersion: s.version });
    const res = await push(electrician, 'dev-fast', [skewed]);
    assert.equal(res.results[0].status, 'applied');
    const stored = (await circuitRow(id)).field_meta.description;
    assert.ok(parseHlc(stored.hlc).wallMs < Date.now() + 60_000, `re-stamped near the server clock: ${stored.hlc}`);
    assert.equal(parseHlc(stored.hlc).deviceId, 'dev-fast');
    assert.ok(parseHlc(res.serverHlc).wallMs < Date.now() + 60_000, 'the server clock was not dragged ahead');

    const honest = mutation('circuit.patch', s.buildingId, id, { description: 'From the right clock' }, { device: 'dev-right', baseVersion: s.version });
    await push(admin, 'dev-right', [honest]);
    assert.equal((await circuitRow(id)).description, 'From the right clock');
  });
});

describe('a run of circuit patches in one push (merged set-wise, one statement)', () => {
  for (const order of ['earlier run arrives first', 'later run arrives first'] as const) {
    it(`the later stamp wins per field and each loser is logged (${order})`, async () => {
      const s = await newSchedule(3);
      const [c1, c2, c3] = s.circuitIds;
      // device A's run, then device B's run made later: B writes description of c1 and c2, A writes
      // description of c1 and notes of c2, c3
      const runA = [
        mutation('circuit.patch', s.buildingId, c1, { description: 'A1' }, { device: 'dev-a', baseVersion: s.version }),
        mutation('circuit.patch', s.buildingId, c2, { notes: 'A2 note', description: 'A2' }, { device: 'dev-a', baseVersion: s.version }),
        mutation('circuit.patch', s.buildingId, c3, { loadVA: 180, continuous: true }, { device: 'dev-a', baseVersion: s.version }),
      ];
      const runB = [
        mutation('circuit.patch', s.buildingId, c1, { description: 'B1' }, { device: 'dev-b', baseVersion: s.version }),
        mutation('circuit.patch', s.buildingId, c2, { description: 'B2', conductorSize: '10' }, { device: 'dev-b', baseVersion: s.version }),
      ];
      const sends: [request.Agent, string, Mutation[]][] = [[electrician, 'dev-a', runA], [admin, 'dev-b', runB]];
      if (order === 'later run arrives first') sends.reverse();
      const first = await push(sends[0][0], sends[0][1], sends[0][2]);
      const second = await push(sends[1][0], sends[1][1], sends[1][2]);
      assert.ok(first.results.every((r) => r.status === 'applied'), JSON.stringify(first.results));
      if (order === 'earlier run arrives first') {
        assert.deepEqual(second.results.map((r) => r.status), ['conflict', 'conflict']);
      } else {
        assert.deepEqual(second.results.map((r) => r.status), ['conflict', 'conflict', 'applied']);
      }

      const [r1, r2, r3] = await Promise.all(s.circuitIds.map(circuitRow));
      assert.equal(r1.description, 'B1');
      assert.equal(r2.description, 'B2');
      assert.equal(r2.notes, 'A2 note', 'a field only A wrote survives');
      assert.equal(r2.conductor_size, '10');
      assert.equal(r3.load_va, 180);
      assert.equal(r3.continuous, true);
      assert.equal(r1.field_meta.description.hlc, runB[0].hlc);
      assert.equal(r2.field_meta.notes.device, 'dev-a');
      for (const [id, loser] of [[c1, 'A1'], [c2, 'A2']] as const) {
        const [conflict] = await conflictRows(id);
        assert.equal(conflict.field, 'description');
        assert.deepEqual(conflict.loser_value, { description: loser });
        assert.equal(conflict.loser_device, 'dev-a');
      }
      assert.deepEqual(await conflictRows(c3), []);
      const runAResults = order === 'earlier run arrives first' ? first.results : second.results;
      assert.equal(Number(r3.version), runAResults[2].version, 'stamped with the version of its push');
    });
  }

  it('in a run: a replay is a duplicate, a missing circuit is rejected, a deleted one is logged', async () => {
    const s = await newSchedule(3);
    const [c1, c2, c3] = s.circuitIds;
    await push(electrician, 'fixture', [mutation('circuit.delete', s.buildingId, c3, {}, { baseVersion: s.version })]);
    const run = [
      mutation('circuit.patch', s.buildingId, c1, { notes: 'run 1' }, { device: 'dev-b', baseVersion: s.version }),
      mutation('circuit.patch', s.buildingId, uuidv7(), { notes: 'nowhere' }, { device: 'dev-b', baseVersion: s.version }),
      mutation('circuit.patch', s.buildingId, c3, { notes: 'on a deleted one' }, { device: 'dev-b', baseVersion: s.version }),
      mutation('circuit.patch', s.buildingId, c2, { notes: 'run 2' }, { device: 'dev-b', baseVersion: s.version }),
    ];
    const body = await push(admin, 'dev-b', run);
    assert.deepEqual(body.results.map((r) => r.status), ['applied', 'rejected', 'conflict', 'applied']);
    assert.match(body.results[1].reason!, /Circuit not found/);
    assert.equal((await conflictRows(c3))[0].kind, 'edited_after_delete');
    assert.equal((await circuitRow(c3)).notes, '');
    const version = await buildingVersion(s.buildingId);

    const replay = await push(admin, 'dev-b', run);
    assert.deepEqual(replay.results.map((r) => r.status), ['duplicate', 'duplicate', 'duplicate', 'duplicate']);
    assert.deepEqual(replay.results.map((r) => r.originalStatus), ['applied', 'rejected', 'conflict', 'applied']);
    assert.equal(await buildingVersion(s.buildingId), version, 'a replayed run bumps nothing');
    assert.equal((await conflictRows(c3)).length, 1, 'and logs nothing twice');
  });
});

// ---------- tombstones ----------

describe('delete vs edit', () => {
  it('delete first, then an edit made without seeing it: the tombstone stands, the edit is logged, restore works', async () => {
    const s = await newSchedule(1);
    const id = s.circuitIds[0];
    const del = await push(electrician, 'dev-a', [mutation('circuit.delete', s.buildingId, id, {}, { device: 'dev-a', baseVersion: s.version })]);
    assert.equal(del.results[0].status, 'applied');
    const edit = await push(admin, 'dev-b', [mutation('circuit.patch', s.buildingId, id, { notes: 'Relabelled' }, { device: 'dev-b', baseVersion: s.version })]);
    assert.equal(edit.results[0].status, 'conflict');
    const row = await circuitRow(id);
    assert.ok(row.deleted_at, 'still deleted');
    assert.equal(row.notes, '', 'the edit was not applied');
    const [conflict] = await conflictRows(id);
    assert.equal(conflict.kind, 'edited_after_delete');
    assert.deepEqual(conflict.loser_value, { notes: 'Relabelled' });
    assert.equal(conflict.loser_device, 'dev-b');
    assert.ok(conflict.winner_value.deletedAt);

    // "restore mine": restore, patch with the logged value, resolve
    const restore = await push(admin, 'dev-b', [
      mutation('circuit.restore', s.buildingId, id, {}, { device: 'dev-b', baseVersion: del.results[0].version }),
      mutation('circuit.patch', s.buildingId, id, conflict.loser_value, { device: 'dev-b', baseVersion: del.results[0].version }),
      mutation('conflict.resolve', s.buildingId, conflict.id, { resolution: 'restored_mine' }, { device: 'dev-b' }),
    ]);
    assert.deepEqual(restore.results.map((r) => r.status), ['applied', 'applied', 'applied']);
    const back = await circuitRow(id);
    assert.equal(back.deleted_at, null);
    assert.equal(back.notes, 'Relabelled');
    assert.equal((await conflictRows(id))[0].resolution, 'restored_mine');
  });

  it('edit first, then a delete made without seeing it: the tombstone stands, the edit is logged and comes back on restore', async () => {
    const s = await newSchedule(1);
    const id = s.circuitIds[0];
    const edit = await push(admin, 'dev-b', [mutation('circuit.patch', s.buildingId, id, { notes: 'Checked torque' }, { device: 'dev-b', baseVersion: s.version })]);
    assert.equal(edit.results[0].status, 'applied');
    const del = await push(electrician, 'dev-a', [mutation('circuit.delete', s.buildingId, id, {}, { device: 'dev-a', baseVersion: s.version })]);
    assert.equal(del.results[0].status, 'conflict');
    assert.ok((await circuitRow(id)).deleted_at);
    const [conflict] = await conflictRows(id);
    assert.equal(conflict.kind, 'edited_after_delete');
    assert.deepEqual(conflict.loser_value, { notes: 'Checked torque' });
    assert.equal(conflict.loser_device, 'dev-b');

    const restored = await push(admin, 'dev-b', [mutation('circuit.restore', s.buildingId, id, {}, { device: 'dev-b', baseVersion: del.results[0].version })]);
    assert.equal(restored.results[0].status, 'applied');
    const back = await circuitRow(id);
    assert.equal(back.deleted_at, null);
    assert.equal(back.notes, 'Checked torque', 'nothing was lost');
  });

  it('a panel delete tombstones its circuits; its restore brings back those and not one deleted before', async () => {
    const s = await newSchedule(3);
    const single = await push(electrician, 'fixture', [mutation('circuit.delete', s.buildingId, s.circuitIds[0], {})]);
    assert.equal(single.results[0].status, 'applied');
    const del = await push(electrician, 'fixture', [mutation('panel.delete', s.buildingId, s.panelId, {}, { baseVersion: s.version + 1 })]);
    assert.equal(del.results[0].status, 'applied', JSON.stringify(del.results[0]));
    for (const id of s.circuitIds) assert.ok((await circuitRow(id)).deleted_at, 'tombstoned with the panel');
    const edit = await push(admin, 'dev-b', [mutation('panel.patch', s.buildingId, s.panelId, { location: 'Roof' }, { device: 'dev-b', baseVersion: s.version })]);
    assert.equal(edit.results[0].status, 'conflict');

    const restore = await push(electrician, 'fixture', [mutation('panel.restore', s.buildingId, s.panelId, {})]);
    assert.equal(restore.results[0].status, 'applied');
    assert.ok((await circuitRow(s.circuitIds[0])).deleted_at, 'the circuit deleted on its own stays deleted');
    for (const id of s.circuitIds.slice(1)) assert.equal((await circuitRow(id)).deleted_at, null);
    const [panel] = await ctx.ds.query('SELECT deleted_at, location FROM panel WHERE id = $1', [s.panelId]);
    assert.equal(panel.deleted_at, null);
    assert.equal(panel.location, '', 'the edit made against the tombstone was not applied');
  });

  it('a circuit cannot be created in a deleted panel', async () => {
    const s = await newSchedule(1);
    const del = await push(electrician, 'fixture', [mutation('panel.delete', s.buildingId, s.panelId, {})]);
    assert.equal(del.results[0].status, 'applied');
    const body = await push(admin, 'dev-b', [
      mutation('circuit.create', s.buildingId, uuidv7(), { position: 5, ratingA: 20 }, { device: 'dev-b', parentId: s.panelId }),
    ]);
    assert.equal(body.results[0].status, 'rejected');
    assert.match(body.results[0].reason!, /panel was deleted/);
  });
});

// ---------- pull ----------

describe('pull', () => {
  it('no cursor: a full snapshot of live rows, no tombstones', async () => {
    const s = await newSchedule(4);
    await push(electrician, 'fixture', [
      mutation('circuit.delete', s.buildingId, s.circuitIds[3], {}),
      mutation('panel.patch', s.buildingId, s.panelId, { installedOn: '2019-05-01', shortCircuitKA: 22 }),
    ]);
    const body = await pull(electrician, 'dev-new');
    const page = pageOf(body, s.buildingId);
    // the same row JSON as the REST API
    const rest = await electrician.get(`/api/panels/${s.panelId}`).expect(200);
    assert.deepEqual(page.upserts.panels[0], rest.body.panel);
    assert.equal(page.upserts.panels[0].installedOn, '2019-05-01');
    const restCircuits = new Map(rest.body.circuits.map((c: { id: string }) => [c.id, c]));
    for (const c of page.upserts.circuits) assert.deepEqual(c, restCircuits.get(c.id));
    assert.equal(page.reset, false);
    assert.equal(page.hasMore, false);
    assert.equal(page.toVersion, await buildingVersion(s.buildingId));
    assert.equal(page.building?.id, s.buildingId);
    assert.equal(page.building?.panelCount, 1);
    assert.deepEqual(page.upserts.panels.map((p) => p.id), [s.panelId]);
    assert.deepEqual(new Set(page.upserts.circuits.map((c) => c.id)), new Set(s.circuitIds.slice(0, 3)));
    assert.ok(Object.values(page.tombstones).every((ids) => ids.length === 0), 'a snapshot holds no tombstones');
    // every building the electrician may see, the demo ones included
    for (const id of [ids.clinicId, ids.loftsId]) assert.ok(body.buildings.some((b) => b.buildingId === id));
    assert.ok(parseHlc(body.serverHlc));
  });

  it('a cursor: only what changed since, including tombstones', async () => {
    const s = await newSchedule(4);
    const cursor = pageOf(await pull(electrician, 'dev-a'), s.buildingId).toVersion;
    const upToDate = pageOf(await pull(electrician, 'dev-a', { [s.buildingId]: cursor }), s.buildingId);
    assert.deepEqual(upToDate.upserts.circuits, []);
    assert.equal(upToDate.building, null);
    assert.equal(upToDate.toVersion, cursor);

    await push(admin, 'dev-b', [
      mutation('circuit.patch', s.buildingId, s.circuitIds[1], { description: 'Delta row' }, { device: 'dev-b', baseVersion: cursor }),
    ]);
    await push(admin, 'dev-b', [mutation('circuit.delete', s.buildingId, s.circuitIds[2], {}, { device: 'dev-b', baseVersion: cursor })]);
    const delta = pageOf(await pull(electrician, 'dev-a', { [s.buildingId]: cursor }), s.buildingId);
    assert.equal(delta.reset, false);
    assert.deepEqual(delta.upserts.circuits.map((c) => [c.id, c.description]), [[s.circuitIds[1], 'Delta row']]);
    assert.deepEqual(delta.upserts.panels, []);
    assert.deepEqual(delta.tombstones.circuits, [s.circuitIds[2]]);
    assert.equal(delta.toVersion, cursor + 2);
    assert.equal(delta.building?.version, cursor + 2);
  });

  it('a cursor ahead of the server: reset with a full snapshot', async () => {
    const s = await newSchedule(2);
    const version = await buildingVersion(s.buildingId);
    const page = pageOf(await pull(electrician, 'dev-a', { [s.buildingId]: version + 100 }), s.buildingId);
    assert.equal(page.reset, true);
    assert.equal(page.toVersion, version);
    assert.equal(page.upserts.circuits.length, 2);
    assert.equal(page.upserts.panels.length, 1);
  });

  it('a building the user can no longer see is revoked', async () => {
    const cursor = pageOf(await pull(owner, 'owner-phone'), ids.clinicId).toVersion;
    const [grant] = await ctx.ds.query(
      `SELECT g.* FROM owner_grant g JOIN app_user u ON u.id = g.user_id WHERE u.email = 'owner@ampwright.test' AND g.building_id = $1`,
      [ids.clinicId],
    );
    await ctx.ds.query('DELETE FROM owner_grant WHERE id = $1', [grant.id]);
    try {
      const body = await pull(owner, 'owner-phone', { [ids.clinicId]: cursor, [ids.loftsId]: 3 });
      assert.deepEqual(body.revoked.sort(), [ids.clinicId, ids.loftsId].sort());
      assert.ok(!body.buildings.some((b) => b.buildingId === ids.clinicId));
    } finally {
      await ctx.ds.query('INSERT INTO owner_grant (id, user_id, building_id) VALUES ($1, $2, $3)', [grant.id, grant.user_id, grant.building_id]);
    }
    const again = await pull(owner, 'owner-phone', { [ids.clinicId]: cursor });
    assert.deepEqual(again.revoked, []);
  });

  it('conflicts sync down; a resolved one leaves snapshots but reaches devices by delta', async () => {
    const s = await newSchedule(1);
    const id = s.circuitIds[0];
    await push(admin, 'dev-b', [mutation('circuit.patch', s.buildingId, id, { notes: 'B' }, { device: 'dev-b', baseVersion: s.version })]);
    const lost = await push(electrician, 'dev-a', [mutation('circuit.patch', s.buildingId, id, { notes: 'A' }, { device: 'dev-a', baseVersion: s.version })]);
    const conflictId = lost.results[0].conflictIds![0];
    const cursor = pageOf(await pull(electrician, 'dev-a'), s.buildingId);
    assert.ok(cursor.upserts.conflicts.some((c) => c.id === conflictId));
    const keep = await push(electrician, 'dev-a', [mutation('conflict.resolve', s.buildingId, conflictId, { resolution: 'kept_theirs' }, { device: 'dev-a' })]);
    assert.equal(keep.results[0].status, 'applied');
    const delta = pageOf(await pull(admin, 'dev-b', { [s.buildingId]: cursor.toVersion }), s.buildingId);
    assert.equal(delta.upserts.conflicts.find((c) => c.id === conflictId)?.resolution, 'kept_theirs');
    const snapshot = pageOf(await pull(admin, 'dev-c'), s.buildingId);
    assert.ok(!snapshot.upserts.conflicts.some((c) => c.id === conflictId));
  });

  it('a device that sends no resume gets pages at version boundaries: never more than 5 000 rows unless one version is bigger', async () => {
    // a user of their own organisation, so this big building stays out of the other tests' pulls
    const organisationId = uuidv7();
    const userId = uuidv7();
    const buildingId = uuidv7();
    const panelId = uuidv7();
    const hlc = stamp('seed');
    await ctx.ds.query(`INSERT INTO organisation (id, name) VALUES ($1, 'Paging Works')`, [organisationId]);
    const email = `pager-${userId}@ampwright.test`;
    await ctx.ds.query(`INSERT INTO app_user (id, email, name, password_hash) VALUES ($1, $2, 'Pat Pager', $3)`, [
      userId,
      email,
      await bcrypt.hash('pager-password', 4),
    ]);
    await ctx.ds.query(`INSERT INTO membership (id, user_id, organisation_id, role) VALUES ($1, $2, $3, 'electrician')`, [uuidv7(), userId, organisationId]);
    await ctx.ds.query(`INSERT INTO building (id, organisation_id, name, updated_at, version) VALUES ($1, $2, 'Paging tower', $3, 3)`, [buildingId, organisationId, hlc]);
    await ctx.ds.query(
      `INSERT INTO panel (id, building_id, tag, kind, system, bus_rating_a, spaces, updated_at, version)
       VALUES ($1, $2, 'P', 'panelboard', '208Y/120V-3ph-4w', 400, 84, $3, 1)`,
      [panelId, buildingId, hlc],
    );
    // 3 000 rows at version 2 and 3 000 at version 3 (positions repeat: layout is not the point here)
    await ctx.ds.query(
      `INSERT INTO circuit (id, panel_id, building_id, position, poles, rating_a, breaker_type, load_kind, status, updated_at, version)
       SELECT gen_random_uuid(), $1, $2, 1 + (i % 84), 1, 20, 'standard', 'other', 'in-use', $3, CASE WHEN i <= 3000 THEN 2 ELSE 3 END
         FROM generate_series(1, 6000) AS i`,
      [panelId, buildingId, hlc],
    );
    const pager = request.agent(ctx.app);
    await pager.post('/api/auth/sign-in').send({ email, password: 'pager-password' }).expect(200);

    const first = pageOf(await pull(pager, 'pager-phone'), buildingId);
    assert.equal(first.hasMore, true);
    assert.equal(first.toVersion, 2);
    assert.equal(first.upserts.panels.length, 1);
    assert.equal(first.upserts.circuits.length, 3000);
    assert.ok(first.upserts.circuits.every((c) => c.version <= 2));
    const second = pageOf(await pull(pager, 'pager-phone', { [buildingId]: first.toVersion }), buildingId);
    assert.equal(second.hasMore, false);
    assert.equal(second.toVersion, 3);
    assert.equal(second.upserts.circuits.length, 3000);
    const all = new Set([...first.upserts.circuits, ...second.upserts.circuits].map((c) => c.id));
    assert.equal(all.size, 6000);

    for (const table of ['circuit', 'panel']) await ctx.ds.query(`DELETE FROM ${table} WHERE building_id = $1`, [buildingId]);
    await ctx.ds.query('DELETE FROM building WHERE id = $1', [buildingId]);
    await ctx.ds.query('DELETE FROM app_user WHERE id = $1', [userId]);
    await ctx.ds.query('DELETE FROM organisation WHERE id = $1', [organisationId]);
  });
});

// ---------- the cursor rule under concurrency ----------

describe('concurrent pushes and a pull in between', () => {
  it('a push that commits late is not skipped by a cursor taken meanwhile', async () => {
    const s = await newSchedule(6);
    const c0 = pageOf(await pull(electrician, 'dev-c'), s.buildingId).toVersion;
    const [{ id: electricianId }] = await ctx.ds.query(`SELECT id FROM app_user WHERE email = 'electrician@ampwright.test'`);
    const actor = await loadActor(ctx.ds.manager, electricianId);

    // push A: applied inside a transaction this test keeps open
    let applied!: () => void;
    let release!: () => void;
    const appliedSignal = new Promise<void>((r) => (applied = r));
    const releaseSignal = new Promise<void>((r) => (release = r));
    const pushA = ctx.ds.transaction(async (em) => {
      const result = await applyPush(em, actor, {
        deviceId: 'dev-a',
        schemaVersion: SCHEMA_VERSION,
        mutations: s.circuitIds.slice(0, 3).map((id) => mutation('circuit.patch', s.buildingId, id, { description: 'From A' }, { device: 'dev-a', baseVersion: c0 })),
      });
      applied();
      await releaseSignal;
      return result;
    });
    await appliedSignal;

    // push B on other circuits of the same building, over HTTP, while A is still open
    let bDone = false;
    const pushB = electrician
      .post('/api/sync/push')
      .send({
        deviceId: 'dev-b',
        schemaVersion: SCHEMA_VERSION,
        mutations: s.circuitIds.slice(3).map((id) => mutation('circuit.patch', s.buildingId, id, { description: 'From B' }, { device: 'dev-b', baseVersion: c0 })),
      })
      .then((res) => {
        bDone = true;
        return res;
      });
    // wait until B either finished or waits on A's building lock
    for (let i = 0; i < 100 && !bDone; i++) {
      const [{ n }] = await ctx.ds.query(
        `SELECT count(*)::int AS n FROM pg_stat_activity WHERE datname = current_database() AND wait_event_type = 'Lock'`,
      );
      if (n > 0) break;
      await new Promise((r) => setTimeout(r, 20));
    }

    const between = pageOf(await pull(electrician, 'dev-c', { [s.buildingId]: c0 }), s.buildingId);
    release();
    const [a, b] = await Promise.all([pushA, pushB]);
    assert.ok(a.results.every((r) => r.status === 'applied'));
    assert.equal(b.status, 200);
    assert.ok((b.body as PushResponse).results.every((r) => r.status === 'applied'));

    const afterwards = pageOf(await pull(electrician, 'dev-c', { [s.buildingId]: between.toVersion }), s.buildingId);
    const seen = new Map<string, string>();
    for (const page of [between, afterwards]) for (const c of page.upserts.circuits) seen.set(c.id, c.description);
    for (const id of s.circuitIds.slice(0, 3)) assert.equal(seen.get(id), 'From A', `A's row ${id} delivered`);
    for (const id of s.circuitIds.slice(3)) assert.equal(seen.get(id), 'From B', `B's row ${id} delivered`);
    assert.equal(afterwards.toVersion, await buildingVersion(s.buildingId));
  });
});

describe('a retried push racing the first', () => {
  it('the same mutations pushed again while the first push is still open are duplicates, applied once', async () => {
    const s = await newSchedule(2);
    const [{ id: electricianId }] = await ctx.ds.query(`SELECT id FROM app_user WHERE email = 'electrician@ampwright.test'`);
    const actor = await loadActor(ctx.ds.manager, electricianId);
    const mutations = s.circuitIds.map((id, i) =>
      mutation('circuit.patch', s.buildingId, id, { description: `Once ${i}` }, { device: 'dev-a', baseVersion: s.version }),
    );
    let applied!: () => void;
    let release!: () => void;
    const appliedSignal = new Promise<void>((r) => (applied = r));
    const releaseSignal = new Promise<void>((r) => (release = r));
    const first = ctx.ds.transaction(async (em) => {
      const result = await applyPush(em, actor, { deviceId: 'dev-a', schemaVersion: SCHEMA_VERSION, mutations });
      applied();
      await releaseSignal;
      return result;
    });
    await appliedSignal;
    // the device gave up waiting for the reply and sends the same batch again
    const retry = electrician.post('/api/sync/push').send({ deviceId: 'dev-a', schemaVersion: SCHEMA_VERSION, mutations }).then((r) => r);
    await new Promise((r) => setTimeout(r, 200));
    release();
    const [a, b] = await Promise.all([first, retry]);
    assert.deepEqual(a.results.map((r) => r.status), ['applied', 'applied']);
    assert.equal(b.status, 200);
    const again = b.body as PushResponse;
    assert.deepEqual(again.results.map((r) => r.status), ['duplicate', 'duplicate']);
    assert.deepEqual(again.results.map((r) => r.version), a.results.map((r) => r.version));
    for (const [i, id] of s.circuitIds.entries()) {
      const row = await circuitRow(id);
      assert.equal(row.description, `Once ${i}`);
      assert.equal(Number(row.version), a.results[i].version, 'written by the first push only');
    }
  });
});

// last: the server's clock observes a stamp two minutes ahead here, as it should, and would then
// stamp later writes ahead of the wall clock that the tests above compare with
describe('REST and sync share one merge', () => {
  it('a REST write after a device write stamped a little ahead still wins (the server clock observed it)', async () => {
    const s = await newSchedule(1);
    const ahead = await push(electrician, 'fast-phone', [
      mutation('circuit.patch', s.buildingId, s.circuitIds[0], { notes: 'phone' }, { device: 'fast-phone', hlc: stamp('fast-phone', 120_000), baseVersion: s.version }),
    ]);
    assert.equal(ahead.results[0].status, 'applied');
    const rest = await electrician.patch(`/api/circuits/${s.circuitIds[0]}`).send({ notes: 'desk' }).expect(200);
    assert.equal(rest.body.circuit.notes, 'desk');
    assert.equal((await circuitRow(s.circuitIds[0])).notes, 'desk');
  });
});
