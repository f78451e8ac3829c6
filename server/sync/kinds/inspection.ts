import { can, cannotText } from '../../../shared/permissions';
import type { MutationFields } from '../../../shared/sync';
import { Inspection, Reading } from '../../entities';
import { ForbiddenError, NotFoundError } from '../../http/errors';
import { updateRows } from '../../services/bulk';
import { live } from '../access';
import type { WriteContext } from '../context';
import { commitMerge, planMerge, tombstone } from '../merge';
import { frozen, panelOf, userName } from './links';
import { createRecord, deleteRecord, loadForWrite, patchRecord, planRecordPatches, type RecordSpec } from './record';
import type { MutationHandlers, PatchPlanners } from './types';

/**
 * Kind `inspection`: a visit to one or more panels of a building, recorded by field workers and
 * signed off by an inspector or admin; the signature freezes it with its readings. Its delete
 * takes its readings along.
 */
export const inspectionSpec: RecordSpec<Inspection, MutationFields<'inspection.create'>, MutationFields<'inspection.patch'>> = {
  kind: 'inspection',
  entity: Inspection,
  noun: 'Inspection',
  write: 'inspection.record',
  async create(c, fields) {
    for (const id of fields.panelIds) await panelOf(c, id, 'panelIds');
    return { inspectorId: c.w.actor.userId, inspectorName: await userName(c, c.w.actor.userId) };
  },
  async checkChangeable(_c, row) {
    if (row.signedAt) throw frozen();
  },
  async checkPatch(c, _row, candidate, applied) {
    if (applied.includes('panelIds')) for (const id of candidate.panelIds) await panelOf(c, id, 'panelIds');
  },
  async cascade(c, row, drafts) {
    // an inspection's readings go with it
    const children = await c.w.em.find(Reading, { where: { inspectionId: row.id, ...live } });
    for (const child of children) tombstone(child, c.w, c.version, { entity: 'reading', buildingId: row.buildingId }, drafts);
    await updateRows(c.w.em, Reading, children);
  },
};

/** The inspector's sign-off: the inspection and its readings are frozen from now on. */
async function signInspection(w: WriteContext, id: string): Promise<void> {
  const { row, c } = await loadForWrite(inspectionSpec, w, id);
  if (!can(c.role, 'inspection.sign')) throw new ForbiddenError(cannotText(c.role, 'sign an inspection'));
  if (row.deletedAt) throw new NotFoundError('Inspection');
  if (row.signedAt) return;
  const sign = { signedAt: new Date(), signedBy: w.actor.userId, signedByName: await userName(c, w.actor.userId) };
  commitMerge(row, planMerge(row, sign, w, c.version), w, c.version, null);
  await updateRows(w.em, Inspection, [row]);
}

export const inspectionMutations = {
  'inspection.create': (w, m, fields) => createRecord(inspectionSpec, w, m.entityId, fields),
  'inspection.patch': (w, m, fields) => patchRecord(inspectionSpec, w, m.entityId, fields),
  'inspection.delete': (w, m) => deleteRecord(inspectionSpec, w, m.entityId),
  'inspection.sign': (w, m) => signInspection(w, m.entityId),
} satisfies Partial<MutationHandlers>;

export const inspectionPlanners = {
  'inspection.patch': (items) => planRecordPatches(inspectionSpec, items),
} satisfies PatchPlanners;
