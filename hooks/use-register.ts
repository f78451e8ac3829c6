/**
 * Reads of buildings, panels and circuits, all from the device's replica: they work offline and
 * show queued changes at once.
 */
import { useQuery } from '@tanstack/react-query';
import { useCallback } from 'react';
import { describeMutation, type Replica, type SyncLog } from '@/lib/replica';
import type { Mutation } from '@/shared/sync';
import type { Building, Circuit, Panel } from '@/shared/schemas';
import { viewOf } from './building-view';
import { keys } from './keys';

function useReplica<T>(select: (r: Replica) => T) {
  return useQuery({ queryKey: keys.replica, select });
}

const byName = (a: Building, b: Building) => a.name.localeCompare(b.name);
const byTag = (a: Panel, b: Panel) => a.tag.localeCompare(b.tag, undefined, { numeric: true });
const byPosition = (a: Circuit, b: Circuit) => a.position - b.position;

export function useBuildings() {
  return useReplica(
    useCallback(
      (r: Replica) => ({
        buildings: Object.values(r.buildings)
          .map((c) => ({ ...c.building, panelCount: Object.keys(c.panels).length }))
          .sort(byName),
      }),
      [],
    ),
  );
}

/** `null` when the building is not on this device (deleted, or not yours). */
export function useBuilding(buildingId: string) {
  return useReplica(
    useCallback(
      (r: Replica) => {
        const copy = r.buildings[buildingId];
        if (!copy) return null;
        return { building: copy.building, panels: Object.values(copy.panels).sort(byTag) };
      },
      [buildingId],
    ),
  );
}

export function findPanel(r: Replica, panelId: string) {
  for (const copy of Object.values(r.buildings)) {
    const panel = copy.panels[panelId];
    if (panel) {
      const circuits = Object.values(copy.circuits).filter((c) => c.panelId === panelId).sort(byPosition);
      return { panel, building: copy.building, circuits };
    }
  }
  return null;
}

/**
 * `null` when the panel is not on this device; no data yet while its circuits are still being
 * read back from the device's storage after a reload (a screen then shows "loading", not gaps).
 */
export function usePanel(panelId: string) {
  const query = useReplica(
    useCallback((r: Replica) => (r.unloadedPanels?.[panelId] ? 'reading' : findPanel(r, panelId)), [panelId]),
  );
  if (query.data !== 'reading') return { ...query, data: query.data };
  return { ...query, data: undefined, isError: false };
}

/** Everything the Sync tab shows: conflicts from the copy, refused and synced from the log. */
export function useSyncReview() {
  const copy = useReplica(
    useCallback(
      (r: Replica) => ({
        conflicts: Object.values(r.buildings)
          .flatMap((c) => Object.values(c.conflicts).map((conflict) => ({ conflict, view: viewOf(c) })))
          .filter(({ conflict }) => conflict.resolution === null)
          .sort((a, b) => b.conflict.updatedAt.localeCompare(a.conflict.updatedAt)),
        lastSyncAt: r.lastSyncAt,
        /** how a queued change reads, against the current copy */
        describe: (m: Mutation) => describeMutation(r, m),
      }),
      [],
    ),
  );
  const log = useQuery({ queryKey: keys.syncLog, select: (l: SyncLog) => l });
  return {
    conflicts: copy.data?.conflicts ?? [],
    lastSyncAt: copy.data?.lastSyncAt ?? null,
    describe: copy.data?.describe ?? ((m: Mutation) => m.name),
    refused: log.data?.refused ?? [],
    synced: log.data?.synced ?? [],
  };
}

/** Every live circuit of a building with the panels, for searching its directory. */
export function useBuildingDirectory(buildingId: string) {
  return useReplica(
    useCallback(
      (r: Replica) => {
        const copy = r.buildings[buildingId];
        if (!copy) return null;
        return { panels: Object.values(copy.panels).sort(byTag), circuits: Object.values(copy.circuits) };
      },
      [buildingId],
    ),
  );
}
