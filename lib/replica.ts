/**
 * The device's copy of everything the user may see, as one persisted query: per building its
 * rows, its conflicts and its pull cursor. Pure functions only: pulls and local writes both go
 * through here, so what the screens show is always "server truth + the changes still queued".
 */
import type { ArcFlashLabel } from '@/shared/arc-flash';
import type { Deficiency, DeficiencyEntry, Inspection, Photo, Reading, TripEvent } from '@/shared/records';
import type { Building, Circuit, Panel } from '@/shared/schemas';
import { RESOLUTIONS, type BuildingPage, type Conflict, type Mutation, type MutationResult, type PullResponse, type RecordList } from '@/shared/sync';

/** The condition record of a building, by list (the same names as a pull page's). */
export interface RecordCopy {
  inspections: Record<string, Inspection>;
  readings: Record<string, Reading>;
  deficiencies: Record<string, Deficiency>;
  entries: Record<string, DeficiencyEntry>;
  trips: Record<string, TripEvent>;
  photos: Record<string, Photo>;
  arcFlashLabels: Record<string, ArcFlashLabel>;
}

export interface BuildingCopy extends Partial<RecordCopy> {
  building: Building;
  panels: Record<string, Panel>;
  circuits: Record<string, Circuit>;
  conflicts: Record<string, Conflict>;
  /** version of the last page applied: the next pull asks for what came after */
  cursor: number;
  /**
   * While a building arrives in several pages (a first sync of a big one), where the next page
   * starts inside version cursor + 1; sent back with the cursor. Absent once it is complete.
   */
  resume?: string;
}

/** A record list of a copy (a copy persisted before the condition record existed has none). */
export function recordsOf<L extends RecordList>(copy: BuildingCopy, list: L): RecordCopy[L] {
  return (copy[list] ?? {}) as RecordCopy[L];
}

/** A change the server refused (permission, validation): kept so nothing typed is lost silently. */
export interface RefusedChange {
  mutation: Mutation;
  label: string;
  reason: string;
  at: string;
}

export interface SyncedChange {
  mutationId: string;
  label: string;
  status: MutationResult['status'];
  at: string;
}

export interface Replica {
  buildings: Record<string, BuildingCopy>;
  lastSyncAt: string | null;
  /**
   * Panels whose circuits are still being read from the device's storage after a reload (the
   * panel the page opened is read first): a screen of one of them waits instead of showing gaps.
   */
  unloadedPanels?: Record<string, true>;
}

export const EMPTY_REPLICA: Replica = { buildings: {}, lastSyncAt: null };

/**
 * What happened to this device's changes. A query of its own, written only by the outbox: a pull
 * that lands a moment after a push answered can then never overwrite it.
 */
export interface SyncLog {
  refused: RefusedChange[];
  /** the latest changes that reached the server, newest first */
  synced: SyncedChange[];
}

export const EMPTY_SYNC_LOG: SyncLog = { refused: [], synced: [] };
const SYNCED_KEPT = 30;

const byId = <T extends { id: string }>(rows: readonly T[]) => Object.fromEntries(rows.map((r) => [r.id, r]));

/** Rows after a page: the upserts laid over what was there, tombstoned and deleted rows gone (the live view holds live rows only). */
function mergeRows<T extends { id: string; deletedAt: string | null }>(
  base: Record<string, T> | undefined,
  upserts: readonly T[] | undefined,
  tombstones: readonly string[] | undefined,
): Record<string, T> {
  const rows = { ...(base ?? {}), ...byId(upserts ?? []) };
  for (const id of tombstones ?? []) delete rows[id];
  for (const [id, row] of Object.entries(rows)) if (row.deletedAt) delete rows[id];
  return rows;
}

function applyPage(copy: BuildingCopy | undefined, page: BuildingPage): BuildingCopy | undefined {
  const base = page.reset || !copy ? undefined : copy;
  const building = page.building ?? base?.building;
  if (!building || building.deletedAt) return undefined;
  const { upserts: up, tombstones: gone } = page;
  const panels = mergeRows(base?.panels, up.panels, gone.panels);
  const circuits = mergeRows(base?.circuits, up.circuits, gone.circuits);
  // a circuit whose panel went (deleted, or not on the device) goes with it
  for (const [id, c] of Object.entries(circuits)) if (!panels[c.panelId]) delete circuits[id];
  const conflicts = { ...(base?.conflicts ?? {}), ...byId(up.conflicts) };
  const records: RecordCopy = {
    inspections: mergeRows(base?.inspections, up.inspections, gone.inspections),
    readings: mergeRows(base?.readings, up.readings, gone.readings),
    deficiencies: mergeRows(base?.deficiencies, up.deficiencies, gone.deficiencies),
    entries: mergeRows(base?.entries, up.entries, gone.entries),
    trips: mergeRows(base?.trips, up.trips, gone.trips),
    photos: mergeRows(base?.photos, up.photos, gone.photos),
    arcFlashLabels: mergeRows(base?.arcFlashLabels, up.arcFlashLabels, gone.arcFlashLabels),
  };
  return { building, panels, circuits, conflicts, ...records, cursor: page.toVersion, ...(page.resume && { resume: page.resume }) };
}

/** Apply one pull response: pages per building, then buildings the user lost. */
export function applyPull(replica: Replica, response: PullResponse): Replica {
  const buildings = { ...replica.buildings };
  for (const page of response.buildings) {
    const next = applyPage(buildings[page.buildingId], page);
    if (next) buildings[page.buildingId] = next;
    else delete buildings[page.buildingId];
  }
  for (const id of response.revoked) delete buildings[id];
  return { ...replica, buildings };
}

export function cursorsOf(replica: Replica): Record<string, number> {
  return Object.fromEntries(Object.entries(replica.buildings).map(([id, b]) => [id, b.cursor]));
}

/** The resume tokens of buildings still arriving in pages (sent, even empty, so the server may cut versions). */
export function resumesOf(replica: Replica): Record<string, string> {
  return Object.fromEntries(
    Object.entries(replica.buildings).flatMap(([id, b]) => (b.resume ? [[id, b.resume] as const] : [])),
  );
}

/**
 * Show a queued change on the device before the server has it (the optimistic half of the
 * outbox). Pure and idempotent: applying the same mutation twice gives the same copy. What each
 * kind does is its entry in KINDS (lib/replica-kinds.ts); a verb a kind does not list (a restore,
 * a building create) waits for the pull.
 */
export function applyMutation(replica: Replica, m: Mutation, userId: string | null): Replica {
  const copy = replica.buildings[m.buildingId];
  const { kind, verb } = partsOf(m);
  const apply = KINDS[kind]?.verbs[verb];
  if (!copy || !apply) return replica;
  // the server fills in names; until it answers, a row made here shows its author as "you"
  return { ...replica, buildings: { ...replica.buildings, [m.buildingId]: apply(copy, m, { userId, name: '' }) } };
}

/** "LA · 13 · description" — how a queued change reads on the Sync tab. */
export function describeMutation(replica: Replica, m: Mutation): string {
  const copy = replica.buildings[m.buildingId];
  const { kind, verb } = partsOf(m);
  const fields = Object.keys(m.fields ?? {});
  const what = fields.length && verb === 'patch' ? `: ${fields.join(', ')}` : '';
  return KINDS[kind]?.describe(copy, m, verb, what) ?? `${copy?.building.name ?? 'Building'} ${verb}${what}`;
}

/** Record what the server said about a pushed change; `label` from describeMutation. */
export function recordResult(log: SyncLog, label: string, m: Mutation, result: MutationResult, now: string): SyncLog {
  const synced = [{ mutationId: m.id, label, status: result.status, at: now }, ...log.synced].slice(0, SYNCED_KEPT);
  if (result.status === 'rejected' || result.originalStatus === 'rejected') {
    const refused = [{ mutation: m, label, reason: result.reason ?? 'refused by the server', at: now }, ...log.refused];
    return { synced, refused };
  }
  return { ...log, synced };
}

export function dismissRefused(log: SyncLog, mutationId: string): SyncLog {
  return { ...log, refused: log.refused.filter((r) => r.mutation.id !== mutationId) };
}

// ---------- the kinds: one table, what a queued change of each does to the copy ----------

interface Me {
  userId: string | null;
  name: string;
}

/** `deficiency.patch` → deficiency, patch */
function partsOf(m: Mutation): { kind: string; verb: string } {
  const [kind, verb = ''] = m.name.split('.');
  return { kind, verb };
}

/** The changed fields as a plain record, whatever the mutation's declared type. */
const fieldsOf = (m: Mutation): Record<string, unknown> => ({ ...m.fields });

/** The wall time of an HLC stamp as ISO text (the stamp starts with it). */
const hlcWallIso = (hlc: string): string => hlc.slice(0, 24);

const localColumns = (m: Mutation, me: Me) => ({ updatedAt: m.hlc, updatedBy: me.userId, deletedAt: null });

/** Where a kind's rows sit in a building's copy. */
interface Rows<R> {
  get(copy: BuildingCopy): Record<string, R>;
  put(copy: BuildingCopy, rows: Record<string, R>): BuildingCopy;
}

type Apply = (copy: BuildingCopy, m: Mutation, me: Me) => BuildingCopy;

interface KindSpec {
  /** the verbs the device shows at once, by name */
  verbs: Partial<Record<string, Apply>>;
  /** how a queued change of this kind reads on the Sync tab */
  describe(copy: BuildingCopy | undefined, m: Mutation, verb: string, what: string): string;
}

interface KindDef<R extends { id: string }> {
  rows: Rows<R>;
  /**
   * What a create shows before the server answers: its parent and the columns the server fills
   * in (as far as the device can tell). Absent: the kind is not created on the device.
   */
  created?: (m: Mutation, me: Me) => Record<string, unknown>;
  /** patches show at once */
  patch?: boolean;
  /** deletes show at once; `cascade` takes what goes with the row */
  delete?: boolean;
  cascade?: (copy: BuildingCopy, id: string) => BuildingCopy;
  /** verbs of this kind alone: the row after it; the same row when it does not apply */
  own?: Record<string, (old: R, m: Mutation, me: Me) => R>;
  describe: KindSpec['describe'];
}

/** One kind's entry: the generic create, patch and delete over its rows, plus its own verbs. */
function kind<R extends { id: string; version?: number }>(def: KindDef<R>): KindSpec {
  const { rows } = def;
  const edit = (copy: BuildingCopy, id: string, next: (old: R) => R): BuildingCopy => {
    const all = rows.get(copy);
    const old = all[id];
    if (!old) return copy;
    const row = next(old);
    return row === old ? copy : rows.put(copy, { ...all, [id]: row });
  };
  const verbs: Partial<Record<string, Apply>> = {};
  const { created } = def;
  if (created) {
    verbs.create = (copy, m, me) => {
      const all = rows.get(copy);
      // laid again after a pull that already brought the server's row: the server's stays
      if (all[m.entityId]?.version) return copy;
      // a row made on the device from the change's fields; the pull replaces it with the server's
      const made: Record<string, unknown> = { ...fieldsOf(m), ...created(m, me), id: m.entityId, version: 0, ...localColumns(m, me) };
      const row = made as R;
      return rows.put(copy, { ...all, [m.entityId]: row });
    };
  }
  if (def.patch) verbs.patch = (copy, m, me) => edit(copy, m.entityId, (old) => ({ ...old, ...fieldsOf(m), ...localColumns(m, me) }));
  if (def.delete) {
    verbs.delete = (copy, m) => {
      const { [m.entityId]: gone, ...rest } = rows.get(copy);
      if (!gone) return copy;
      const next = rows.put(copy, rest);
      return def.cascade ? def.cascade(next, m.entityId) : next;
    };
  }
  for (const [verb, change] of Object.entries(def.own ?? {})) {
    verbs[verb] = (copy, m, me) => edit(copy, m.entityId, (old) => change(old, m, me));
  }
  return { verbs, describe: def.describe };
}

/** "Deficiency patch · Hot lug: status" — a record's noun, verb and what names it. */
const recordWords =
  (noun: string, name?: (copy: BuildingCopy | undefined, m: Mutation) => string | undefined): KindSpec['describe'] =>
  (copy, m, verb, what) => {
    const named = name?.(copy, m);
    return `${noun} ${verb}${named ? ` · ${named}` : ''}${verb === 'patch' ? what : ''}`;
  };

const inBuilding = (m: Mutation) => ({ buildingId: m.buildingId });

const KINDS: Record<string, KindSpec> = {
  building: kind<Building>({
    // the building's own row, as a one-row table
    rows: { get: (c) => ({ [c.building.id]: c.building }), put: (c, rows) => ({ ...c, building: rows[c.building.id] ?? c.building }) },
    patch: true,
    describe: (copy, _m, verb, what) => `${copy?.building.name ?? 'Building'} ${verb}${what}`,
  }),
  panel: kind<Panel>({
    rows: { get: (c) => c.panels, put: (c, panels) => ({ ...c, panels }) },
    patch: true,
    delete: true,
    cascade: (c, panelId) => ({ ...c, circuits: Object.fromEntries(Object.entries(c.circuits).filter(([, x]) => x.panelId !== panelId)) }),
    describe: (copy, m, verb, what) => `Panel ${copy?.panels[m.entityId]?.tag ?? ''} ${verb}${what}`.trim(),
  }),
  circuit: kind<Circuit>({
    rows: { get: (c) => c.circuits, put: (c, circuits) => ({ ...c, circuits }) },
    created: (m) => ({ panelId: m.parentId }),
    patch: true,
    delete: true,
    describe: (copy, m, verb, what) => {
      const circuit = copy?.circuits[m.entityId];
      const panel = circuit ? copy?.panels[circuit.panelId] : m.parentId ? copy?.panels[m.parentId] : undefined;
      const position = circuit?.position ?? fieldsOf(m).position;
      return `${panel?.tag ?? 'Panel'} · ${String(position ?? '?')} ${verb}${what}`;
    },
  }),
  conflict: kind<Conflict>({
    rows: { get: (c) => c.conflicts, put: (c, conflicts) => ({ ...c, conflicts }) },
    own: {
      resolve: (old, m) => {
        const resolution = RESOLUTIONS.find((r) => r === fieldsOf(m).resolution);
        return resolution ? { ...old, resolution } : old;
      },
    },
    describe: (_copy, m) => `Review decision (${String(fieldsOf(m).resolution)})`,
  }),
  inspection: kind<Inspection>({
    rows: { get: (c) => recordsOf(c, 'inspections'), put: (c, inspections) => ({ ...c, inspections }) },
    created: (m, me) => ({ ...inBuilding(m), inspectorId: me.userId, inspectorName: me.name, signedAt: null, signedBy: null, signedByName: null }),
    patch: true,
    delete: true,
    own: {
      sign: (old, m, me) => (old.signedAt ? old : { ...old, signedAt: hlcWallIso(m.hlc), signedBy: me.userId, signedByName: me.name }),
    },
    describe: recordWords('Inspection'),
  }),
  reading: kind<Reading>({
    rows: { get: (c) => recordsOf(c, 'readings'), put: (c, readings) => ({ ...c, readings }) },
    created: inBuilding,
    patch: true,
    delete: true,
    describe: recordWords('Reading', (_copy, m) => {
      const { kind: readingKind } = fieldsOf(m);
      return readingKind ? String(readingKind) : undefined;
    }),
  }),
  deficiency: kind<Deficiency>({
    rows: { get: (c) => recordsOf(c, 'deficiencies'), put: (c, deficiencies) => ({ ...c, deficiencies }) },
    created: (m, me) => ({ ...inBuilding(m), raisedBy: me.userId, raisedByName: me.name }),
    patch: true,
    delete: true,
    describe: recordWords('Deficiency', (copy, m) => {
      const { title } = fieldsOf(m);
      return typeof title === 'string' ? title : copy ? recordsOf(copy, 'deficiencies')[m.entityId]?.title : undefined;
    }),
  }),
  comment: kind<DeficiencyEntry>({
    rows: { get: (c) => recordsOf(c, 'entries'), put: (c, entries) => ({ ...c, entries }) },
    created: (m, me) => ({ ...inBuilding(m), kind: 'comment', changes: {}, userId: me.userId, userName: me.name, at: hlcWallIso(m.hlc) }),
    describe: recordWords('Comment'),
  }),
  trip: kind<TripEvent>({ rows: { get: (c) => recordsOf(c, 'trips'), put: (c, trips) => ({ ...c, trips }) }, created: inBuilding, patch: true, delete: true, describe: recordWords('Recorded trip') }),
  photo: kind<Photo>({
    rows: { get: (c) => recordsOf(c, 'photos'), put: (c, photos) => ({ ...c, photos }) },
    created: (m) => ({ ...inBuilding(m), uploaded: false }),
    patch: true,
    delete: true,
    describe: recordWords('Photo'),
  }),
  'arc-flash': kind<ArcFlashLabel>({
    rows: { get: (c) => recordsOf(c, 'arcFlashLabels'), put: (c, arcFlashLabels) => ({ ...c, arcFlashLabels }) },
    created: inBuilding,
    patch: true,
    delete: true,
    describe: recordWords('Arc-flash label', (copy, m) => {
      const { studyDate } = fieldsOf(m);
      return typeof studyDate === 'string' ? `study ${studyDate}` : copy ? recordsOf(copy, 'arcFlashLabels')[m.entityId]?.studyDate : undefined;
    }),
  }),
};
