import { can, cannotText } from '../../../shared/permissions';
import type { MutationFields } from '../../../shared/sync';
import { Deficiency, DeficiencyEntry } from '../../entities';
import { ForbiddenError, ValidationError } from '../../http/errors';
import { writableBuilding } from '../access';
import type { WriteContext } from '../context';
import { refuseDuplicateId } from '../merge';
import { addEntry } from './deficiency';
import { PendingRows } from './record';
import type { MutationHandlers } from './types';

/**
 * Kind `comment`: a line in a deficiency's history, written by anyone who sees the building.
 * Comments are only ever added (no patch, no delete).
 */
async function addComment(w: WriteContext, id: string, body: MutationFields<'comment.create'>): Promise<void> {
  if (!w.sync) throw new Error('comments are written through the sync push');
  const { building, role } = await writableBuilding(w, w.sync.buildingId, 'Building');
  if (!can(role, 'comment.add')) throw new ForbiddenError(cannotText(role, 'comment'));
  const deficiency = await w.em.findOne(Deficiency, { where: { id: body.deficiencyId, buildingId: building.id } });
  if (!deficiency) throw new ValidationError({ deficiencyId: 'no such deficiency in this building' });
  const version = await w.versions.of(building.id);
  await refuseDuplicateId(w.em, DeficiencyEntry, id);
  const c = { w, building, role, version, memo: new Map(), pending: new PendingRows() };
  await addEntry(c, deficiency.id, { id, kind: 'comment', text: body.text, changes: {} });
  await c.pending.flush(w.em);
}

export const commentMutations = {
  'comment.create': (w, m, fields) => addComment(w, m.entityId, fields),
} satisfies Partial<MutationHandlers>;
