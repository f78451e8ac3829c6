/** The device's copy: pulls and queued changes laid over it (lib/replica.ts). */
import assert from 'node:assert/strict';
import { describe, it } from 'node:test';
import { applyMutation, applyPull, cursorsOf, describeMutation, EMPTY_REPLICA, EMPTY_SYNC_LOG, recordResult, resumesOf, type Replica } from '../../lib/replica';
import type { Building, Circuit, Panel } from '../../shared/schemas';
import type { BuildingPage, Mutation } from '../../shared/sync';

const sync = (id: string, version = 1) => ({ id, updatedAt: '2026-01-01T00:00:00.000Z-0000-seed', updatedBy: null, deletedAt: null, version });
const building = { ...sync('b1'), organisationId: 'o', name: 'Clinic', address: '', notes: '', role: 'electrician', panelCount: 1 } as Building;
const panel = { ...sync('p1'), buildingId: 'b1', tag: 'LA', spaces: 42 } as unknown as Panel;
const circuit = (id: string, position: number, description: string, version = 1) =>
  ({ ...sync(id, version), panelId: 'p1', position, poles: 1, description, status: 'in-use' }) as unknown as Circuit;

const NO_RECORDS = { inspections: [], readings: [], deficiencies: [], entries: [], trips: [], photos: [], arcFlashLabels: [] };
type PageOver = Omit<Partial<BuildingPage>, 'upserts' | 'tombstones'> & {
  upserts?: Partial<BuildingPage['upserts']>;
  tombstones?: Partial<BuildingPage['tombstones']>;
};
function page(over: PageOver): BuildingPage {
  return {
    buildingId: 'b1', reset: false, toVersion: 1, hasMore: false, building: null,
    ...over,
    upserts: { panels: [], circuits: [], conflicts: [], ...NO_RECORDS, ...over.upserts },
    tombstones: { panels: [], circuits: [], ...NO_RECORDS, ...over.tombstones },
  };
}
const pull = (r: Replica, ...pages: BuildingPage[]) => applyPull(r, { serverHlc: 'x', revoked: [], buildings: pages });
const snapshot = pull(EMPTY_REPLICA, page({
  building, toVersion: 3,
  upserts: { panels: [panel], circuits: [circuit('c1', 1, 'Exam 1'), circuit('c2', 2, 'Exam 2')], conflicts: [] },
}));

describe('applyPull', () => {
  it('a building in parts keeps the resume token until its last part, and the cursor the completed version', () => {
    const first = pull(EMPTY_REPLICA, page({
      building, toVersion: 0, hasMore: true, resume: '1.1.c1.1', remaining: 1,
      upserts: { panels: [panel], circuits: [circuit('c1', 1, 'Exam 1')], conflicts: [] },
    }));
    assert.deepEqual(cursorsOf(first), { b1: 0 });
    assert.deepEqual(resumesOf(first), { b1: '1.1.c1.1' });
    const last = pull(first, page({ toVersion: 1, remaining: 0, upserts: { circuits: [circuit('c2', 2, 'Exam 2')] } }));
    assert.deepEqual(Object.keys(last.buildings.b1.circuits).sort(), ['c1', 'c2']);
    assert.deepEqual(cursorsOf(last), { b1: 1 });
    assert.deepEqual(resumesOf(last), {});
  });

  it('a page held back by a full response keeps the token it echoes', () => {
    const first = pull(EMPTY_REPLICA, page({ building, toVersion: 0, hasMore: true, resume: '1.1.c1.1', upserts: { panels: [panel] } }));
    const held = pull(first, page({ toVersion: 0, hasMore: true, resume: '1.1.c1.1' }));
    assert.deepEqual(resumesOf(held), { b1: '1.1.c1.1' });
    assert.equal(Object.keys(held.buildings.b1.panels).length, 1);
  });

  it('a snapshot fills the copy and sets the cursor', () => {
    assert.equal(Object.keys(snapshot.buildings.b1.circuits).length, 2);
    assert.deepEqual(cursorsOf(snapshot), { b1: 3 });
  });

  it('a delta updates rows, drops tombstones and moves the cursor', () => {
    const next = pull(snapshot, page({ toVersion: 5, upserts: { panels: [], circuits: [circuit('c1', 1, 'Exam 1 north', 5)], conflicts: [] }, tombstones: { panels: [], circuits: ['c2'] } }));
    assert.equal(next.buildings.b1.circuits.c1.description, 'Exam 1 north');
    assert.equal(next.buildings.b1.circuits.c2, undefined);
    assert.equal(next.buildings.b1.cursor, 5);
  });

  it('a reset replaces the copy instead of merging into it', () => {
    const next = pull(snapshot, page({ reset: true, building, toVersion: 9, upserts: { panels: [panel], circuits: [circuit('c3', 3, 'New')], conflicts: [] } }));
    assert.deepEqual(Object.keys(next.buildings.b1.circuits), ['c3']);
  });

  it('a revoked building and a deleted one leave the device', () => {
    assert.deepEqual(applyPull(snapshot, { serverHlc: 'x', revoked: ['b1'], buildings: [] }).buildings, {});
    const gone = pull(snapshot, page({ building: { ...building, deletedAt: '2026-02-01T00:00:00.000Z' } }));
    assert.deepEqual(gone.buildings, {});
  });

  it('circuits of a deleted panel go with it', () => {
    const next = pull(snapshot, page({ tombstones: { panels: ['p1'], circuits: [] } }));
    assert.deepEqual(next.buildings.b1.circuits, {});
  });
});

describe('applyMutation (the optimistic half of the outbox)', () => {
  const patch: Mutation = {
    id: 'm1', name: 'circuit.patch', buildingId: 'b1', entityId: 'c1', baseVersion: 1,
    hlc: '2026-03-01T00:00:00.000Z-0000-d1', fields: { description: 'Exam 1 east' },
  };
  it('shows a patch at once and stamps the row', () => {
    const next = applyMutation(snapshot, patch, 'u1');
    assert.equal(next.buildings.b1.circuits.c1.description, 'Exam 1 east');
    assert.equal(next.buildings.b1.circuits.c1.updatedAt, patch.hlc);
    assert.equal(snapshot.buildings.b1.circuits.c1.description, 'Exam 1', 'the input is not changed');
  });
  it('is idempotent: a replayed change gives the same copy', () => {
    const once = applyMutation(snapshot, patch, 'u1');
    assert.deepEqual(applyMutation(once, patch, 'u1'), once);
  });
  it('creates and deletes circuits', () => {
    const created = applyMutation(snapshot, { ...patch, id: 'm2', name: 'circuit.create', entityId: 'c9', parentId: 'p1', fields: { position: 9, poles: 1, description: 'Sign' } }, 'u1');
    assert.equal(created.buildings.b1.circuits.c9.panelId, 'p1');
    const deleted = applyMutation(created, { ...patch, id: 'm3', name: 'circuit.delete', entityId: 'c9', fields: {} }, 'u1');
    assert.equal(deleted.buildings.b1.circuits.c9, undefined);
  });
  it('ignores changes to buildings not on the device', () => {
    assert.equal(applyMutation(snapshot, { ...patch, buildingId: 'elsewhere' }, 'u1'), snapshot);
  });
});

describe('recordResult', () => {
  const m = { id: 'm1', name: 'circuit.patch' } as Mutation;
  it('lists synced changes newest first and keeps refused ones for review', () => {
    const one = recordResult(EMPTY_SYNC_LOG, 'LA · 1', m, { id: 'm1', status: 'applied', version: 4 }, 't1');
    const two = recordResult(one, 'LA · 2', { ...m, id: 'm2' }, { id: 'm2', status: 'rejected', version: 0, reason: 'Owners cannot edit schedules' }, 't2');
    assert.deepEqual(two.synced.map((s) => s.mutationId), ['m2', 'm1']);
    assert.equal(two.refused.length, 1);
    assert.equal(two.refused[0].reason, 'Owners cannot edit schedules');
  });
});

describe('the condition record on the device', () => {
  const hlc = '2026-03-01T10:00:00.000Z-0000-dev1';
  const m = (name: Mutation['name'], entityId: string, fields: Record<string, unknown>): Mutation => ({
    id: `m-${entityId}-${name}`, name, buildingId: 'b1', entityId, baseVersion: 0, hlc, fields,
  });

  it('a queued deficiency shows at once, with its author and the changes laid on it', () => {
    let r = applyMutation(snapshot, m('deficiency.create', 'd1', { title: 'Hot lug', priority: 1, status: 'open' }), 'u1');
    const d = r.buildings.b1.deficiencies!.d1;
    assert.equal(d.title, 'Hot lug');
    assert.equal(d.raisedBy, 'u1');
    r = applyMutation(r, m('deficiency.patch', 'd1', { status: 'scheduled' }), 'u1');
    assert.equal(r.buildings.b1.deficiencies!.d1.status, 'scheduled');
    r = applyMutation(r, m('comment.create', 'e1', { deficiencyId: 'd1', text: 'Parts ordered' }), 'u1');
    assert.equal(r.buildings.b1.entries!.e1.text, 'Parts ordered');
    assert.equal(r.buildings.b1.entries!.e1.at, '2026-03-01T10:00:00.000Z');
    r = applyMutation(r, m('deficiency.delete', 'd1', {}), 'u1');
    assert.equal(r.buildings.b1.deficiencies!.d1, undefined);
  });

  it('signing freezes the inspection on the device too', () => {
    let r = applyMutation(snapshot, m('inspection.create', 'i1', { kind: 'thermal-survey', panelIds: ['p1'] }), 'u1');
    assert.equal(r.buildings.b1.inspections!.i1.signedAt, null);
    r = applyMutation(r, m('inspection.sign', 'i1', {}), 'u1');
    assert.equal(r.buildings.b1.inspections!.i1.signedAt, '2026-03-01T10:00:00.000Z');
  });

  it('pulled records land by list, tombstones and deleted rows leave', () => {
    const reading = (id: string, deletedAt: string | null = null) =>
      ({ ...sync(id, 4), deletedAt, buildingId: 'b1', inspectionId: 'i1', panelId: 'p1', kind: 'thermal' }) as never;
    let r = pull(snapshot, page({ toVersion: 4, upserts: { readings: [reading('r1'), reading('r2'), reading('r3', '2026-03-01T00:00:00.000Z')] } }));
    assert.deepEqual(Object.keys(r.buildings.b1.readings!).sort(), ['r1', 'r2']);
    r = pull(r, page({ toVersion: 5, tombstones: { readings: ['r1'] } }));
    assert.deepEqual(Object.keys(r.buildings.b1.readings!), ['r2']);
  });

  it('a copy persisted before the condition record existed takes a delta', () => {
    const { inspections: _i, readings: _r, deficiencies: _d, entries: _e, trips: _t, photos: _p, ...old } = snapshot.buildings.b1;
    const legacy: Replica = { ...snapshot, buildings: { b1: old } };
    const r = pull(legacy, page({ toVersion: 6, upserts: { trips: [{ ...sync('t1', 6), buildingId: 'b1' } as never] } }));
    assert.deepEqual(Object.keys(r.buildings.b1.trips!), ['t1']);
    assert.deepEqual(r.buildings.b1.photos, {});
  });
});

describe('the kind table (one entry per kind, no case per name)', () => {
  const hlc = '2026-03-02T09:00:00.000Z-0000-dev1';
  const m = (name: Mutation['name'], entityId: string, fields: Record<string, unknown> = {}, parentId?: string): Mutation => ({
    id: `k-${entityId}-${name}`, name, buildingId: 'b1', entityId, baseVersion: 0, hlc, fields, ...(parentId && { parentId }),
  });

  it('a circuit create laid again over the pulled row keeps the server’s row, as a record create does', () => {
    const pulled = pull(snapshot, page({ toVersion: 4, upserts: { circuits: [circuit('c9', 9, 'Sign (as the server has it)', 4)] } }));
    const relaid = applyMutation(pulled, m('circuit.create', 'c9', { position: 9, poles: 1, description: 'Sign' }, 'p1'), 'u1');
    assert.equal(relaid.buildings.b1.circuits.c9.description, 'Sign (as the server has it)');
    assert.equal(relaid.buildings.b1.circuits.c9.version, 4);
  });

  it('a change to a row that is not on the device leaves the copy as it was (nothing new to save)', () => {
    for (const name of ['circuit.delete', 'circuit.patch', 'panel.delete', 'panel.patch'] as const) {
      const next = applyMutation(snapshot, m(name, 'not-here', name.endsWith('patch') ? { tag: 'X' } : {}), 'u1');
      assert.equal(next.buildings.b1, snapshot.buildings.b1, name);
    }
  });

  it('a panel delete takes its circuits; a building patch stamps the building', () => {
    const gone = applyMutation(snapshot, m('panel.delete', 'p1'), 'u1');
    assert.deepEqual(gone.buildings.b1.panels, {});
    assert.deepEqual(gone.buildings.b1.circuits, {});
    const renamed = applyMutation(snapshot, m('building.patch', 'b1', { name: 'Clinic west' }), 'u1');
    assert.equal(renamed.buildings.b1.building.name, 'Clinic west');
    assert.equal(renamed.buildings.b1.building.updatedAt, hlc);
  });

  it('verbs the device does not show (restores, a building create) wait for the pull', () => {
    for (const name of ['circuit.restore', 'panel.restore', 'building.create', 'building.restore', 'panel.create'] as const) {
      assert.equal(applyMutation(snapshot, m(name, 'x1', {}, 'b1'), 'u1'), snapshot, name);
    }
  });

  it('every kind reads as words on the Sync tab', () => {
    const withD = applyMutation(snapshot, m('deficiency.create', 'd1', { title: 'Hot lug', priority: 1 }), 'u1');
    const cases: [Mutation, string][] = [
      [m('circuit.patch', 'c1', { description: 'x' }), 'LA · 1 patch: description'],
      [m('circuit.create', 'c7', { position: 7 }, 'p1'), 'LA · 7 create'],
      [m('panel.patch', 'p1', { tag: 'LB' }), 'Panel LA patch: tag'],
      [m('building.patch', 'b1', { name: 'x' }), 'Clinic patch: name'],
      [m('conflict.resolve', 'k1', { resolution: 'kept_theirs' }), 'Review decision (kept_theirs)'],
      [m('deficiency.patch', 'd1', { status: 'scheduled' }), 'Deficiency patch · Hot lug: status'],
      [m('reading.create', 'r1', { kind: 'thermal' }), 'Reading create · thermal'],
      [m('comment.create', 'e1', { deficiencyId: 'd1', text: 'x' }), 'Comment create'],
      [m('trip.delete', 't1'), 'Recorded trip delete'],
      [m('photo.create', 'f1', {}), 'Photo create'],
      [m('inspection.sign', 'i1'), 'Inspection sign'],
    ];
    for (const [mutation, words] of cases) assert.equal(describeMutation(withD, mutation), words);
  });
});
