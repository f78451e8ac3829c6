/**
 * Which user's data this device is showing. Each user has a cache of their own (the persisted
 * query client under `ampwright:cache:<userId>`), so one phone can be shared without mixing data.
 */
import { createAsyncStoragePersister } from '@tanstack/query-async-storage-persister';
import type { Persister } from '@tanstack/react-query-persist-client';
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

export function makePersister(userId: string): Persister {
  // true while the write in progress is the reduced one after a failure: its success is no all-clear
  let reduced = false;
  const storage = {
    getItem: (key: string) => kv.getItem(key),
    removeItem: (key: string) => kv.removeItem(key),
    setItem: async (key: string, value: string) => {
      await kv.setItem(key, value);
      if (reduced) reduced = false;
      else reportPersistOk();
    },
  };
  return createAsyncStoragePersister({
    storage,
    key: cacheKey(userId),
    throttleTime: 200,
    // the device is full: keep the outbox and the session, give up the copy of the buildings
    // (it can be pulled again; unsent changes cannot be typed again)
    retry: ({ persistedClient, error, errorCount }) => {
      reportPersistFailure(error);
      if (errorCount > 1) return undefined;
      reduced = true;
      const queries = persistedClient.clientState.queries.filter((q) => q.queryKey[0] === 'me');
      return { ...persistedClient, clientState: { ...persistedClient.clientState, queries } };
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
