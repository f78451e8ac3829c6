import type { MutationFields } from '../../../shared/sync';
import { TripEvent } from '../../entities';
import { circuitOf } from './links';
import { createRecord, deleteRecord, patchRecord, planRecordPatches, type RecordSpec } from './record';
import type { MutationHandlers, PatchPlanners } from './types';

/** Kind `trip`: a breaker trip someone saw, on a live circuit of the named panel. */
export const tripSpec: RecordSpec<TripEvent, MutationFields<'trip.create'>, MutationFields<'trip.patch'>> = {
  kind: 'trip',
  entity: TripEvent,
  noun: 'Trip',
  write: 'inspection.record',
  async create(c, fields) {
    await circuitOf(c, fields.circuitId, fields.panelId);
    return {};
  },
};

export const tripMutations = {
  'trip.create': (w, m, fields) => createRecord(tripSpec, w, m.entityId, fields),
  'trip.patch': (w, m, fields) => patchRecord(tripSpec, w, m.entityId, fields),
  'trip.delete': (w, m) => deleteRecord(tripSpec, w, m.entityId),
} satisfies Partial<MutationHandlers>;

export const tripPlanners = {
  'trip.patch': (items) => planRecordPatches(tripSpec, items),
} satisfies PatchPlanners;
