import type { EntityManager } from 'typeorm';
import { uuidv7 } from 'uuidv7';
import { isConcurrent, type FieldStamp, type UnitDecision } from '../../shared/merge';
import { ConflictLog } from '../entities';
import type { SyncColumns } from '../entities/sync-columns';
import { insertRows } from '../services/bulk';
import type { WriteContext } from './context';

/**
 * The conflict log: a write that lost to another device (or won over one it had not seen), and an
 * edit that reached a tombstone, each kept as a conflict_log row that syncs down for review.
 */

type ConflictEntity = ConflictLog['entity'];
export interface Target {
  entity: ConflictEntity;
  buildingId: string;
}
interface Side {
  value: Record<string, unknown>;
  hlc: string;
  user: string | null;
  device: string;
}
export interface ConflictDraft extends Target {
  /** assigned when the conflict is reported to its write (reportConflicts) */
  id?: string;
  w: WriteContext;
  entityId: string;
  field: string;
  kind: ConflictLog['kind'];
  winner: Side;
  loser: Side;
}

/** Field values as JSON (dates as ISO text), only the named fields. */
export function jsonValues(source: object, fields: readonly string[]): Record<string, unknown> {
  const out: Record<string, unknown> = {};
  const values = new Map(Object.entries(source));
  for (const f of fields) {
    if (!values.has(f)) continue;
    const v = values.get(f);
    out[f] = v instanceof Date ? v.toISOString() : v;
  }
  return out;
}

/** Give each conflict its id and tell its write, before anything is stored (a push records results first). */
export function reportConflicts(drafts: readonly ConflictDraft[]): void {
  for (const d of drafts) {
    if (d.id) continue;
    d.id = uuidv7();
    d.w.report.conflictIds.push(d.id);
  }
}

/** Write conflict_log rows (one statement), reporting any not reported yet. */
export async function insertConflicts(em: EntityManager, drafts: readonly ConflictDraft[]): Promise<void> {
  if (drafts.length === 0) return;
  reportConflicts(drafts);
  const rows: ConflictLog[] = [];
  for (const d of drafts) {
    const version = await d.w.versions.of(d.buildingId);
    rows.push(
      em.create(ConflictLog, {
        id: d.id,
        buildingId: d.buildingId,
        entity: d.entity,
        entityId: d.entityId,
        field: d.field,
        winnerValue: d.winner.value,
        loserValue: d.loser.value,
        winnerHlc: d.winner.hlc,
        loserHlc: d.loser.hlc,
        winnerUser: d.winner.user,
        loserUser: d.loser.user,
        loserDevice: d.loser.device,
        mutationId: d.w.sync?.mutationId ?? null,
        kind: d.kind,
        resolution: null,
        updatedAt: d.w.hlc,
        updatedBy: d.w.actor.userId,
        deletedAt: null,
        version: String(version),
        fieldMeta: {},
      }),
    );
  }
  await insertRows(em, ConflictLog, rows);
}

/** One field (or group) where a concurrent write lost, whichever side it was. */
export function concurrentDraft(
  d: UnitDecision,
  before: object,
  fields: Record<string, unknown>,
  w: WriteContext,
  target: Target,
  entityId: string,
): ConflictDraft {
  const stored = d.stored as FieldStamp;
  const storedSide: Side = {
    value: jsonValues(before, d.fields),
    hlc: stored.hlc,
    user: stored.user ?? null,
    device: stored.device,
  };
  const incoming: Side = { value: jsonValues(fields, d.fields), hlc: w.hlc, user: w.actor.userId, device: w.device };
  const [winner, loser] = d.outcome === 'apply' ? [incoming, storedSide] : [storedSide, incoming];
  return { ...target, w, entityId, field: d.fields.join('+'), kind: 'concurrent', winner, loser };
}

/** An edit that reached a tombstoned row: kept only in the log, the tombstone stands. */
export function editedAfterDelete(
  row: SyncColumns,
  fields: Record<string, unknown>,
  w: WriteContext,
  target: Target,
): ConflictDraft {
  const deletion = row.fieldMeta?.deletedAt;
  return {
    ...target,
    w,
    entityId: row.id,
    field: Object.keys(fields).join(','),
    kind: 'edited_after_delete',
    winner: {
      value: { deletedAt: row.deletedAt?.toISOString() ?? null },
      hlc: deletion?.hlc ?? row.updatedAt,
      user: deletion?.user ?? row.updatedBy,
      device: deletion?.device ?? 'server',
    },
    loser: { value: jsonValues(fields, Object.keys(fields)), hlc: w.hlc, user: w.actor.userId, device: w.device },
  };
}

/**
 * Edits of a row the deleting device had not seen (stored after its base version, by another
 * device): the tombstone hides them, so they go to the log like an edit that came after the delete.
 */
export function editsLostToDelete(row: SyncColumns, w: WriteContext, target: Target, deletedAt: Date): ConflictDraft | null {
  if (!w.sync) return null;
  const write = { device: w.device, baseVersion: w.sync.baseVersion };
  const unseen = Object.entries(row.fieldMeta ?? {}).filter(
    ([field, stamp]) => field !== 'deletedAt' && isConcurrent(stamp, write),
  );
  if (unseen.length === 0) return null;
  const latest = unseen.reduce((a, b) => (b[1].hlc > a[1].hlc ? b : a))[1];
  const fields = unseen.map(([field]) => field);
  return {
    ...target,
    w,
    entityId: row.id,
    field: fields.join(','),
    kind: 'edited_after_delete',
    winner: { value: { deletedAt: deletedAt.toISOString() }, hlc: w.hlc, user: w.actor.userId, device: w.device },
    loser: {
      value: jsonValues(row, fields),
      hlc: latest.hlc,
      user: latest.user ?? null,
      device: latest.device,
    },
  };
}
