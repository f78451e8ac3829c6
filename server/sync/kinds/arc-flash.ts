import { arcFlashProblems } from '../../../shared/arc-flash';
import type { MutationFields } from '../../../shared/sync';
import { ArcFlashLabel } from '../../entities';
import { ValidationError } from '../../http/errors';
import { panelOf } from './links';
import { createRecord, deleteRecord, patchRecord, planRecordPatches, type RecordSpec } from './record';
import type { MutationHandlers, PatchPlanners } from './types';

/**
 * Kind `arc-flash`: a panel's arc-flash label (shared/arc-flash.ts), kept with the schedule by
 * electricians and admins (`arc-flash.edit`), read by everyone who sees the building. A patch is
 * checked as the label would be stored: one of incident energy and PPE category, not both.
 */
export const arcFlashSpec: RecordSpec<ArcFlashLabel, MutationFields<'arc-flash.create'>, MutationFields<'arc-flash.patch'>> = {
  kind: 'arc-flash',
  entity: ArcFlashLabel,
  noun: 'Arc-flash label',
  write: 'arc-flash.edit',
  async create(c, fields) {
    await panelOf(c, fields.panelId);
    return {};
  },
  async checkPatch(_c, _row, candidate) {
    const problems = arcFlashProblems(candidate);
    if (Object.keys(problems).length > 0) throw new ValidationError(problems);
  },
};

export const arcFlashMutations = {
  'arc-flash.create': (w, m, fields) => createRecord(arcFlashSpec, w, m.entityId, fields),
  'arc-flash.patch': (w, m, fields) => patchRecord(arcFlashSpec, w, m.entityId, fields),
  'arc-flash.delete': (w, m) => deleteRecord(arcFlashSpec, w, m.entityId),
} satisfies Partial<MutationHandlers>;

export const arcFlashPlanners = {
  'arc-flash.patch': (items) => planRecordPatches(arcFlashSpec, items),
} satisfies PatchPlanners;
