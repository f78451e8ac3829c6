import { In, type DataSource, type EntityManager } from 'typeorm';
import {
  PULL_PAGE_BYTES,
  PULL_PAGE_ROWS,
  PULL_PAGE_ROWS_WHOLE_VERSIONS,
  type BuildingPage,
  type PullBody,
  type PullResponse,
  type RecordList,
} from '../../shared/sync';
import { roleForBuilding, type Actor } from '../auth/access';
import {
  ArcFlashLabel,
  Building,
  Circuit,
  ConflictLog,
  Deficiency,
  DeficiencyEntry,
  Inspection,
  Panel,
  Photo,
  Reading,
  TripEvent,
} from '../entities';
import type { SyncColumns } from '../entities/sync-columns';
import { selectRows } from '../services/bulk';
import { serverStamp } from '../services/clock';
import { buildingDto, circuitDto, conflictDto, panelDto, recordDto } from '../services/serialise';
import { panelCounts } from './reads';

/**
 * `POST /api/sync/pull` (SYNC.md): one REPEATABLE READ transaction, so a building's version and
 * its rows come from one snapshot; a push holds its buildings' row locks until it commits, so a
 * snapshot sees whole pushes in version order and a cursor never passes a row that commits later.
 *
 * Pages are cut by row, not by version: a seeded or imported building has every row in one version
 * (400 panels ≈ 17 000 rows), which as one page would be megabytes. Rows are ordered by the key
 * (version, table, id); a page holds at most PULL_PAGE_ROWS rows and PULL_PAGE_BYTES of row JSON.
 * When a page ends inside version v, the page says `toVersion: v - 1` (every row up to it is
 * delivered) and a `resume` token naming the last key sent; the device sends both back. A row
 * changed between two pages gets a version above the building's, so it comes later in the key
 * order: nothing is skipped, and a row is sent again only when it changed.
 *
 * A snapshot (no cursor) leaves out deleted rows and resolved conflicts. The token carries the
 * version the snapshot started at, so later pages of it still send the tombstones of rows deleted
 * after it began (the device may have got those rows live on an earlier page).
 */

type List = 'panels' | 'circuits' | 'conflicts' | RecordList;
type Names = ReadonlyMap<string, string>;

/** A synced table: its list in a page, and how its rows are read and sent (as its own type). */
interface SyncTable {
  table: string;
  list: List;
  load(em: EntityManager, ids: string[], names: Names): Promise<{ row: SyncColumns; dto: object }[]>;
}

function syncTable<E extends SyncColumns>(table: string, entity: new () => E, list: List, dto: (row: E, names: Names) => object): SyncTable {
  return {
    table,
    list,
    async load(em, ids, names) {
      const rows = await selectRows(em, entity, 'id = ANY($1::uuid[])', [ids], { without: ['fieldMeta'] });
      return rows.map((row) => ({ row, dto: dto(row, names) }));
    },
  };
}

/** The synced tables in key order, with the name of their list in a page. */
const TABLES: readonly SyncTable[] = [
  syncTable('panel', Panel, 'panels', panelDto),
  syncTable('circuit', Circuit, 'circuits', circuitDto),
  syncTable('conflict_log', ConflictLog, 'conflicts', conflictDto),
  syncTable('inspection', Inspection, 'inspections', recordDto),
  syncTable('reading', Reading, 'readings', recordDto),
  syncTable('deficiency', Deficiency, 'deficiencies', recordDto),
  syncTable('deficiency_entry', DeficiencyEntry, 'entries', recordDto),
  syncTable('trip_event', TripEvent, 'trips', recordDto),
  syncTable('photo', Photo, 'photos', recordDto),
  // the token's table index is one digit (TOKEN below): a tenth table is the last that fits
  syncTable('arc_flash_label', ArcFlashLabel, 'arcFlashLabels', recordDto),
];
const CONFLICTS = TABLES.findIndex((t) => t.list === 'conflicts');

/** A position in the key order: after (version, table index, id). */
interface Key {
  version: number;
  table: number;
  id: string;
}

/** Where a building's next page starts, and from which version on a snapshot sends tombstones. */
interface Resume {
  after: Key;
  liveUpTo: number;
}

const NIL_ID = '00000000-0000-0000-0000-000000000000';
const TOKEN = /^(\d{1,15})\.(\d)\.([0-9a-f-]{36})\.(\d{1,15})$/;

function formatToken(r: Resume): string {
  return `${r.after.version}.${r.after.table}.${r.after.id}.${r.liveUpTo}`;
}

/** A token this server issued; anything else counts as none (the version is sent again, which is harmless). */
function parseToken(token: string | undefined): Resume | null {
  const m = token ? TOKEN.exec(token) : null;
  if (!m) return null;
  return { after: { version: Number(m[1]), table: Number(m[2]), id: m[3] }, liveUpTo: Number(m[4]) };
}

/**
 * Rows of a building past a key, up to a version. Parameters: $1 building, $2 cursor, $3 last
 * version, $4–$6 the key, $7 the version up to which only live rows count (0: every row).
 */
function rangeWhere(table: number): string {
  const open = TABLES[table].table === 'conflict_log' ? ' AND resolution IS NULL' : '';
  return `building_id = $1 AND version > $2 AND version <= $3
    AND (version, ${table}, id) > ($4::bigint, $5::int, $6::uuid)
    AND (version > $7 OR (deleted_at IS NULL${open}))`;
}

function keysSql(limit: boolean): string {
  const parts = TABLES.map((_, i) => `SELECT version, ${i} AS t, id FROM ${TABLES[i].table} WHERE ${rangeWhere(i)}`);
  return `SELECT version, t, id FROM (${parts.join('\n UNION ALL ')}) AS k ORDER BY version, t, id${limit ? ' LIMIT $8' : ''}`;
}

function countSql(): string {
  return `SELECT (${TABLES.map((_, i) => `(SELECT count(*) FROM ${TABLES[i].table} WHERE ${rangeWhere(i)})`).join(' + ')}) AS n`;
}

const emptyLists = (): Record<RecordList, never[]> => ({
  inspections: [],
  readings: [],
  deficiencies: [],
  entries: [],
  trips: [],
  photos: [],
  arcFlashLabels: [],
});

const emptyPage = (buildingId: string, toVersion: number, hasMore: boolean, resume?: string): BuildingPage => ({
  buildingId,
  reset: false,
  toVersion,
  hasMore,
  ...(resume && { resume }),
  building: null,
  upserts: { panels: [], circuits: [], conflicts: [], ...emptyLists() },
  tombstones: { panels: [], circuits: [], ...emptyLists() },
});

/** The names of the people in the page's conflicts (one statement, none without conflicts). */
async function userNames(em: EntityManager, conflictIds: string[]): Promise<Map<string, string>> {
  if (conflictIds.length === 0) return new Map();
  const users: { id: string; name: string }[] = await em.query(
    `SELECT id, name FROM app_user WHERE id IN (
       SELECT winner_user FROM conflict_log WHERE id = ANY($1::uuid[])
       UNION SELECT loser_user FROM conflict_log WHERE id = ANY($1::uuid[]))`,
    [conflictIds],
  );
  return new Map(users.map((u) => [u.id, u.name]));
}

/** What the response may still carry. */
interface Budget {
  rows: number;
  bytes: number;
}

interface PageInput {
  building: Building;
  cursor: number;
  token: string | undefined;
  /** the device understands `resume`; an older one gets whole versions, as before */
  splits: boolean;
}

async function buildingPage(em: EntityManager, actor: Actor, input: PageInput, budget: Budget): Promise<BuildingPage> {
  const { building } = input;
  const version = Number(building.version);
  const reset = input.cursor > version;
  const since = reset ? 0 : input.cursor;
  const given = reset ? null : parseToken(input.token);
  // a token must lie past the cursor and within what the server has issued
  const resume = given && given.after.version > since && given.after.version <= version ? given : null;
  if (since === version) return emptyPage(building.id, version, false);
  const liveUpTo = resume ? resume.liveUpTo : since === 0 ? version : 0;
  const after: Key = resume?.after ?? { version: since, table: -1, id: NIL_ID };
  const params = (from: Key, upTo = version) => [building.id, since, upTo, from.version, from.table, from.id, liveUpTo];

  let keys: { version: string; t: number; id: string }[] = await em.query(keysSql(true), [...params(after), budget.rows + 1]);
  let complete = keys.length <= budget.rows;
  if (!complete && !input.splits) {
    // an older device cannot resume inside a version: end at the last whole one, or send the
    // first version whole however big (what the server did before pages were cut by row)
    const cut = keys[budget.rows].version;
    const whole = keys.filter((k) => k.version !== cut);
    keys = whole.length > 0 ? whole : await em.query(keysSql(false), params(after, Number(cut)));
  }
  if (!complete && input.splits) keys = keys.slice(0, budget.rows);

  // the rows themselves, by id, per table; then in key order within the byte budget
  const rows: { key: Key; row: SyncColumns; dto: object; bytes: number }[] = [];
  const names = await userNames(em, keys.filter((k) => k.t === CONFLICTS).map((k) => k.id));
  const loaded = await Promise.all(
    TABLES.map(async (t, i) => {
      const ids = keys.filter((k) => k.t === i).map((k) => k.id);
      return ids.length === 0 ? [] : t.load(em, ids, names);
    }),
  );
  const byId = new Map(loaded.flatMap((list, i) => list.map((r) => [`${i}:${r.row.id}`, r] as const)));
  for (const k of keys) {
    const { row, dto } = byId.get(`${k.t}:${k.id}`)!;
    rows.push({ key: { version: Number(k.version), table: k.t, id: k.id }, row, dto, bytes: JSON.stringify(dto).length });
  }
  let kept = rows.length;
  if (input.splits) {
    let bytes = 0;
    for (let i = 0; i < rows.length; i++) {
      bytes += rows[i].bytes;
      // at least one row per page, however large, so a page always moves the device forward
      if (bytes > budget.bytes && i > 0) {
        kept = i;
        complete = false;
        break;
      }
    }
  }
  const page = rows.slice(0, kept);
  budget.rows -= page.length;
  budget.bytes -= page.reduce((n, r) => n + r.bytes, 0);

  let toVersion = version;
  let token: string | undefined;
  let remaining = 0;
  if (!complete) {
    const last = page[page.length - 1].key;
    if (input.splits) {
      toVersion = last.version - 1;
      token = formatToken({ after: last, liveUpTo });
    } else {
      toVersion = last.version;
    }
    const from = input.splits ? last : { version: last.version, table: TABLES.length, id: NIL_ID };
    const [{ n }]: { n: string }[] = await em.query(countSql(), params(from));
    remaining = Number(n);
    if (remaining === 0) toVersion = version;
  }
  const counts = await panelCounts(em, [building.id]);
  const role = roleForBuilding(actor, building)!;
  const out: BuildingPage = {
    ...emptyPage(building.id, toVersion, remaining > 0, remaining > 0 ? token : undefined),
    reset,
    remaining,
    building: buildingDto(building, role, counts.get(building.id) ?? 0),
  };
  for (const { key, row, dto } of page) {
    const list = TABLES[key.table].list;
    if (list === 'conflicts') out.upserts.conflicts.push(dto as BuildingPage['upserts']['conflicts'][number]);
    else if (row.deletedAt) (out.tombstones[list] as string[]).push(row.id);
    else (out.upserts[list] as unknown[]).push(dto);
  }
  return out;
}

/**
 * For each building the user may see, the changes past the device's cursor (and resume token),
 * within one response's row and byte budget; and the buildings the device must forget.
 */
export async function pullPages(ds: DataSource, actor: Actor, body: PullBody): Promise<PullResponse> {
  return ds.transaction('REPEATABLE READ', async (em) => {
    const orgIds = [...actor.roles.keys()];
    const all = orgIds.length
      ? await em.find(Building, { where: { organisationId: In(orgIds) }, order: { id: 'ASC' } })
      : [];
    // a deleted building is news only to a device that has it (perhaps only a first page of it)
    const held = (id: string) => (body.cursors[id] ?? 0) > 0 || body.resume?.[id] !== undefined;
    const visible = all.filter((b) => roleForBuilding(actor, b) !== null && (!b.deletedAt || held(b.id)));
    const visibleIds = new Set(all.filter((b) => roleForBuilding(actor, b) !== null).map((b) => b.id));
    const revoked = Object.keys(body.cursors).filter((id) => !visibleIds.has(id));
    const buildings: BuildingPage[] = [];
    const splits = body.resume !== undefined;
    const budget: Budget = splits
      ? { rows: PULL_PAGE_ROWS, bytes: PULL_PAGE_BYTES }
      : { rows: PULL_PAGE_ROWS_WHOLE_VERSIONS, bytes: Infinity };
    for (const building of visible) {
      const cursor = body.cursors[building.id] ?? 0;
      const token = body.resume?.[building.id];
      if (budget.rows <= 0 || budget.bytes <= 0) {
        // the response is full: the device pulls again at once (hasMore) with what it sent
        buildings.push(emptyPage(building.id, cursor, true, token));
        continue;
      }
      buildings.push(await buildingPage(em, actor, { building, cursor, token, splits }, budget));
    }
    return { serverHlc: serverStamp(), revoked, buildings };
  });
}
