import { IsNull, type EntityManager, type EntityTarget, type FindOptionsWhere } from 'typeorm';
import { mergeStamps, type FieldStamp, type StampResult } from '../../shared/merge';
import type { SyncColumns } from '../entities/sync-columns';
import { AppError } from '../http/errors';
import { updateRows } from '../services/bulk';
import { concurrentDraft, editsLostToDelete, type ConflictDraft, type Target } from './conflicts';
import type { WriteContext } from './context';

/**
 * The per-field last-writer-wins merge of one write into one row (shared/merge.ts decides), and
 * the tombstone and restore cascade: deletedAt is a field under the same rule, so a later restore
 * beats an older delete, and a parent's delete and restore take the children it tombstoned along.
 */

interface MergePlan<T> {
  fields: Record<string, unknown>;
  result: StampResult;
  /** the row as it would be stored, for validation before anything changes */
  candidate: T;
  applied: string[];
}

/** The written values of the fields that won. */
function winners(fields: Record<string, unknown>, applied: readonly string[]): Record<string, unknown> {
  return Object.fromEntries(applied.filter((f) => f in fields).map((f) => [f, fields[f]]));
}

/** Decide a write against a row without changing it (validate `candidate`, then commitMerge). */
export function planMerge<T extends SyncColumns>(
  row: T,
  fields: Record<string, unknown>,
  w: WriteContext,
  version: number,
): MergePlan<T> {
  const result = mergeStamps(
    row,
    row.fieldMeta ?? {},
    { hlc: w.hlc, device: w.device, fields, baseVersion: w.sync?.baseVersion },
    { version, user: w.actor.userId },
  );
  const candidate: T = Object.assign({ ...row }, winners(fields, result.applied));
  return { fields, result, candidate, applied: result.applied };
}

/**
 * Apply a planned merge: winning fields and their stamps, the row's version (always, so the next
 * pull re-sends the truth to a device whose optimistic value lost), and the conflicts to log.
 */
export function commitMerge<T extends SyncColumns>(
  row: T,
  plan: MergePlan<T>,
  w: WriteContext,
  version: number,
  target: Target | null,
): ConflictDraft[] {
  const conflicts = target ? plan.result.decisions.filter((d) => d.conflict) : [];
  // the values the conflicts lost, read before the winners overwrite them
  const before = conflicts.length > 0 ? { ...row } : row;
  Object.assign(row, winners(plan.fields, plan.applied));
  row.fieldMeta = plan.result.meta;
  row.version = String(version);
  if (plan.applied.length > 0) {
    if (!row.updatedAt || w.hlc > row.updatedAt) row.updatedAt = w.hlc;
    row.updatedBy = w.actor.userId;
  }
  if (!target) return [];
  return conflicts.map((d) => concurrentDraft(d, before, plan.fields, w, target, row.id));
}

/** Fields of a new row: everything applies; the stamps go to field_meta. */
export function stampNew<T extends SyncColumns>(row: T, fields: Record<string, unknown>, w: WriteContext, version: number): T {
  commitMerge(row, planMerge(row, fields, w, version), w, version, null);
  return row;
}


// ---------- shared write steps ----------

export async function refuseDuplicateId(em: EntityManager, entity: EntityTarget<SyncColumns>, id: string) {
  if (await em.exists(entity, { where: { id } })) {
    throw new AppError(409, 'exists', 'A row with this id already exists');
  }
}

/**
 * Tombstone one row (deletedAt is a field under last-writer-wins like any other, so a later
 * restore beats an older delete), logging the edits the deleting device had not seen.
 * Returns whether the row is now deleted by this write.
 */
export function tombstone<T extends SyncColumns>(
  row: T,
  w: WriteContext,
  version: number,
  target: Target,
  drafts: ConflictDraft[],
): boolean {
  const deletedAt = new Date();
  const lost = editsLostToDelete(row, w, target, deletedAt);
  const plan = planMerge(row, { deletedAt }, w, version);
  drafts.push(...commitMerge(row, plan, w, version, target));
  const deleted = plan.applied.includes('deletedAt');
  if (deleted && lost) drafts.push(lost);
  return deleted;
}

/** Tombstone the live children of a deleted row with the parent's stamp, so a restore finds them. */
export async function cascadeTombstone<T extends SyncColumns>(
  w: WriteContext,
  entity: new () => T,
  where: FindOptionsWhere<T>,
  version: number,
  target: Target,
  drafts: ConflictDraft[],
): Promise<void> {
  const children = await w.em.find(entity, { where: { ...where, deletedAt: IsNull() } });
  const stamp: FieldStamp = { hlc: w.hlc, version, device: w.device, user: w.actor.userId };
  const deletedAt = new Date();
  for (const child of children) {
    const lost = editsLostToDelete(child, w, target, deletedAt);
    if (lost) drafts.push(lost);
    child.deletedAt = deletedAt;
    child.fieldMeta = { ...child.fieldMeta, deletedAt: stamp };
    child.version = String(version);
    if (w.hlc > child.updatedAt) child.updatedAt = w.hlc;
    child.updatedBy = w.actor.userId;
  }
  await updateRows(w.em, entity, children);
}

/** Bring back the children a parent's delete tombstoned (same deletion stamp), nothing else. */
export async function cascadeRestore(
  w: WriteContext,
  table: 'panel' | 'circuit',
  parentColumn: 'building_id' | 'panel_id',
  parentId: string,
  deletionHlc: string | undefined,
  version: number,
): Promise<void> {
  if (!deletionHlc) return;
  const stamp: FieldStamp = { hlc: w.hlc, version, device: w.device, user: w.actor.userId };
  // table and column names are fixed by the callers above, never from input
  await w.em.query(
    `UPDATE ${table}
        SET deleted_at = NULL, version = $2, updated_by = $4,
            updated_at = GREATEST(updated_at COLLATE "C", $3::text),
            field_meta = field_meta || jsonb_build_object('deletedAt', $5::jsonb)
      WHERE ${parentColumn} = $1 AND deleted_at IS NOT NULL AND field_meta -> 'deletedAt' ->> 'hlc' = $6`,
    [parentId, version, w.hlc, w.actor.userId, JSON.stringify(stamp), deletionHlc],
  );
}

/** Restore one row under last-writer-wins; returns the deletion stamp it undid, if it did. */
export function untombstone<T extends SyncColumns>(
  row: T,
  w: WriteContext,
  version: number,
  target: Target,
  drafts: ConflictDraft[],
): { restored: boolean; undone?: string } {
  if (!row.deletedAt) return { restored: false };
  const undone = row.fieldMeta?.deletedAt?.hlc;
  const plan = planMerge(row, { deletedAt: null }, w, version);
  drafts.push(...commitMerge(row, plan, w, version, target));
  return { restored: plan.applied.includes('deletedAt'), undone };
}

