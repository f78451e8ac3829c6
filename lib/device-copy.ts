/**
 * The signed-in user's data on this device, kept across reloads with no signal.
 *
 * Two parts, written together in one storage transaction:
 * - the small persisted client (`ampwright:cache:<userId>`): the session, the band library, the
 *   sync log and the queued changes — TanStack's dehydrated state, without the building copy;
 * - the building copy (lib/replica-store.ts): one entry per building and one per panel, written
 *   only where rows changed, read per need at boot (the panel a reload opens first, the rest in
 *   the background).
 *
 * The copy is saved from the query's data whatever the query's status: a refetch that fails
 * offline or on a 5xx leaves its data in place, and so does the save. Only sign-out (wipe) and a
 * building the server says was revoked (it leaves the data, so the save removes it) remove one.
 */
import { dehydrate, type DehydrateOptions, type QueryClient } from '@tanstack/react-query';
import type { PersistedClient, Persister } from '@tanstack/react-query-persist-client';
import type { Circuit } from '@/shared/schemas';
import { EMPTY_REPLICA, type BuildingCopy, type Replica } from './replica';
import {
  addCircuits,
  buildingOfPanel,
  circuitsByPanel,
  copyKeys,
  headOf,
  joinCopy,
  panelOfPath,
  parseHead,
  parseIndex,
  parsePanelCircuits,
  sameRows,
  type StoredHead,
  type StoredIndex,
} from './replica-store';
import { reportCopyProblem, reportPersistFailure, reportPersistOk } from './storage-health';
import { kv } from './storage';

export const cacheKey = (userId: string) => `ampwright:cache:${userId}`;
const REPLICA = ['replica'] as const;
/** panels read per storage request while the rest of a building loads in the background */
const PANELS_PER_READ = 40;

export interface DeviceCopyOptions {
  userId: string;
  queryClient: QueryClient;
  buster: string;
  dehydrateOptions: DehydrateOptions;
  /** lays the changes still queued on top of a copy (lib/sync.ts) */
  rebase: (replica: Replica) => Replica;
  /** the path the app was opened at, to load that panel first */
  path?: string;
}

export interface DeviceCopy {
  persister: Persister;
  /** write what changed now (after a change is queued, on pagehide) */
  flush(): Promise<void>;
  /** after the restore: load the panels not read yet, without holding up the first screen */
  loadRest(): Promise<void>;
  /** resolves once every stored panel is in memory; a pull waits for it */
  loaded: Promise<void>;
}

/** What was last written, by object identity: the rows are immutable, a new object is a change. */
interface Saved {
  heads: Map<string, StoredHead>;
  circuitMaps: Map<string, BuildingCopy['circuits']>;
  panels: Map<string, Map<string, Circuit[]>>;
  index: StoredIndex | null;
}

export function makeDeviceCopy(options: DeviceCopyOptions): DeviceCopy {
  const { userId, queryClient } = options;
  const keys = copyKeys(userId);
  const saved: Saved = { heads: new Map(), circuitMaps: new Map(), panels: new Map(), index: null };
  /** panels whose stored circuits are not in memory yet, by building: never written meanwhile */
  const unloaded = new Map<string, Set<string>>();
  /** entries found unreadable at boot: removed by the next save */
  const damaged = new Set<string>();
  let markLoaded: () => void = () => undefined;
  /** set once the provider has hydrated what was saved: no write may happen before */
  let restored = false;
  const loaded = new Promise<void>((resolve) => (markLoaded = resolve));

  const replica = () => queryClient.getQueryData<Replica>(REPLICA);

  function snapshot(): PersistedClient {
    return { buster: options.buster, timestamp: Date.now(), clientState: dehydrate(queryClient, options.dehydrateOptions) };
  }

  /** The storage writes that bring the stored copy to `current`, and how to remember them. */
  async function plan(current: Replica | undefined) {
    const set: [string, string][] = [];
    const remove: string[] = [...damaged];
    const next: Saved = { heads: new Map(saved.heads), circuitMaps: new Map(saved.circuitMaps), panels: new Map(saved.panels), index: saved.index };
    if (!current) return { set, remove, next };
    for (const [buildingId, copy] of Object.entries(current.buildings)) {
      const head = headOf(copy);
      const lastHead = next.heads.get(buildingId);
      if (!lastHead || changed(lastHead, head)) set.push([keys.building(buildingId), JSON.stringify(head)]);
      next.heads.set(buildingId, head);
      if (next.circuitMaps.get(buildingId) === copy.circuits && lastHead?.panels === copy.panels) continue;
      const lastPanels = next.panels.get(buildingId) ?? new Map<string, Circuit[]>();
      const panels = new Map<string, Circuit[]>();
      const skip = unloaded.get(buildingId);
      for (const [panelId, circuits] of circuitsByPanel(copy)) {
        if (skip?.has(panelId)) continue;
        panels.set(panelId, circuits);
        if (!sameRows(lastPanels.get(panelId), circuits)) set.push([keys.panel(buildingId, panelId), JSON.stringify(circuits)]);
      }
      for (const panelId of lastPanels.keys()) if (!panels.has(panelId) && !skip?.has(panelId)) remove.push(keys.panel(buildingId, panelId));
      next.panels.set(buildingId, panels);
      next.circuitMaps.set(buildingId, copy.circuits);
    }
    for (const buildingId of [...next.heads.keys()]) {
      if (current.buildings[buildingId]) continue;
      // revoked or deleted on the server: its panels too, including any never loaded
      remove.push(...(await kv.keysWithPrefix(keys.building(buildingId))));
      next.heads.delete(buildingId);
      next.circuitMaps.delete(buildingId);
      next.panels.delete(buildingId);
    }
    const index: StoredIndex = { buildingIds: Object.keys(current.buildings), lastSyncAt: current.lastSyncAt };
    if (!saved.index || saved.index.lastSyncAt !== index.lastSyncAt || saved.index.buildingIds.join() !== index.buildingIds.join()) {
      set.push([keys.index, JSON.stringify(index)]);
    }
    next.index = index;
    // a damaged entry written afresh in this save is replaced, not removed
    const written = new Set(set.map(([key]) => key));
    return { set, remove: remove.filter((key) => !written.has(key)), next };
  }

  async function write(): Promise<void> {
    // before the restore has put the saved state back, a save would write an empty queue over it
    if (!restored) return;
    const small = JSON.stringify(snapshot());
    const { set, remove, next } = await plan(replica());
    try {
      await kv.writeMany([...set, [cacheKey(userId), small]], remove);
      Object.assign(saved, next);
      damaged.clear();
      reportPersistOk();
    } catch (error) {
      // a full device: keep at least the queue (the copy can be pulled again, typed changes cannot)
      try {
        await kv.setItem(cacheKey(userId), small);
      } finally {
        reportPersistFailure(error as Error);
      }
    }
  }

  // one write at a time, and at most one waiting behind it (it takes the newest state)
  let running: Promise<void> = Promise.resolve();
  let queued = false;
  function flush(): Promise<void> {
    if (queued) return running;
    queued = true;
    running = running.then(() => {
      queued = false;
      return write();
    }).catch(() => undefined);
    return running;
  }
  let timer: ReturnType<typeof setTimeout> | null = null;
  const flushSoon = () => {
    if (timer) return;
    timer = setTimeout(() => {
      timer = null;
      void flush();
    }, 250);
  };

  async function restoreClient(): Promise<PersistedClient | undefined> {
    try {
      return await restore();
    } catch (error) {
      // never let a restore failure reach the provider: it would delete the stored queue
      reportCopyProblem(`What was saved on this device could not be read (${(error as Error).message}). Your unsent changes are kept where they are.`);
      return undefined;
    }
  }

  async function restore(): Promise<PersistedClient | undefined> {
    const [smallRaw, indexRaw] = await kv.getMany([cacheKey(userId), keys.index]).catch(() => [null, null]);
    const small = readSmall(smallRaw);
    let copy: Replica = EMPTY_REPLICA;
    if (small.legacyReplica) {
      // written by an earlier version as one blob: take it whole, the next save splits it
      copy = small.legacyReplica;
    } else if (indexRaw !== null) {
      copy = await readCopy(indexRaw);
    }
    if (Object.keys(copy.buildings).length || copy.lastSyncAt) {
      // dated long ago: the copy is shown at once and a pull is asked for as soon as it can run
      queryClient.setQueryData(REPLICA, copy, { updatedAt: 1 });
    }
    return small.client;
  }

  function readSmall(raw: string | null): { client?: PersistedClient; legacyReplica?: Replica } {
    if (raw === null) return {};
    try {
      const client = JSON.parse(raw) as PersistedClient;
      const queries = client.clientState.queries;
      const legacy = queries.find((q) => q.queryKey[0] === 'replica');
      const clientState = { ...client.clientState, queries: queries.filter((q) => q !== legacy) };
      return { client: { ...client, clientState }, legacyReplica: legacy?.state.data as Replica | undefined };
    } catch {
      // keep the bytes for support, and say so: the queue inside them cannot be resent
      void kv.setItem(`${cacheKey(userId)}:unreadable:${Date.now()}`, raw).catch(() => undefined);
      reportCopyProblem('The changes saved on this device could not be read after a reload. They are kept for support; anything not yet sent may need typing again.');
      return {};
    }
  }

  async function readCopy(indexRaw: string): Promise<Replica> {
    const index = parseIndex(indexRaw);
    if (!index.ok) {
      damaged.add(keys.index);
      reportCopyProblem(`The copy of your buildings saved on this device could not be read (${index.problem}). It will be downloaded again when there is a signal; your unsent changes are kept.`);
      return EMPTY_REPLICA;
    }
    const heads: Record<string, StoredHead> = {};
    const raws = await kv.getMany(index.value.buildingIds.map(keys.building));
    index.value.buildingIds.forEach((buildingId, i) => {
      const head = parseHead(raws[i]);
      if (head.ok && head.value.building.id === buildingId) heads[buildingId] = head.value;
      else void dropBuilding(buildingId, head.ok ? 'it belongs to another building' : head.problem);
    });
    // the panel this page opens is read now; every other panel after the first screen is up
    const first = panelOfPath(options.path ?? '');
    const firstBuilding = first ? buildingOfPanel(heads, first) : null;
    let firstCircuits: Circuit[] = [];
    if (first && firstBuilding) {
      const circuits = parsePanelCircuits(await kv.getItem(keys.panel(firstBuilding, first)));
      if (circuits.ok) firstCircuits = circuits.value;
      else {
        delete heads[firstBuilding];
        void dropBuilding(firstBuilding, circuits.problem);
      }
    }
    const buildings: Record<string, BuildingCopy> = {};
    for (const [buildingId, head] of Object.entries(heads)) {
      const isFirst = buildingId === firstBuilding;
      buildings[buildingId] = joinCopy(head, isFirst ? firstCircuits : []);
      const later = Object.keys(head.panels).filter((id) => !(isFirst && id === first));
      if (later.length) unloaded.set(buildingId, new Set(later));
      saved.heads.set(buildingId, head);
      saved.panels.set(buildingId, new Map(isFirst ? [[first!, firstCircuits]] : []));
    }
    saved.index = { buildingIds: Object.keys(buildings), lastSyncAt: index.value.lastSyncAt };
    if (Object.keys(buildings).length !== index.value.buildingIds.length) saved.index = null;
    const unloadedPanels = Object.fromEntries([...unloaded.values()].flatMap((ids) => [...ids].map((id) => [id, true as const])));
    return { buildings, lastSyncAt: index.value.lastSyncAt, ...(unloaded.size ? { unloadedPanels } : {}) };
  }

  async function dropBuilding(buildingId: string, problem: string) {
    (await kv.keysWithPrefix(keys.building(buildingId)).catch(() => [keys.building(buildingId)])).forEach((k) => damaged.add(k));
    reportCopyProblem(`A building's copy saved on this device could not be read (${problem}). It will be downloaded again when there is a signal; your unsent changes are kept.`);
  }

  async function loadRest(): Promise<void> {
    restored = true;
    try {
      await readRest();
    } catch (error) {
      // storage failed mid-way: the buildings still partly read are dropped from memory (never
      // saved half: their entries would lose the panels not read) and pulled again whole
      const partial = [...unloaded.keys()];
      queryClient.setQueryData<Replica>(REPLICA, (current) => {
        if (!current) return current;
        const buildings = Object.fromEntries(Object.entries(current.buildings).filter(([id]) => !partial.includes(id)));
        const { unloadedPanels: _gone, ...rest } = current;
        return { ...rest, buildings };
      });
      for (const buildingId of partial) await dropBuilding(buildingId, (error as Error).message);
    } finally {
      // whatever happened, the pull must not wait for ever
      unloaded.clear();
      markLoaded();
    }
  }

  async function readRest(): Promise<void> {
    const found = new Map<string, Circuit[]>();
    const bad = new Map<string, string>();
    for (const [buildingId, panelIds] of unloaded) {
      const ids = [...panelIds];
      const circuits: Circuit[] = [];
      for (let i = 0; i < ids.length && !bad.has(buildingId); i += PANELS_PER_READ) {
        const chunk = ids.slice(i, i + PANELS_PER_READ);
        const raws = await kv.getMany(chunk.map((id) => keys.panel(buildingId, id))).catch(() => chunk.map(() => '!'));
        raws.forEach((raw) => {
          const parsed = parsePanelCircuits(raw);
          if (parsed.ok) circuits.push(...parsed.value);
          else bad.set(buildingId, parsed.problem);
        });
        // give the screen its turn between reads: the phone stays responsive while a big building loads
        await new Promise((resolve) => setTimeout(resolve, 0));
      }
      found.set(buildingId, circuits);
    }
    for (const [buildingId, problem] of bad) await dropBuilding(buildingId, problem);
    queryClient.setQueryData<Replica>(REPLICA, (current) => {
      if (!current) return current;
      const buildings = { ...current.buildings };
      for (const [buildingId, circuits] of found) {
        if (!buildings[buildingId]) continue;
        if (bad.has(buildingId)) delete buildings[buildingId];
        else buildings[buildingId] = addCircuits(buildings[buildingId], circuits);
      }
      const { unloadedPanels: _done, ...rest } = { ...current, buildings };
      // the queued changes again, now that every row they touch is in memory (idempotent)
      return options.rebase(rest);
    });
    for (const [buildingId, circuits] of found) {
      if (bad.has(buildingId)) continue;
      const panels = saved.panels.get(buildingId) ?? new Map<string, Circuit[]>();
      for (const panelId of unloaded.get(buildingId) ?? []) panels.set(panelId, circuits.filter((c) => c.panelId === panelId));
      saved.panels.set(buildingId, panels);
    }
    unloaded.clear();
    markLoaded();
    flushSoon();
  }

  // a pull that landed is written at once, not after the coalescing delay: a reload a moment
  // later then opens on it instead of waiting for the next pull
  queryClient.getQueryCache().subscribe((event) => {
    if (event.type !== 'updated' || event.query.queryKey[0] !== REPLICA[0]) return;
    // a fetch that succeeded, not the restore's own setQueryData
    if (event.action.type === 'success' && !event.action.manual) void flush();
  });

  const persister: Persister = {
    // the provider calls this on every change of the cache: write a moment later, coalesced
    persistClient: async () => flushSoon(),
    restoreClient,
    // a changed schema version: this device's data is of another shape and is pulled again
    removeClient: async () => {
      const stored = await kv.keysWithPrefix(keys.prefix).catch(() => []);
      await kv.writeMany([], [...stored, cacheKey(userId)]);
    },
  };
  return { persister, flush, loadRest, loaded };
}

/** Did any part of a building's entry change (by identity: rows are replaced, never edited)? */
function changed(a: StoredHead, b: StoredHead): boolean {
  const ka = Object.keys(a) as (keyof StoredHead)[];
  const kb = Object.keys(b) as (keyof StoredHead)[];
  return ka.length !== kb.length || kb.some((k) => a[k] !== b[k]);
}

/** Everything of one user on this device (sign-out). */
export async function wipeDeviceCopy(userId: string): Promise<void> {
  const stored = await kv.keysWithPrefix(copyKeys(userId).prefix);
  await kv.writeMany([], [...stored, cacheKey(userId)]);
}
