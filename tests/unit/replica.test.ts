/** The device's copy: pulls and queued changes laid over it (lib/replica.ts). */
import assert from 'node:assert/strict';
import { describe, it } from 'node:test';
import { applyMutation, applyPull, cursorsOf, EMPTY_REPLICA, EMPTY_SYNC_LOG, recordResult, type Replica } from '../../lib/replica';
import type { Building, Circuit, Panel } from '../../shared/schemas';
import type { BuildingPage, Mutation } from '../../shared/sync';

const sync = (id: string, version = 1) => ({ id, updatedAt: '2026-01-01T00:00:00.000Z-0000-seed', updatedBy: null, deletedAt: null, version });
const building = { ...sync('b1'), organisationId: 'o', name: 'Clinic', address: '', notes: '', role: 'electrician', panelCount: 1 } as Building;
const panel = { ...sync('p1'), buildingId: 'b1', tag: 'LA', spaces: 42 } as unknown as Panel;
const circuit = (id: string, position: number, description: string, version = 1) =>
  ({ ...sync(id, version), panelId: 'p1', position, poles: 1, description, status: 'in-use' }) as unknown as Circuit;

function page(over: Partial<BuildingPage>): BuildingPage {
  return {
    buildingId: 'b1', reset: false, toVersion: 1, hasMore: false, building: null,
    upserts: { panels: [], circuits: [], conflicts: [] }, tombstones: { panels: [], circuits: [] },
    ...over,
  };
}
const pull = (r: Replica, ...pages: BuildingPage[]) => applyPull(r, { serverHlc: 'x', revoked: [], buildings: pages });
const snapshot = pull(EMPTY_REPLICA, page({
  building, toVersion: 3,
  upserts: { panels: [panel], circuits: [circuit('c1', 1, 'Exam 1'), circuit('c2', 2, 'Exam 2')], conflicts: [] },
}));

describe('applyPull', () => {
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
