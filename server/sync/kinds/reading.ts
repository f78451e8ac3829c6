import { readingRuleErrors } from '../../../shared/records';
import type { MutationFields } from '../../../shared/sync';
import { Reading } from '../../entities';
import { ValidationError } from '../../http/errors';
import { bandOf, circuitOf, openInspection } from './links';
import { createRecord, deleteRecord, patchRecord, planRecordPatches, type RecordSpec } from './record';
import type { MutationHandlers, PatchPlanners } from './types';

/**
 * Kind `reading`: one measurement or finding of an open inspection, on one of its panels (a
 * thermal, torque, trip-test or visual reading). Its inspection, panel and kind never change;
 * the rules between its fields are shared/records.ts readingRuleErrors.
 */
export const readingSpec: RecordSpec<Reading, MutationFields<'reading.create'>, MutationFields<'reading.patch'>> = {
  kind: 'reading',
  entity: Reading,
  noun: 'Reading',
  write: 'inspection.record',
  async create(c, f) {
    const inspection = await openInspection(c, f.inspectionId);
    if (!inspection.panelIds.includes(f.panelId)) {
      throw new ValidationError({ panelId: 'this panel is not in the inspection' });
    }
    if (f.circuitId) await circuitOf(c, f.circuitId, f.panelId);
    if (f.bandId) await bandOf(c, f.bandId);
    return {};
  },
  async checkChangeable(c, row) {
    await openInspection(c, row.inspectionId);
  },
  async checkPatch(c, _row, candidate, applied) {
    const problems = readingRuleErrors(candidate);
    if (Object.keys(problems).length > 0) throw new ValidationError(problems);
    if (applied.includes('circuitId') && candidate.circuitId) await circuitOf(c, candidate.circuitId, candidate.panelId);
    if (applied.includes('bandId') && candidate.bandId) await bandOf(c, candidate.bandId);
  },
};

export const readingMutations = {
  'reading.create': (w, m, fields) => createRecord(readingSpec, w, m.entityId, fields),
  'reading.patch': (w, m, fields) => patchRecord(readingSpec, w, m.entityId, fields),
  'reading.delete': (w, m) => deleteRecord(readingSpec, w, m.entityId),
} satisfies Partial<MutationHandlers>;

export const readingPlanners = {
  'reading.patch': (items) => planRecordPatches(readingSpec, items),
} satisfies PatchPlanners;
