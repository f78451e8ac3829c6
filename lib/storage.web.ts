/**
 * On the web the persisted cache lives in IndexedDB, not localStorage: localStorage holds about
 * 5 MiB and a large building's schedule plus a queue of changes would not fit.
 */
import { createStore, del, get, getMany, promisifyRequest, set } from 'idb-keyval';
import type { KeyValueStore } from './storage';

export type { KeyValueStore } from './storage';

const store = typeof indexedDB === 'undefined' ? undefined : createStore('ampwright', 'kv');

export const kv: KeyValueStore = {
  getItem: async (key) => (store ? ((await get<string>(key, store)) ?? null) : null),
  setItem: async (key, value) => {
    if (store) await set(key, value, store);
  },
  removeItem: async (key) => {
    if (store) await del(key, store);
  },
  getMany: async (keys) => (store ? (await getMany<string>(keys, store)).map((v) => v ?? null) : keys.map(() => null)),
  writeMany: async (entries, remove) => {
    if (!store || (entries.length === 0 && remove.length === 0)) return;
    // one transaction: all of it lands or none of it does (a killed tab, a full disk)
    await store('readwrite', (s) => {
      for (const key of remove) s.delete(key);
      for (const [key, value] of entries) s.put(value, key);
      return promisifyRequest(s.transaction);
    });
  },
  keysWithPrefix: async (prefix) => {
    if (!store) return [];
    const range = IDBKeyRange.bound(prefix, `${prefix}\uffff`);
    return store('readonly', (s) => promisifyRequest(s.getAllKeys(range))) as Promise<string[]>;
  },
};
