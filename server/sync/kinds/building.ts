import { uuidv7 } from 'uuidv7';
import { can } from '../../../shared/permissions';
import type { BuildingCreateBody, BuildingPatchBody } from '../../../shared/schemas';
import { requireAdmin, requireScheduleEditor, type Actor } from '../../auth/access';
import { Building, Circuit, Panel } from '../../entities';
import { NotFoundError, ValidationError } from '../../http/errors';
import { updateRows } from '../../services/bulk';
import { buildingDto } from '../../services/serialise';
import { lockAndReload, writableBuilding } from '../access';
import { editedAfterDelete, insertConflicts, type ConflictDraft, type Target } from '../conflicts';
import type { WriteContext } from '../context';
import { cascadeRestore, cascadeTombstone, commitMerge, planMerge, refuseDuplicateId, stampNew, tombstone, untombstone } from '../merge';
import { panelCounts } from '../reads';
import type { MutationHandlers } from './types';

/**
 * Kind `building`: the root of every synced row. Its own `version` is the building's counter
 * (the VersionBook bumps it), so a merge never writes it back. A delete tombstones its panels and
 * circuits with the building's stamp; a restore brings back exactly those.
 */

function organisationFor(actor: Actor, requested: string | undefined): string {
  const editable = [...actor.roles].filter(([, role]) => can(role, 'building.create'));
  if (requested) {
    // another organisation is not disclosed, as everywhere: 404 (tests/api/security-matrix.test.ts)
    if (!actor.roles.has(requested)) throw new NotFoundError('Organisation');
    return requested;
  }
  if (editable.length === 1) return editable[0][0];
  if (editable.length === 0) {
    const role = [...actor.roles.values()][0] ?? 'owner';
    requireScheduleEditor(role, 'building.create');
  }
  throw new ValidationError({ organisationId: 'choose the organisation the building belongs to' });
}

export async function createBuilding(w: WriteContext, body: BuildingCreateBody) {
  const organisationId = organisationFor(w.actor, body.organisationId);
  const role = w.actor.roles.get(organisationId)!;
  requireScheduleEditor(role, 'building.create');
  const id = body.id ?? uuidv7();
  if (w.sync && w.sync.buildingId !== id) throw new ValidationError({ buildingId: 'must be the new building id' });
  await refuseDuplicateId(w.em, Building, id);
  const version = w.versions.created(id);
  const building = w.em.create(Building, { id, organisationId, version: String(version), fieldMeta: {} });
  stampNew(building, { name: body.name, address: body.address, notes: body.notes }, w, version);
  await w.em.insert(Building, building);
  return { building: buildingDto(building, role, 0) };
}

export async function patchBuilding(w: WriteContext, id: string, patch: BuildingPatchBody) {
  const found = await writableBuilding(w, id, 'Building');
  if (found.building.deletedAt && !w.sync) throw new NotFoundError('Building');
  requireScheduleEditor(found.role, 'building.edit');
  const { version, row: building } = await lockAndReload(w, id, found.building, () =>
    w.em.findOneByOrFail(Building, { id }),
  );
  const target: Target = { entity: 'building', buildingId: id };
  const drafts: ConflictDraft[] = [];
  if (building.deletedAt) {
    drafts.push(editedAfterDelete(building, patch, w, target));
  } else {
    // version is the building's counter: the bump already set it, the merge must not undo it
    drafts.push(...commitMerge(building, planMerge(building, patch, w, version), w, version, target));
    await updateRows(w.em, Building, [building]);
  }
  await insertConflicts(w.em, drafts);
  return { building: buildingDto(building, found.role, (await panelCounts(w.em, [id])).get(id) ?? 0) };
}

/** Tombstones the building with every panel and circuit in it. */
export async function deleteBuilding(w: WriteContext, id: string) {
  const found = await writableBuilding(w, id, 'Building');
  if (found.building.deletedAt && !w.sync) throw new NotFoundError('Building');
  requireAdmin(found.role, 'building.delete', 'delete a building');
  const { version, row: building } = await lockAndReload(w, id, found.building, () =>
    w.em.findOneByOrFail(Building, { id }),
  );
  if (building.deletedAt) return { ok: true, version };
  const target: Target = { entity: 'building', buildingId: id };
  const drafts: ConflictDraft[] = [];
  if (tombstone(building, w, version, target, drafts)) {
    await cascadeTombstone(w, Circuit, { buildingId: id }, version, { entity: 'circuit', buildingId: id }, drafts);
    await cascadeTombstone(w, Panel, { buildingId: id }, version, { entity: 'panel', buildingId: id }, drafts);
  }
  await updateRows(w.em, Building, [building]);
  await insertConflicts(w.em, drafts);
  return { ok: true, version };
}

/** Brings a tombstoned building back with the panels and circuits its delete took with it. */
export async function restoreBuilding(w: WriteContext, id: string) {
  const found = await writableBuilding(w, id, 'Building');
  requireAdmin(found.role, 'building.restore', 'restore a building');
  const { version, row: building } = await lockAndReload(w, id, found.building, () =>
    w.em.findOneByOrFail(Building, { id }),
  );
  const drafts: ConflictDraft[] = [];
  const { restored, undone } = untombstone(building, w, version, { entity: 'building', buildingId: id }, drafts);
  if (restored) {
    await updateRows(w.em, Building, [building]);
    await cascadeRestore(w, 'panel', 'building_id', id, undone, version);
    await cascadeRestore(w, 'circuit', 'building_id', id, undone, version);
  }
  await insertConflicts(w.em, drafts);
  return { ok: true, version };
}


export const buildingMutations = {
  'building.create': (w, _m, fields) => createBuilding(w, fields),
  'building.patch': (w, m, fields) => patchBuilding(w, m.entityId, fields),
  'building.delete': (w, m) => deleteBuilding(w, m.entityId),
  'building.restore': (w, m) => restoreBuilding(w, m.entityId),
} satisfies Partial<MutationHandlers>;
