/**
 * On the web the persisted cache lives in IndexedDB, not localStorage: localStorage holds about
 * 5 MiB and a large building's schedule plus a queue of changes would not fit.
 */
import { createStore, del, get, set } from 'idb-keyval';
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
};
