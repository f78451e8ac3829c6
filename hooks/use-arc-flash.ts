/**
 * A panel's arc-flash label on the device: read from the replica (so it shows offline) and
 * written through the outbox like every synced row (kind `arc-flash`, lib/replica.ts KINDS).
 */
import { useQuery, useQueryClient } from '@tanstack/react-query';
import { uuidv7 } from 'uuidv7';
import { EMPTY_REPLICA, recordsOf, type Replica } from '@/lib/replica';
import { currentLabel, type ArcFlashCreateBody, type ArcFlashLabel, type ArcFlashPatchBody } from '@/shared/arc-flash';
import { keys } from './keys';
import { useEnqueue } from './use-outbox';

function labelsOf(r: Replica, buildingId: string, panelId: string): ArcFlashLabel[] {
  const copy = r.buildings[buildingId];
  return copy ? Object.values(recordsOf(copy, 'arcFlashLabels')).filter((l) => l.panelId === panelId) : [];
}

/** The label the panel shows (its latest study), or undefined when none is recorded. */
export function useArcFlashLabel(buildingId: string, panelId: string): ArcFlashLabel | undefined {
  return useQuery({ queryKey: keys.replica, select: (r: Replica) => currentLabel(labelsOf(r, buildingId, panelId)) }).data;
}

export function useArcFlashWrites(buildingId: string) {
  const enqueue = useEnqueue();
  const queryClient = useQueryClient();
  const versionOf = (id: string) => {
    const copy = (queryClient.getQueryData<Replica>(keys.replica) ?? EMPTY_REPLICA).buildings[buildingId];
    return copy ? (recordsOf(copy, 'arcFlashLabels')[id]?.version ?? 0) : 0;
  };
  return {
    /** a new study's label; returns its id */
    create(fields: ArcFlashCreateBody): string {
      const id = uuidv7();
      enqueue({ name: 'arc-flash.create', buildingId, entityId: id, baseVersion: 0, fields });
      return id;
    },
    patch(id: string, fields: ArcFlashPatchBody) {
      enqueue({ name: 'arc-flash.patch', buildingId, entityId: id, baseVersion: versionOf(id), fields });
    },
  };
}
