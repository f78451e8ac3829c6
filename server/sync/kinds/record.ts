import { In, type EntityManager, type ObjectLiteral } from 'typeorm';
import type { Role } from '../../../shared/domain';
import { can, cannotText, type Action } from '../../../shared/permissions';
import type { ConflictEntity } from '../../../shared/sync';
import { roleForBuilding } from '../../auth/access';
import { Building } from '../../entities';
import type { SyncColumns } from '../../entities/sync-columns';
import { AppError, ForbiddenError, NotFoundError } from '../../http/errors';
import { insertRows, selectRows, updateChanged, updateRows } from '../../services/bulk';
import { writableBuilding } from '../access';
import { editedAfterDelete, insertConflicts, reportConflicts, type ConflictDraft, type Target } from '../conflicts';
import type { WriteContext } from '../context';
import { commitMerge, planMerge, refuseDuplicateId, stampNew, tombstone } from '../merge';
import type { Ctx } from './links';
import type { ItemOutcome, PatchItem, PatchPlan } from './types';

/**
 * The condition record's generic writes: inspections, readings, deficiencies, trips and photo
 * rows arrive through the sync push and merge per field under the same last-writer-wins rule as
 * the register. Each kind states in its spec who may write it (shared/permissions.ts), what it
 * must link to and what follows a write; create, patch and delete below do the rest. A run of
 * patches of one kind is planned in memory under the building locks and written with one
 * statement per table (planRecordPatches), whatever its length.
 */

export type RecordRow = SyncColumns & { buildingId: string };
type Fields = Record<string, unknown>;

/** Rows a write adds besides its own (a deficiency's history line), inserted together at the end. */
export class PendingRows {
  private readonly byTarget = new Map<new () => ObjectLiteral, ObjectLiteral[]>();

  add<T extends ObjectLiteral>(target: new () => T, row: T): void {
    this.byTarget.set(target, [...(this.byTarget.get(target) ?? []), row]);
  }

  async flush(em: EntityManager): Promise<void> {
    for (const [target, rows] of this.byTarget) await insertRows(em, target, rows);
    this.byTarget.clear();
  }
}

/** What the rules of a record kind see of one write: the context plus the rows it adds. */
export interface RecordCtx extends Ctx {
  pending: PendingRows;
}

export interface RecordSpec<E extends RecordRow, C extends Fields = Fields, P extends Fields = Fields> {
  kind: ConflictEntity;
  entity: new () => E;
  noun: string;
  /** the action that creates and changes rows of this kind */
  write: Action;
  /** the action that deletes one (default: `write`) */
  remove?: Action;
  /** check a new row's links; returns the columns the server sets (who, derived values) */
  create(c: RecordCtx, fields: C): Promise<Partial<E>>;
  /** the patch to merge (a kind may add derived fields); refuse it by throwing */
  preparePatch?(c: RecordCtx, row: E, patch: P): Promise<P>;
  /** check the row as it would be stored after the patch; `applied` are the fields that win */
  checkPatch?(c: RecordCtx, row: E, candidate: E, applied: string[]): Promise<void>;
  /** may this row be changed or deleted at all (a signed inspection is frozen) */
  checkChangeable?(c: RecordCtx, row: E): Promise<void>;
  /** after a create (`before` null) or a patch that changed something */
  after?(c: RecordCtx, row: E, before: E | null, applied: string[]): Promise<void>;
  /** rows tombstoned with a deleted one (an inspection's readings) */
  cascade?(c: RecordCtx, row: E, drafts: ConflictDraft[]): Promise<void>;
}

/** "a trip", "an arc-flash label": the article by the noun's first letter. */
const withArticle = (noun: string) => `${/^[aeiou]/.test(noun) ? 'an' : 'a'} ${noun}`;

function requireAction(role: Role, action: Action, what: string): void {
  if (!can(role, action)) throw new ForbiddenError(cannotText(role, what));
}

export async function createRecord<E extends RecordRow, C extends Fields, P extends Fields>(
  spec: RecordSpec<E, C, P>,
  w: WriteContext,
  id: string,
  fields: C,
): Promise<void> {
  if (!w.sync) throw new Error('condition records are written through the sync push');
  const { building, role } = await writableBuilding(w, w.sync.buildingId, 'Building');
  if (building.deletedAt) throw new AppError(409, 'parent_deleted', 'The building was deleted; restore it first');
  requireAction(role, spec.write, `record ${withArticle(spec.noun.toLowerCase())}`);
  const version = await w.versions.of(building.id);
  const c: RecordCtx = { w, building, role, version, memo: new Map(), pending: new PendingRows() };
  await refuseDuplicateId(w.em, spec.entity, id);
  const extra = await spec.create(c, fields);
  const row = Object.assign(new spec.entity(), { id, buildingId: building.id, fieldMeta: {} }, extra);
  stampNew(row, fields, w, version);
  await insertRows(w.em, spec.entity, [row]);
  await spec.after?.(c, row, null, Object.keys(fields));
  await c.pending.flush(w.em);
}

/** The buildings of rows, with their organisation: from the push's locks, else read. */
async function homesOf(w: WriteContext, buildingIds: string[]): Promise<Map<string, { id: string; organisationId: string }>> {
  const known = buildingIds.map((id) => w.versions.home(id));
  const homes = known.every((b) => b)
    ? (known as { id: string; organisationId: string }[])
    : await w.em.find(Building, { where: { id: In(buildingIds) } });
  return new Map(homes.map((b) => [b.id, b]));
}

/**
 * Plan a run of patches of one kind: the same rules as one patch, in order (a later item sees the
 * earlier ones), with a constant number of statements for the run. Rows are read with one
 * `ANY($1)` select under the buildings' locks, merged and checked in memory; `persist` writes the
 * changed columns with one UPDATE … FROM unnest, then the rows the writes add and the conflicts.
 * A rejected item changes nothing.
 */
export async function planRecordPatches<E extends RecordRow, C extends Fields, P extends Fields>(
  spec: RecordSpec<E, C, P>,
  items: readonly PatchItem<P>[],
): Promise<PatchPlan<E>> {
  if (items.length === 0) return { outcomes: [], persist: async () => {} };
  const { em, actor, versions } = items[0].w;
  const ids = [...new Set(items.map((i) => i.id))];
  const read = () => selectRows(em, spec.entity, 'id = ANY($1::uuid[])', [ids]);
  let found = await read();
  const homes = await homesOf(items[0].w, [...new Set(found.map((r) => r.buildingId))]);
  const roleOf = new Map([...homes.values()].map((b) => [b.id, roleForBuilding(actor, b)]));
  // a push locked its buildings before reading; otherwise lock now and read again, since a row
  // read before the lock may have changed before it was taken (building ids never change)
  const visible = [...roleOf].filter(([, role]) => role).map(([id]) => id).sort();
  const unlocked = visible.filter((b) => !versions.holds(b));
  for (const b of visible) await versions.of(b);
  if (unlocked.length > 0) found = await read();
  const rows = new Map(found.map((r) => [r.id, r]));

  const memo = new Map<string, Promise<unknown>>();
  const pending = new PendingRows();
  const outcomes: ItemOutcome<E>[] = [];
  const dirty = new Map<E, Set<string>>();
  const drafts: ConflictDraft[] = [];
  for (const { w, id, patch: body } of items) {
    try {
      const row = rows.get(id);
      const home = row && homes.get(row.buildingId);
      const role = row ? roleOf.get(row.buildingId) : null;
      if (!row || !home || !role || (w.sync && w.sync.buildingId !== row.buildingId)) throw new NotFoundError(spec.noun);
      requireAction(role, spec.write, `change a ${spec.noun.toLowerCase()}`);
      const version = await versions.of(row.buildingId);
      const c: RecordCtx = { w, building: home, role, version, memo, pending };
      const target: Target = { entity: spec.kind, buildingId: row.buildingId };
      if (row.deletedAt) {
        drafts.push(editedAfterDelete(row, body, w, target));
        outcomes.push({ ok: true, row, version });
        continue;
      }
      await spec.checkChangeable?.(c, row);
      const patch = spec.preparePatch ? await spec.preparePatch(c, row, body) : body;
      const plan = planMerge(row, patch, w, version);
      if (plan.applied.length > 0) await spec.checkPatch?.(c, row, plan.candidate, plan.applied);
      const before = { ...row };
      drafts.push(...commitMerge(row, plan, w, version, target));
      const changed = dirty.get(row) ?? new Set<string>();
      for (const f of plan.applied) changed.add(f);
      dirty.set(row, changed);
      if (plan.applied.length > 0) await spec.after?.(c, row, before, plan.applied);
      outcomes.push({ ok: true, row, version });
    } catch (error) {
      if (!(error instanceof AppError)) throw error;
      outcomes.push({ ok: false, error });
    }
  }
  reportConflicts(drafts);
  return {
    outcomes,
    async persist() {
      await updateChanged(em, spec.entity, [...dirty].map(([row, fields]) => ({ row, fields: [...fields] })));
      await pending.flush(em);
      await insertConflicts(em, drafts);
    },
  };
}

export async function patchRecord<E extends RecordRow, C extends Fields, P extends Fields>(
  spec: RecordSpec<E, C, P>,
  w: WriteContext,
  id: string,
  patch: P,
): Promise<void> {
  const plan = await planRecordPatches(spec, [{ w, id, patch }]);
  const [outcome] = plan.outcomes;
  if (!outcome.ok) throw outcome.error;
  await plan.persist();
}

/** A row of a kind for a write that needs it whole (delete, sign): locked, read under the lock. */
export async function loadForWrite<E extends RecordRow, C extends Fields, P extends Fields>(
  spec: RecordSpec<E, C, P>,
  w: WriteContext,
  id: string,
): Promise<{ row: E; c: RecordCtx }> {
  const [found] = await selectRows(w.em, spec.entity, 'id = $1', [id]);
  if (!found) throw new NotFoundError(spec.noun);
  const { building, role } = await writableBuilding(w, found.buildingId, spec.noun);
  const fresh = w.versions.holds(building.id);
  const version = await w.versions.of(building.id);
  const row = fresh ? found : (await selectRows(w.em, spec.entity, 'id = $1', [id]))[0];
  return { row, c: { w, building, role, version, memo: new Map(), pending: new PendingRows() } };
}

export async function deleteRecord<E extends RecordRow, C extends Fields, P extends Fields>(
  spec: RecordSpec<E, C, P>,
  w: WriteContext,
  id: string,
): Promise<void> {
  const { row, c } = await loadForWrite(spec, w, id);
  requireAction(c.role, spec.remove ?? spec.write, `delete a ${spec.noun.toLowerCase()}`);
  if (row.deletedAt) return;
  await spec.checkChangeable?.(c, row);
  const drafts: ConflictDraft[] = [];
  const deleted = tombstone(row, w, c.version, { entity: spec.kind, buildingId: row.buildingId }, drafts);
  await updateRows(w.em, spec.entity, [row]);
  if (deleted) await spec.cascade?.(c, row, drafts);
  await insertConflicts(w.em, drafts);
}
