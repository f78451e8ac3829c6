import type { EntityManager } from 'typeorm';
import type { Role } from '../../shared/domain';
import { Membership, OwnerGrant } from '../entities';
import { ForbiddenError } from '../http/errors';

/** Who is asking, with every organisation role and owner grant they hold. */
export interface Actor {
  userId: string;
  roles: Map<string, Role>;
  grants: Set<string>;
}

export async function loadActor(em: EntityManager, userId: string): Promise<Actor> {
  const [memberships, grants] = await Promise.all([
    em.find(Membership, { where: { userId } }),
    em.find(OwnerGrant, { where: { userId } }),
  ]);
  return {
    userId,
    roles: new Map(memberships.map((m) => [m.organisationId, m.role])),
    grants: new Set(grants.map((g) => g.buildingId)),
  };
}

/**
 * The role the actor holds for a building, or null when they may not see it at all: another
 * organisation's building, or an owner's building that was not granted to them.
 */
export function roleForBuilding(
  actor: Actor,
  building: { id: string; organisationId: string },
): Role | null {
  const role = actor.roles.get(building.organisationId);
  if (!role) return null;
  if (role === 'owner' && !actor.grants.has(building.id)) return null;
  return role;
}

const SCHEDULE_EDITORS: readonly Role[] = ['admin', 'electrician'];

/** Electricians and admins edit schedules; inspectors and owners read them. */
export function requireScheduleEditor(role: Role): void {
  if (SCHEDULE_EDITORS.includes(role)) return;
  throw new ForbiddenError(
    role === 'owner' ? 'Owners cannot edit schedules' : 'Inspectors read schedules but do not edit them',
  );
}

export function requireAdmin(role: Role, what: string): void {
  if (role !== 'admin') throw new ForbiddenError(`Only an admin can ${what}`);
}
