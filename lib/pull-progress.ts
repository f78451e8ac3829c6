/**
 * Progress of a first sync that arrives in several pages (a big building): "Loading Tower: 3 of
 * 9 parts". A tiny store outside the query cache, so the header can show it while the pull loop
 * (lib/sync.ts) is still running; nothing here is persisted.
 */
import { useSyncExternalStore } from 'react';

export interface BuildingPullProgress {
  buildingId: string;
  name: string;
  /** pages of this building received so far in this pull */
  part: number;
  /** pages expected in all: the ones received and, at their average size, the rows still to come */
  parts: number;
}

/** One building's count so far: pages and rows received. */
export interface PagesSoFar {
  pages: number;
  rows: number;
}

/**
 * Parts expected for a building: the pages received, plus the rows the server says remain at
 * the average rows per page so far (so a page cut by bytes, with fewer rows, does not skew it).
 */
export function estimateParts(soFar: PagesSoFar, remaining: number): number {
  if (remaining <= 0) return soFar.pages;
  const perPage = Math.max(1, soFar.rows / Math.max(1, soFar.pages));
  return soFar.pages + Math.ceil(remaining / perPage);
}

export function describePullProgress(p: BuildingPullProgress): string {
  return `Loading ${p.name}: ${p.part} of ${p.parts} parts`;
}

let current: readonly BuildingPullProgress[] = [];
const listeners = new Set<() => void>();

export function setPullProgress(next: readonly BuildingPullProgress[]): void {
  current = next;
  for (const listener of listeners) listener();
}

export function getPullProgress(): readonly BuildingPullProgress[] {
  return current;
}

function subscribe(listener: () => void): () => void {
  listeners.add(listener);
  return () => listeners.delete(listener);
}

/** The buildings still arriving in parts; empty when no multi-page pull is running. */
export function usePullProgress(): readonly BuildingPullProgress[] {
  return useSyncExternalStore(subscribe, getPullProgress, getPullProgress);
}
