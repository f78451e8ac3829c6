/**
 * Which user's data this device is showing. Each user has data of their own (lib/device-copy.ts:
 * the persisted client under `ampwright:cache:<userId>` and the building copy under
 * `ampwright:<userId>:copy:…`), so one phone can be shared without mixing data.
 */
import { wipeDeviceCopy } from './device-copy';
import { kv } from './storage';

const ACTIVE_USER_KEY = 'ampwright:active-user';

export async function getActiveUser(): Promise<string | null> {
  return kv.getItem(ACTIVE_USER_KEY).catch(() => null);
}

export async function setActiveUser(userId: string | null): Promise<void> {
  if (userId) await kv.setItem(ACTIVE_USER_KEY, userId);
  else await kv.removeItem(ACTIVE_USER_KEY);
}

/** Sign-out, after its warning: the only way the app itself removes a user's buildings. */
export async function wipeUserCache(userId: string): Promise<void> {
  await wipeDeviceCopy(userId);
}

/**
 * Write the mounted user's data now instead of after the coalescing delay: called right after a
 * change is queued, so a reload a moment later still finds it (set by the user's cache provider).
 */
let flushCache: (() => Promise<void>) | null = null;

export function setCacheFlush(flush: (() => Promise<void>) | null): void {
  flushCache = flush;
}

export function flushCacheSoon(): void {
  // after onMutate has put the change on the copy (it runs a microtask after mutate())
  setTimeout(() => void flushCache?.().catch(() => undefined), 0);
}
