/**
 * The device's copy of everything the user may see, as one persisted query: per building its
 * rows, its conflicts and its pull cursor. Pure functions only: pulls and local writes both go
 * through here, so what the screens show is always "server truth + the changes still queued".
 */
import type { Deficiency, DeficiencyEntry, Inspection, Photo, Reading, TripEvent } from '@/shared/records';
import type { Building, Circuit, Panel } from '@/shared/schemas';
import { RECORD_LISTS, type BuildingPage, type Conflict, type Mutation, type MutationResult, type PullResponse, type RecordList } from '@/shared/sync';

/** The condition record of a building, by list (the same names as a pull page's). */
export interface RecordCopy {
  inspections: Record<string, Inspection>;
  readings: Record<string, Reading>;
  deficiencies: Record<string, Deficiency>;
  entries: Record<string, DeficiencyEntry>;
  trips: Record<string, TripEvent>;
  photos: Record<string, Photo>;
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

const byId = <T extends { id: string }>(rows: T[]) => Object.fromEntries(rows.map((r) => [r.id, r]));

function applyPage(copy: BuildingCopy | undefined, page: BuildingPage): BuildingCopy | undefined {
  const base = page.reset || !copy ? undefined : copy;
  const building = page.building ?? base?.building;
  if (!building || building.deletedAt) return undefined;
  const panels = { ...(base?.panels ?? {}), ...byId(page.upserts.panels) };
  const circuits = { ...(base?.circuits ?? {}), ...byId(page.upserts.circuits) };
  const conflicts = { ...(base?.conflicts ?? {}), ...byId(page.upserts.conflicts) };
  for (const id of page.tombstones.panels) delete panels[id];
  for (const id of page.tombstones.circuits) delete circuits[id];
  // upserts may carry tombstoned rows too: the live view holds live rows only
  for (const [id, p] of Object.entries(panels)) if (p.deletedAt) delete panels[id];
  for (const [id, c] of Object.entries(circuits)) if (c.deletedAt || !panels[c.panelId]) delete circuits[id];
  const records = {} as RecordCopy;
  for (const list of RECORD_LISTS) {
    const rows: Record<string, { deletedAt: string | null }> = {
      ...(base ? recordsOf(base, list) : {}),
      ...byId((page.upserts[list] ?? []) as { id: string; deletedAt: string | null }[]),
    };
    for (const id of page.tombstones[list] ?? []) delete rows[id];
    for (const [id, row] of Object.entries(rows)) if (row.deletedAt) delete rows[id];
    (records as unknown as Record<string, unknown>)[list] = rows;
  }
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

function withCopy(replica: Replica, buildingId: string, edit: (copy: BuildingCopy) => BuildingCopy): Replica {
  const copy = replica.buildings[buildingId];
  if (!copy) return replica;
  return { ...replica, buildings: { ...replica.buildings, [buildingId]: edit(copy) } };
}

const localColumns = (m: Mutation, userId: string | null) => ({
  updatedAt: m.hlc,
  updatedBy: userId,
  deletedAt: null,
});

/**
 * Show a queued change on the device before the server has it (the optimistic half of the
 * outbox). Pure and idempotent: applying the same mutation twice gives the same copy.
 */
export function applyMutation(replica: Replica, m: Mutation, userId: string | null): Replica {
  const f = m.fields as Record<string, unknown>;
  switch (m.name) {
    case 'circuit.patch':
      return withCopy(replica, m.buildingId, (c) => {
        const old = c.circuits[m.entityId];
        if (!old) return c;
        return { ...c, circuits: { ...c.circuits, [m.entityId]: { ...old, ...f, ...localColumns(m, userId) } as Circuit } };
      });
    case 'circuit.create':
      return withCopy(replica, m.buildingId, (c) => ({
        ...c,
        circuits: {
          ...c.circuits,
          [m.entityId]: {
            ...(f as object),
            id: m.entityId,
            panelId: m.parentId!,
            version: 0,
            ...localColumns(m, userId),
          } as Circuit,
        },
      }));
    case 'circuit.delete':
      return withCopy(replica, m.buildingId, (c) => {
        const { [m.entityId]: _gone, ...circuits } = c.circuits;
        return { ...c, circuits };
      });
    case 'panel.patch':
      return withCopy(replica, m.buildingId, (c) => {
        const old = c.panels[m.entityId];
        if (!old) return c;
        return { ...c, panels: { ...c.panels, [m.entityId]: { ...old, ...f, ...localColumns(m, userId) } as Panel } };
      });
    case 'panel.delete':
      return withCopy(replica, m.buildingId, (c) => {
        const { [m.entityId]: _gone, ...panels } = c.panels;
        const circuits = Object.fromEntries(Object.entries(c.circuits).filter(([, x]) => x.panelId !== m.entityId));
        return { ...c, panels, circuits };
      });
    case 'building.patch':
      return withCopy(replica, m.buildingId, (c) => ({ ...c, building: { ...c.building, ...f, ...localColumns(m, userId) } as Building }));
    case 'conflict.resolve':
      return withCopy(replica, m.buildingId, (c) => {
        const old = c.conflicts[m.entityId];
        if (!old) return c;
        return { ...c, conflicts: { ...c.conflicts, [m.entityId]: { ...old, resolution: f.resolution as Conflict['resolution'] } } };
      });
    default:
      return applyRecordMutation(replica, m, userId);
  }
}

/** Which list a record mutation's kind lives in. */
const LIST_OF: Record<string, RecordList> = {
  inspection: 'inspections',
  reading: 'readings',
  deficiency: 'deficiencies',
  trip: 'trips',
  photo: 'photos',
};

/** What the server adds to a new row, as far as the device can tell before it answers. */
function createdColumns(kind: string, m: Mutation, me: MeLike): Record<string, unknown> {
  switch (kind) {
    case 'inspection':
      return { inspectorId: me.userId, inspectorName: me.name, signedAt: null, signedBy: null, signedByName: null };
    case 'deficiency':
      return { raisedBy: me.userId, raisedByName: me.name };
    case 'photo':
      return { uploaded: false };
    default:
      return {};
  }
}

interface MeLike {
  userId: string | null;
  name: string;
}

function withList<L extends RecordList>(
  replica: Replica,
  buildingId: string,
  list: L,
  edit: (rows: RecordCopy[L], copy: BuildingCopy) => RecordCopy[L],
): Replica {
  return withCopy(replica, buildingId, (c) => ({ ...c, [list]: edit(recordsOf(c, list), c) }));
}

/** Creates, patches and deletes of the condition record, and the inspection's sign-off. */
function applyRecordMutation(replica: Replica, m: Mutation, userId: string | null): Replica {
  const f = m.fields as Record<string, unknown>;
  // the server fills in names; until it answers, a row made here shows its author as "you"
  const me = { userId, name: '' };
  if (m.name === 'comment.create') {
    return withList(replica, m.buildingId, 'entries', (rows) => ({
      ...rows,
      [m.entityId]: {
        id: m.entityId,
        buildingId: m.buildingId,
        deficiencyId: f.deficiencyId as string,
        kind: 'comment',
        text: f.text as string,
        changes: {},
        userId,
        userName: me.name,
        at: hlcWallIso(m.hlc),
        version: 0,
        ...localColumns(m, userId),
      },
    }));
  }
  if (m.name === 'inspection.sign') {
    return withList(replica, m.buildingId, 'inspections', (rows) => {
      const old = rows[m.entityId];
      if (!old || old.signedAt) return rows;
      const signed = { ...old, signedAt: hlcWallIso(m.hlc), signedBy: userId, signedByName: me.name };
      return { ...rows, [m.entityId]: signed };
    });
  }
  const [kind, verb] = m.name.split('.');
  const list = LIST_OF[kind];
  if (!list) return replica;
  return withList(replica, m.buildingId, list, (rows) => {
    const all = rows as Record<string, object>;
    if (verb === 'create') {
      // laid again after a pull that already brought the server's row: the server's stays
      if ((all[m.entityId] as { version?: number } | undefined)?.version) return rows;
      const row = { ...f, ...createdColumns(kind, m, me), id: m.entityId, buildingId: m.buildingId, version: 0, ...localColumns(m, userId) };
      return { ...all, [m.entityId]: row } as RecordCopy[typeof list];
    }
    const old = all[m.entityId];
    if (!old) return rows;
    if (verb === 'patch') return { ...all, [m.entityId]: { ...old, ...f, ...localColumns(m, userId) } } as RecordCopy[typeof list];
    if (verb === 'delete') {
      const { [m.entityId]: _gone, ...rest } = all;
      return rest as RecordCopy[typeof list];
    }
    return rows;
  });
}

/** The wall time of an HLC stamp as ISO text (the stamp starts with it). */
function hlcWallIso(hlc: string): string {
  return hlc.slice(0, 24);
}

/** "LA · 13 · description" — how a queued change reads on the Sync tab. */
export function describeMutation(replica: Replica, m: Mutation): string {
  const copy = replica.buildings[m.buildingId];
  const fields = Object.keys(m.fields ?? {});
  const verb = m.name.split('.')[1];
  const what = fields.length && verb === 'patch' ? `: ${fields.join(', ')}` : '';
  if (m.name.startsWith('circuit.')) {
    const circuit = copy?.circuits[m.entityId];
    const panel = circuit ? copy?.panels[circuit.panelId] : m.parentId ? copy?.panels[m.parentId] : undefined;
    const position = circuit?.position ?? (m.fields as { position?: number }).position;
    return `${panel?.tag ?? 'Panel'} · ${position ?? '?'} ${verb}${what}`;
  }
  if (m.name.startsWith('panel.')) return `Panel ${copy?.panels[m.entityId]?.tag ?? ''} ${verb}${what}`.trim();
  if (m.name === 'conflict.resolve') return `Review decision (${String((m.fields as { resolution?: string }).resolution)})`;
  const record = copy ? describeRecord(copy, m, verb, what) : null;
  if (record) return record;
  return `${copy?.building.name ?? 'Building'} ${verb}${what}`;
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

const RECORD_NOUNS: Record<string, string> = {
  inspection: 'Inspection',
  reading: 'Reading',
  deficiency: 'Deficiency',
  comment: 'Comment',
  trip: 'Recorded trip',
  photo: 'Photo',
};

function describeRecord(copy: BuildingCopy, m: Mutation, verb: string, what: string): string | null {
  const kind = m.name.split('.')[0];
  const noun = RECORD_NOUNS[kind];
  if (!noun) return null;
  const f = m.fields as Record<string, unknown>;
  if (kind === 'deficiency') {
    const title = (f.title as string | undefined) ?? recordsOf(copy, 'deficiencies')[m.entityId]?.title;
    return `${noun} ${verb}${title ? ` · ${title}` : ''}${verb === 'patch' ? what : ''}`;
  }
  if (kind === 'reading') return `${noun} ${verb}${f.kind ? ` · ${String(f.kind)}` : ''}${verb === 'patch' ? what : ''}`;
  return `${noun} ${verb}${verb === 'patch' ? what : ''}`;
}
