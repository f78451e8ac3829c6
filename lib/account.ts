/**
 * Which user's data this device is showing. Each user has a cache of their own (the persisted
 * query client under `ampwright:cache:<userId>`), so one phone can be shared without mixing data.
 */
import { createAsyncStoragePersister } from '@tanstack/query-async-storage-persister';
import type { PersistedClient, Persister } from '@tanstack/react-query-persist-client';
import { reportPersistFailure, reportPersistOk } from './storage-health';
import { kv } from './storage';

const ACTIVE_USER_KEY = 'ampwright:active-user';
export const cacheKey = (userId: string) => `ampwright:cache:${userId}`;

export async function getActiveUser(): Promise<string | null> {
  return kv.getItem(ACTIVE_USER_KEY).catch(() => null);
}

export async function setActiveUser(userId: string | null): Promise<void> {
  if (userId) await kv.setItem(ACTIVE_USER_KEY, userId);
  else await kv.removeItem(ACTIVE_USER_KEY);
}

export async function wipeUserCache(userId: string): Promise<void> {
  await kv.removeItem(cacheKey(userId));
}

/**
 * What to keep when the device is full: the session and the outbox, not the copy of the buildings
 * (it can be pulled again; unsent changes cannot be typed again).
 */
export function withoutBuildingCopy(client: PersistedClient): PersistedClient {
  const queries = client.clientState.queries.filter((q) => q.queryKey[0] !== 'replica');
  return { ...client, clientState: { ...client.clientState, queries } };
}

export function makePersister(userId: string): Persister {
  // set while the reduced snapshot after a failed save is being written: only once it is stored
  // does the user hear "out of storage, your changes are kept"
  let reducedAfter: Error | null = null;
  const storage = {
    getItem: (key: string) => kv.getItem(key),
    removeItem: (key: string) => kv.removeItem(key),
    setItem: async (key: string, value: string) => {
      await kv.setItem(key, value);
      if (reducedAfter) reportPersistFailure(reducedAfter);
      else reportPersistOk();
      reducedAfter = null;
    },
  };
  return createAsyncStoragePersister({
    storage,
    key: cacheKey(userId),
    throttleTime: 200,
    retry: ({ persistedClient, error, errorCount }) => {
      if (errorCount > 1) {
        reportPersistFailure(error);
        return undefined;
      }
      reducedAfter = error;
      return withoutBuildingCopy(persistedClient);
    },
  });
}

/**
 * Write the mounted user's cache now instead of after the throttle: called right after a change
 * is queued, so a reload a moment later still finds it (set by the user's cache provider).
 */
let flushCache: (() => Promise<void>) | null = null;

export function setCacheFlush(flush: (() => Promise<void>) | null): void {
  flushCache = flush;
}

export function flushCacheSoon(): void {
  // after onMutate has put the change on the copy (it runs a microtask after mutate())
  setTimeout(() => void flushCache?.().catch(() => undefined), 0);
}
