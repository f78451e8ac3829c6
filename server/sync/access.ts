import { IsNull, type EntityManager } from 'typeorm';
import { roleForBuilding, type Actor } from '../auth/access';
import { Building, Panel } from '../entities';
import type { SyncColumns } from '../entities/sync-columns';
import { AppError, NotFoundError } from '../http/errors';
import type { WriteContext } from './context';

/**
 * Which rows a write may reach: a building the actor may see (another organisation's is not
 * found, never forbidden), the lock a write takes before it reads what it changes, and the
 * refusal of a child of a deleted parent.
 */

export const live = { deletedAt: IsNull() };

export async function visibleBuilding(em: EntityManager, actor: Actor, id: string) {
  const building = await em.findOne(Building, { where: { id, ...live } });
  const role = building && roleForBuilding(actor, building);
  if (!building || !role) throw new NotFoundError('Building');
  return { building, role };
}

export async function visiblePanel(em: EntityManager, actor: Actor, id: string) {
  const panel = await em.findOne(Panel, { where: { id, ...live } });
  if (!panel) throw new NotFoundError('Panel');
  try {
    return { panel, ...(await visibleBuilding(em, actor, panel.buildingId)) };
  } catch {
    throw new NotFoundError('Panel');
  }
}

/**
 * A building for a write, tombstoned or not (a sync edit of a deleted row is a conflict, not an
 * error). Not visible, or not the building the mutation names: not found.
 */
export async function writableBuilding(w: WriteContext, id: string, what: string) {
  const building = await w.em.findOne(Building, { where: { id } });
  const role = building && roleForBuilding(w.actor, building);
  if (!building || !role || (w.sync && w.sync.buildingId !== building.id)) throw new NotFoundError(what);
  return { building, role };
}

/**
 * Take the building's lock (bumping its version) and return a row read under it: rows read before
 * the lock may have changed meanwhile, rows read after cannot, since every writer takes it first.
 */
export async function lockAndReload<T extends SyncColumns>(
  w: WriteContext,
  buildingId: string,
  row: T,
  reload: () => Promise<T>,
): Promise<{ version: number; row: T }> {
  const fresh = w.versions.holds(buildingId);
  const version = await w.versions.of(buildingId);
  return { version, row: fresh ? row : await reload() };
}

export function parentDeleted(what: string): AppError {
  return new AppError(409, 'parent_deleted', `The ${what} was deleted; restore it first`);
}

