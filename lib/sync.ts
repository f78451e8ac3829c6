/**
 * The sync engine: an outbox of queued mutations (TanStack mutations with one scope, persisted,
 * replayed in order) and a pull loop that keeps the device's replica current. See SYNC.md.
 */
import type { Mutation as QueryMutation, QueryClient } from '@tanstack/react-query';
import { pullResponse, pushResponse, SCHEMA_VERSION, type Mutation, type MutationResult, type PullResponse } from '@/shared/sync';
import { api, ApiError, describeError, NetworkError } from './api';
import { deviceId, observe } from './device';
import { estimateParts, setPullProgress, type BuildingPullProgress, type PagesSoFar } from './pull-progress';
import { clearCopyProblem } from './storage-health';
import {
  applyMutation,
  applyPull,
  cursorsOf,
  resumesOf,
  describeMutation,
  EMPTY_REPLICA,
  EMPTY_SYNC_LOG,
  recordResult,
  type Replica,
  type SyncLog,
} from './replica';

export const OUTBOX_KEY = ['sync'] as const;
export const REPLICA_KEY = ['replica'] as const;
export const SYNC_LOG_KEY = ['sync-log'] as const;

/** Worth trying again later: no answer, the server busy or failing, or the session to renew. */
export function isTransient(error: unknown): boolean {
  if (error instanceof NetworkError) return true;
  if (error instanceof ApiError) return error.status >= 500 || [401, 408, 425, 429].includes(error.status);
  return false;
}

async function pushOne(mutation: Mutation): Promise<MutationResult> {
  const response = await api.post('/sync/push', {
    deviceId: deviceId(),
    schemaVersion: SCHEMA_VERSION,
    mutations: [mutation],
  }, pushResponse);
  observe(response.serverHlc);
  return response.results[0];
}

export function pendingOutbox(queryClient: QueryClient): QueryMutation<unknown, unknown, Mutation>[] {
  return queryClient
    .getMutationCache()
    .findAll({ mutationKey: OUTBOX_KEY, status: 'pending' }) as QueryMutation<unknown, unknown, Mutation>[];
}

/** Lay the changes still queued on top of a copy (after a pull, after the copy is read back). */
export function rebaseOnOutbox(queryClient: QueryClient, replica: Replica, userId: string): Replica {
  return pendingOutbox(queryClient).reduce(
    (r, m) => (m.state.variables ? applyMutation(r, m.state.variables, userId) : r),
    replica,
  );
}

/** Pull every page since the device's cursors, then lay the still-queued changes on top. */
async function pullAll(queryClient: QueryClient, userId: string): Promise<Replica> {
  const start = queryClient.getQueryData<Replica>(REPLICA_KEY) ?? EMPTY_REPLICA;
  let pulled = start;
  // pages per building in this pull, for "Loading Tower: 3 of 9 parts"
  const counts = new Map<string, PagesSoFar>();
  try {
    for (;;) {
      const request = { cursors: cursorsOf(pulled), resume: resumesOf(pulled) };
      const response = await api.post('/sync/pull', {
        deviceId: deviceId(),
        schemaVersion: SCHEMA_VERSION,
        ...request,
      }, pullResponse);
      observe(response.serverHlc);
      pulled = applyPull(pulled, response);
      if (!response.buildings.some((b) => b.hasMore)) break;
      // a server that answers "more" without moving any cursor would loop forever: stop, the next
      // refetch tries again
      if (JSON.stringify(request) === JSON.stringify({ cursors: cursorsOf(pulled), resume: resumesOf(pulled) })) break;
      showProgress(counts, pulled, response);
      // keep what has arrived: the screens fill in, and a reload or a lost signal resumes from here
      queryClient.setQueryData<Replica>(REPLICA_KEY, rebaseOnOutbox(queryClient, pulled, userId));
    }
  } finally {
    if (counts.size > 0) setPullProgress([]);
  }
  clearCopyProblem();
  return rebaseOnOutbox(queryClient, { buildings: pulled.buildings, lastSyncAt: new Date().toISOString() }, userId);
}

/** Count the pages of buildings that arrive in several, and publish the estimate. */
function showProgress(counts: Map<string, PagesSoFar>, replica: Replica, response: PullResponse): void {
  const progress: BuildingPullProgress[] = [];
  for (const page of response.buildings) {
    const rows = Object.values(page.upserts).reduce((n, list) => n + list.length, 0);
    if (rows === 0 && !counts.has(page.buildingId)) continue;
    const soFar = counts.get(page.buildingId) ?? { pages: 0, rows: 0 };
    const next = { pages: soFar.pages + (rows > 0 ? 1 : 0), rows: soFar.rows + rows };
    counts.set(page.buildingId, next);
    if (!page.hasMore || page.remaining === undefined) continue;
    const name = replica.buildings[page.buildingId]?.building.name ?? 'building';
    progress.push({ buildingId: page.buildingId, name, part: next.pages, parts: estimateParts(next, page.remaining) });
  }
  setPullProgress(progress);
}

function updateReplica(queryClient: QueryClient, edit: (r: Replica) => Replica) {
  queryClient.setQueryData<Replica>(REPLICA_KEY, (r) => edit(r ?? EMPTY_REPLICA));
}

function logResult(queryClient: QueryClient, m: Mutation, result: MutationResult) {
  const label = describeMutation(queryClient.getQueryData<Replica>(REPLICA_KEY) ?? EMPTY_REPLICA, m);
  queryClient.setQueryData<SyncLog>(SYNC_LOG_KEY, (log) =>
    recordResult(log ?? EMPTY_SYNC_LOG, label, m, result, new Date().toISOString()),
  );
}

/**
 * Defaults for the replica query and the outbox. Registered before the persisted cache is
 * restored: a restored mutation only knows its key, and finds its function and scope here.
 */
export function configureSync(queryClient: QueryClient, userId: string, restored: Promise<void> = Promise.resolve()): void {
  // written only by the outbox; never fetched
  queryClient.setQueryDefaults(SYNC_LOG_KEY, { queryFn: () => EMPTY_SYNC_LOG, staleTime: Infinity, gcTime: Infinity });
  queryClient.setQueryDefaults(REPLICA_KEY, {
    // a pull lands on the whole copy: wait until every panel saved on the device is read back
    queryFn: async () => {
      await restored;
      return pullAll(queryClient, userId);
    },
    networkMode: 'offlineFirst',
    retry: false,
    staleTime: 10_000,
    gcTime: Infinity,
    refetchInterval: 60_000,
  });
  queryClient.setMutationDefaults(OUTBOX_KEY, {
    mutationFn: (m: Mutation) => pushOne(m),
    // one scope: queued changes go out one at a time, in the order they were made, even after reload
    scope: { id: 'outbox' },
    networkMode: 'offlineFirst',
    gcTime: Infinity,
    // retry only transient errors: a 4xx for the whole request would wedge the queue
    retry: (_count: number, error: unknown) => isTransient(error),
    retryDelay: (attempt: number) => Math.min(30_000, 1000 * 2 ** attempt) * (0.5 + Math.random() / 2),
    onMutate: (m: Mutation) => updateReplica(queryClient, (r) => applyMutation(r, m, userId)),
    onSuccess: (result: MutationResult, m: Mutation) => {
      logResult(queryClient, m, result);
      // the last queued change is out: fetch the truth (the mutation itself still counts as pending)
      if (pendingOutbox(queryClient).length <= 1) void queryClient.invalidateQueries({ queryKey: REPLICA_KEY });
    },
    onError: (error: unknown, m: Mutation) => {
      // only a final, non-transient failure gets here: keep the change for review, never drop it
      logResult(queryClient, m, { id: m.id, status: 'rejected', version: 0, reason: describeError(error) });
      void queryClient.invalidateQueries({ queryKey: REPLICA_KEY });
    },
  });
}

/**
 * After a restore: resume what was paused offline, and continue what was in flight at reload
 * (TanStack does not resume those by itself). Not awaited: offline, the resumed mutations only
 * settle when the signal returns, and the app must open meanwhile.
 */
export function resumeOutbox(queryClient: QueryClient): void {
  void queryClient.resumePausedMutations();
  for (const m of pendingOutbox(queryClient)) {
    if (!m.state.isPaused) void m.continue();
  }
}
