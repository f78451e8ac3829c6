import type { Resolution } from '../../../shared/sync';
import { requireScheduleEditor } from '../../auth/access';
import { ConflictLog } from '../../entities';
import { NotFoundError } from '../../http/errors';
import { updateRows } from '../../services/bulk';
import { lockAndReload, writableBuilding } from '../access';
import type { WriteContext } from '../context';
import { commitMerge, planMerge } from '../merge';
import type { MutationHandlers } from './types';

/** Kind `conflict`: a logged conflict is only ever resolved (kept theirs, or restored mine). */

/** Record how a conflict was resolved (last writer wins if two devices resolve it). */
export async function resolveConflict(w: WriteContext, id: string, resolution: Resolution) {
  const found = await w.em.findOne(ConflictLog, { where: { id } });
  if (!found) throw new NotFoundError('Conflict');
  const { role } = await writableBuilding(w, found.buildingId, 'Conflict');
  requireScheduleEditor(role);
  const { version, row: conflict } = await lockAndReload(w, found.buildingId, found, () =>
    w.em.findOneByOrFail(ConflictLog, { id }),
  );
  commitMerge(conflict, planMerge(conflict, { resolution }, w, version), w, version, null);
  await updateRows(w.em, ConflictLog, [conflict]);
  return { ok: true, version };
}

export const conflictMutations = {
  'conflict.resolve': (w, m, fields) => resolveConflict(w, m.entityId, fields.resolution),
} satisfies Partial<MutationHandlers>;
