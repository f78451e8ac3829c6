/**
 * Writes: every edit becomes a queued mutation (an optimistic change on the device plus an entry
 * in the outbox), whatever the signal. The sync engine (lib/sync.ts) sends them in order.
 */
import { onlineManager, useIsFetching, useMutation, useMutationState, useQueryClient } from '@tanstack/react-query';
import { useSyncExternalStore } from 'react';
import { uuidv7 } from 'uuidv7';
import { flushCacheSoon } from '@/lib/account';
import { stamp } from '@/lib/device';
import { probeNow } from '@/lib/online';
import { dismissRefused, EMPTY_REPLICA, EMPTY_SYNC_LOG, type Replica, type SyncLog } from '@/lib/replica';
import { OUTBOX_KEY } from '@/lib/sync';
import type { CircuitCreateBody, CircuitPatchBody, PanelPatchBody } from '@/shared/schemas';
import type { Conflict, Mutation, MutationResult } from '@/shared/sync';
import { keys } from './keys';
import { findPanel } from './use-register';

type Draft = Omit<Mutation, 'id' | 'hlc'>;

/** Queue one change. Returns at once; the change is already visible on the device. */
export function useEnqueue() {
  const { mutate } = useMutation<MutationResult, Error, Mutation>({ mutationKey: OUTBOX_KEY });
  return (draft: Draft) => {
    mutate({ ...draft, id: uuidv7(), hlc: stamp() });
    flushCacheSoon();
  };
}

function usePanelWrites(panelId: string) {
  const queryClient = useQueryClient();
  const enqueue = useEnqueue();
  const locate = () => {
    const found = findPanel(queryClient.getQueryData<Replica>(keys.replica) ?? EMPTY_REPLICA, panelId);
    if (!found) throw new Error('This panel is not on the device');
    return found;
  };
  return { enqueue, locate };
}

export function useCircuitWrites(panelId: string) {
  const { enqueue, locate } = usePanelWrites(panelId);
  return {
    save(circuitId: string, fields: CircuitPatchBody) {
      const { building, circuits } = locate();
      const circuit = circuits.find((c) => c.id === circuitId);
      enqueue({ name: 'circuit.patch', buildingId: building.id, entityId: circuitId, baseVersion: circuit?.version ?? 0, fields });
    },
    create(fields: CircuitCreateBody) {
      const { building } = locate();
      const { id: _id, ...rest } = fields;
      enqueue({ name: 'circuit.create', buildingId: building.id, entityId: uuidv7(), parentId: panelId, baseVersion: 0, fields: rest });
    },
    remove(circuitId: string) {
      const { building, circuits } = locate();
      const circuit = circuits.find((c) => c.id === circuitId);
      enqueue({ name: 'circuit.delete', buildingId: building.id, entityId: circuitId, baseVersion: circuit?.version ?? 0, fields: {} });
    },
  };
}

export function usePanelSave(panelId: string) {
  const { enqueue, locate } = usePanelWrites(panelId);
  return (fields: PanelPatchBody) => {
    const { building, panel } = locate();
    enqueue({ name: 'panel.patch', buildingId: building.id, entityId: panelId, baseVersion: panel.version, fields });
  };
}

/** Kinds whose deleted rows can be brought back (the condition record's cannot). */
const RESTORABLE = new Set(['building', 'panel', 'circuit']);

/** Whether "restore mine" can do anything for this conflict. */
export function canRestore(c: Conflict): boolean {
  return c.kind !== 'edited_after_delete' || RESTORABLE.has(c.entity);
}

/** "Keep theirs" closes the conflict; "restore mine" writes the losing value again, then closes it. */
export function useConflictActions() {
  const enqueue = useEnqueue();
  const resolve = (c: Conflict, resolution: 'kept_theirs' | 'restored_mine') =>
    enqueue({ name: 'conflict.resolve', buildingId: c.buildingId, entityId: c.id, baseVersion: c.version, fields: { resolution } });
  return {
    keepTheirs: (c: Conflict) => resolve(c, 'kept_theirs'),
    restoreMine: (c: Conflict) => {
      const kind = c.entity;
      // the conflict row is at least as new as the write that won: this is no new concurrent edit
      const baseVersion = c.version;
      if (!canRestore(c)) return;
      if (c.kind === 'edited_after_delete') {
        const restore = `${kind}.restore` as Mutation['name'];
        enqueue({ name: restore, buildingId: c.buildingId, entityId: c.entityId, baseVersion, fields: {} });
      }
      const patch = `${kind}.patch` as Mutation['name'];
      enqueue({ name: patch, buildingId: c.buildingId, entityId: c.entityId, baseVersion, fields: c.loserValue });
      resolve(c, 'restored_mine');
    },
  };
}

export function useDismissRefused() {
  const queryClient = useQueryClient();
  return (mutationId: string) =>
    queryClient.setQueryData<SyncLog>(keys.syncLog, (log) => dismissRefused(log ?? EMPTY_SYNC_LOG, mutationId));
}

/** The changes still on this device, oldest first. */
export function useOutbox() {
  return useMutationState({
    filters: { mutationKey: OUTBOX_KEY, status: 'pending' },
    select: (m) => ({ mutation: m.state.variables as Mutation, since: m.state.submittedAt, paused: m.state.isPaused }),
  });
}

export function useOnline(): boolean {
  return useSyncExternalStore(
    (cb) => onlineManager.subscribe(cb),
    () => onlineManager.isOnline(),
    () => true,
  );
}

/** "Sync now": ask the API whether it is back, send the queue, pull. */
export function useSyncNow() {
  const queryClient = useQueryClient();
  const pulling = useIsFetching({ queryKey: keys.replica }) > 0;
  return {
    pulling,
    syncNow: async () => {
      probeNow();
      void queryClient.resumePausedMutations();
      await queryClient.invalidateQueries({ queryKey: keys.replica });
    },
  };
}
