/**
 * Key-value storage for the persisted cache, the outbox and the device's clock. Native: AsyncStorage
 * (files on the device). The web build uses storage.web.ts (IndexedDB).
 */
import AsyncStorage from '@react-native-async-storage/async-storage';

export interface KeyValueStore {
  getItem(key: string): Promise<string | null>;
  setItem(key: string, value: string): Promise<void>;
  removeItem(key: string): Promise<void>;
  /** values of several keys at once, `null` where a key has none */
  getMany(keys: string[]): Promise<(string | null)[]>;
  /**
   * Writes and removes together. On the web this is one IndexedDB transaction, so a tab killed in
   * the middle leaves either the old state or the new one, never half of each.
   */
  writeMany(set: [string, string][], remove: string[]): Promise<void>;
  /** every key that starts with `prefix` */
  keysWithPrefix(prefix: string): Promise<string[]>;
}

export const kv: KeyValueStore = {
  getItem: (key) => AsyncStorage.getItem(key),
  setItem: (key, value) => AsyncStorage.setItem(key, value),
  removeItem: (key) => AsyncStorage.removeItem(key),
  getMany: async (keys) => (await AsyncStorage.multiGet(keys)).map(([, value]) => value),
  // AsyncStorage has no transaction across keys: a crash between the two calls leaves stale rows
  // (the next save removes them), never missing ones, as long as no key is in both lists
  writeMany: async (set, remove) => {
    if (set.length) await AsyncStorage.multiSet(set);
    const written = new Set(set.map(([key]) => key));
    const gone = remove.filter((key) => !written.has(key));
    if (gone.length) await AsyncStorage.multiRemove(gone);
  },
  keysWithPrefix: async (prefix) => (await AsyncStorage.getAllKeys()).filter((k) => k.startsWith(prefix)),
};
