import { decideWrite, type FieldStamp } from '../../shared/merge';
import { can } from '../../shared/permissions';
import type { SyncColumns } from '../entities/sync-columns';
import { Circuit } from '../entities';
import { NotFoundError } from '../http/errors';
import { concurrentDraft, editedAfterDelete, insertConflicts, reportConflicts, type ConflictDraft, type Target } from './conflicts';
import type { CircuitPatchItem } from './kinds/circuit-batch';
import type { ItemOutcome, PatchPlan } from './kinds/types';

/**
 * Circuit fields that no rule ties to another field or row (zod has checked each value): a patch
 * of only these needs no reads to be validated, so it can be merged inside one statement.
 */
const FREE_CIRCUIT_FIELDS: ReadonlySet<string> = new Set([
  'breakerType',
  'description',
  'loadKind',
  'loadVA',
  'continuous',
  'conductorSize',
  'conductorMaterial',
  'insulationTempC',
  'terminationTempC',
  'lengthFt',
  'handleLock',
  'notes',
  'interruptingKA',
  'breakerMake',
  'catalogueNumber',
  'ambientC',
  'currentCarrying',
]);

/**
 * Whether mergeCircuitPatchesSetwise can take a batch: sync patches of free fields only, one per
 * circuit, from one device, each naming a building this push has locked where the actor edits schedules.
 */
export function canMergeSetwise(items: readonly CircuitPatchItem[]): boolean {
  if (items.length === 0) return false;
  const ids = new Set<string>();
  const { device, actor } = items[0].w;
  for (const { w, id, patch } of items) {
    if (!w.sync || w.device !== device || w.actor !== actor) return false;
    // locked by this push, and the actor edits schedules there (a push locks for every role)
    const home = w.versions.home(w.sync.buildingId);
    if (!home || !can(actor.roles.get(home.organisationId), 'schedule.edit')) return false;
    if (ids.has(id)) return false;
    ids.add(id);
    if (!Object.keys(patch).every((f) => FREE_CIRCUIT_FIELDS.has(f))) return false;
  }
  return true;
}

interface SetwiseDecision {
  /** the item; -1 for the one row that counts the claims */
  k: number;
  claimed: string | null;
  f: string;
  found: boolean;
  deleted_at: Date | null;
  stored: FieldStamp | null;
  deletion: FieldStamp | null;
  row_updated_at: string | null;
  row_updated_by: string | null;
  old: unknown;
  wins: boolean;
}

/**
 * The last-writer-wins merge of a batch of free-field circuit patches as ONE statement: the writes
 * travel as typed arrays to unnest, each is compared with the stored field's stamp in SQL (text order
 * under COLLATE "C", as in JavaScript), the winners are written with their stamps, and the
 * decisions that may hold a conflict (or a missing or deleted row) come back with the stored stamp
 * and the old value. The same rule in shared/merge.ts then turns those into outcomes and conflicts
 * (and must agree with SQL on who won, or the batch fails and is replayed one by one). The rows
 * are written before `persist`, which only adds the conflicts; a caller that cannot keep the
 * result rolls back its savepoint.
 */
export async function mergeCircuitPatchesSetwise(
  items: readonly CircuitPatchItem[],
): Promise<PatchPlan<null>> {
  const { em, actor, device, versions } = items[0].w;
  const meta = em.connection.getMetadata(Circuit);
  const fields = [...new Set(items.flatMap((i) => Object.keys(i.patch)))];
  if (fields.length === 0) {
    const outcomes = items.map(({ w }) => ({ ok: true as const, row: null, version: versions.peek(w.sync!.buildingId)! }));
    return { outcomes, persist: async () => {} };
  }
  const columns = fields.map((f) => {
    const column = meta.findColumnWithPropertyName(f);
    if (!column || typeof column.type !== 'string') throw new Error(`no typed column for ${f}`);
    return column;
  });
  // parameters: $1–$8 the writes as typed arrays (one element per field write), $9 circuit ids,
  // $10 device, $11 user, $12–$14 the claims (item, mutation id, version), then one per field name
  const name = (i: number) => `$${15 + i}::text`;
  const pick = columns.map((c) => `"${c.databaseName}"`).join(', ');
  const whens = columns.map((c, i) => `WHEN ${name(i)} THEN to_jsonb(cur."${c.databaseName}")`);
  const oldValue = `CASE w.f ${whens.join(' ')} END`;
  const assign = columns
    .map(
      (c, i) =>
        `"${c.databaseName}" = CASE WHEN a.vals ? ${name(i)}
                                THEN (a.vals ->> ${name(i)})::${c.type} ELSE t."${c.databaseName}" END`,
    )
    .join(',\n           ');
  const sql = `
    WITH w AS (
      -- a value's type differs by field, so it travels as its JSON text, parsed once here
      SELECT k, id, b, f, v::jsonb AS v, h, ver, bv
        FROM unnest($1::int[], $2::uuid[], $3::uuid[], $4::text[], $5::text[], $6::text[], $7::bigint[], $8::bigint[])
                 AS w(k, id, b, f, v, h, ver, bv)
    ), cur AS (
      SELECT id, building_id, deleted_at, updated_at, updated_by, field_meta, ${pick}
        FROM circuit WHERE id = ANY($9::uuid[])
    ), d AS (
      SELECT w.k, w.f, w.id, w.h, w.ver, w.v, w.bv,
             cur.id IS NOT NULL AND cur.building_id = w.b AS found,
             cur.deleted_at, cur.updated_at AS row_updated_at, cur.updated_by AS row_updated_by,
             m.stored,
             CASE WHEN cur.deleted_at IS NOT NULL THEN cur.field_meta -> 'deletedAt' END AS deletion,
             ${oldValue} AS old,
             m.stored IS NULL OR (w.h COLLATE "C") > ((m.stored ->> 'hlc') COLLATE "C") AS wins
        FROM w LEFT JOIN cur ON cur.id = w.id
        -- read the compressed field_meta once per write, not once per use
        LEFT JOIN LATERAL (SELECT cur.field_meta -> w.f AS stored) AS m ON true
    ), a AS (
      SELECT id, max(ver) AS ver,
             jsonb_object_agg(f, v) FILTER (WHERE wins) AS vals,
             jsonb_object_agg(f, jsonb_build_object('hlc', h, 'version', ver, 'device', $10::text, 'user', $11::text))
               FILTER (WHERE wins) AS stamps,
             max(h COLLATE "C") FILTER (WHERE wins) AS last_hlc
        FROM d WHERE found AND deleted_at IS NULL GROUP BY id
    ), written AS (
      UPDATE circuit AS t
         SET ${assign},
             field_meta = t.field_meta || COALESCE(a.stamps, '{}'::jsonb),
             version = a.ver,
             updated_at = CASE WHEN a.last_hlc > (t.updated_at COLLATE "C") THEN a.last_hlc ELSE t.updated_at END,
             updated_by = CASE WHEN a.last_hlc IS NULL THEN t.updated_by ELSE $11::uuid END
        FROM a WHERE t.id = a.id
      RETURNING t.id
    ), review AS (
      -- only the decisions that need a second look: a missing or deleted row, or a stored stamp from
      -- another device that this write either overwrote unseen or lost to (shared/merge.ts decides)
      SELECT k, f, found, deleted_at, stored, deletion, row_updated_at, row_updated_by, old, wins FROM d
       WHERE NOT found OR deleted_at IS NOT NULL
          OR (stored IS NOT NULL AND stored ->> 'device' <> $10::text
              AND ((wins AND (stored ->> 'version')::bigint > bv) OR (NOT wins AND h <> stored ->> 'hlc')))
    ), claimed AS (
      -- the mutations' ids, claimed for this device (a replay arriving later is a duplicate): an item
      -- with nothing to review is applied at its building's version, the others' answers the push
      -- records once shared/merge.ts has decided them
      INSERT INTO processed_mutation (device_id, mutation_id, user_id, result)
      SELECT $10::text, c.m, $11::uuid,
             CASE WHEN c.k IN (SELECT k FROM review) THEN NULL
                  ELSE jsonb_build_object('status', 'applied', 'version', c.ver) END
        FROM unnest($12::int[], $13::uuid[], $14::bigint[]) AS c(k, m, ver)
      ON CONFLICT DO NOTHING RETURNING 1
    )
    SELECT k, f, found, deleted_at, stored, deletion, row_updated_at, row_updated_by, old, wins, NULL::bigint AS claimed
      FROM review
    UNION ALL
    -- one more row, always there: how many ids were claimed
    SELECT -1, NULL, NULL, NULL, NULL, NULL, NULL, NULL, NULL, NULL, (SELECT count(*) FROM claimed)`;
  const writes = items.flatMap((item, k) =>
    Object.entries(item.patch)
      .filter(([, v]) => v !== undefined)
      .map(([f, v]) => ({ k, item, f, v })),
  );
  const answer: SetwiseDecision[] = await em.query(sql, [
    writes.map((x) => x.k),
    writes.map((x) => x.item.id),
    writes.map((x) => x.item.w.sync!.buildingId),
    writes.map((x) => x.f),
    writes.map((x) => JSON.stringify(x.v)),
    writes.map((x) => x.item.w.hlc),
    writes.map((x) => versions.peek(x.item.w.sync!.buildingId)),
    writes.map((x) => x.item.w.sync!.baseVersion),
    items.map((i) => i.id),
    device,
    actor.userId,
    items.map((_, k) => k),
    items.map((i) => i.w.sync!.mutationId),
    items.map((i) => versions.peek(i.w.sync!.buildingId)),
    ...fields,
  ]);
  const decisions = answer.filter((d) => d.k >= 0);
  const claimed = Number(answer.find((d) => d.k < 0)?.claimed ?? 0);

  const byItem = new Map<number, SetwiseDecision[]>();
  for (const d of decisions) byItem.set(d.k, [...(byItem.get(d.k) ?? []), d]);
  const drafts: ConflictDraft[] = [];
  const outcomes: ItemOutcome<null>[] = items.map(({ w, id, patch }, k) => {
    const rows = byItem.get(k) ?? [];
    const version = versions.peek(w.sync!.buildingId)!;
    const target: Target = { entity: 'circuit', buildingId: w.sync!.buildingId };
    // no decision came back: every field was merged without anything to review
    if (rows.length === 0) return { ok: true, row: null, version };
    if (!rows[0].found) return { ok: false, error: new NotFoundError('Circuit') };
    if (rows[0].deleted_at) {
      const tombstoned = {
        id,
        deletedAt: rows[0].deleted_at,
        updatedAt: rows[0].row_updated_at ?? '',
        updatedBy: rows[0].row_updated_by,
        fieldMeta: rows[0].deletion ? { deletedAt: rows[0].deletion } : {},
      } as SyncColumns;
      drafts.push(editedAfterDelete(tombstoned, patch, w, target));
      return { ok: true, row: null, version };
    }
    for (const d of rows) {
      const value = (patch as Record<string, unknown>)[d.f];
      const [decision] = decideWrite(
        d.stored ? { [d.f]: d.stored } : {},
        { hlc: w.hlc, device: w.device, fields: { [d.f]: value }, baseVersion: w.sync!.baseVersion },
        { [d.f]: d.old },
      );
      if ((decision.outcome === 'apply') !== d.wins) {
        throw new Error(`set-wise merge disagrees with shared/merge.ts on ${id}.${d.f}`);
      }
      if (decision.conflict) {
        drafts.push(concurrentDraft(decision, { [d.f]: d.old }, { [d.f]: value }, w, target, id));
      }
    }
    return { ok: true, row: null, version };
  });
  reportConflicts(drafts);
  return {
    outcomes,
    claims: { claimed, final: items.map((_, k) => !byItem.has(k)) },
    persist: () => insertConflicts(em, drafts),
  };
}

