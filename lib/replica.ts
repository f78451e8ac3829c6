/**
 * The device's copy of everything the user may see, as one persisted query: per building its
 * rows, its conflicts and its pull cursor. Pure functions only: pulls and local writes both go
 * through here, so what the screens show is always "server truth + the changes still queued".
 */
import type { Building, Circuit, Panel } from '@/shared/schemas';
import type { BuildingPage, Conflict, Mutation, MutationResult, PullResponse } from '@/shared/sync';

export interface BuildingCopy {
  building: Building;
  panels: Record<string, Panel>;
  circuits: Record<string, Circuit>;
  conflicts: Record<string, Conflict>;
  /** version of the last page applied: the next pull asks for what came after */
  cursor: number;
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
  return { building, panels, circuits, conflicts, cursor: page.toVersion };
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
      // creates of panels and buildings, deletes of buildings and restores show after the next pull
      return replica;
  }
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
