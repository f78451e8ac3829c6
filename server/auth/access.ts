import type { EntityManager } from 'typeorm';
import type { Role } from '../../shared/domain';
import { can, type Action } from '../../shared/permissions';
import { queryPrepared } from '../db-prepared';
import { ForbiddenError } from '../http/errors';

/** Who is asking, with every organisation role and owner grant they hold. */
export interface Actor {
  userId: string;
  roles: Map<string, Role>;
  grants: Set<string>;
}

/** What the actor statement answers: organisation roles (role set) and owner grants (role null). */
export interface ActorRow {
  id: string;
  role: Role | null;
}

/** The roles and grants of the user `userId` (an SQL expression), from memberships and owner grants. */
export function actorRowsSql(userId: string): string {
  return `SELECT organisation_id AS id, role FROM membership WHERE user_id = ${userId}
     UNION ALL SELECT building_id AS id, NULL AS role FROM owner_grant WHERE user_id = ${userId}`;
}
const ACTOR_ROWS_SQL = actorRowsSql('$1');

export function actorFrom(userId: string, rows: readonly ActorRow[]): Actor {
  return {
    userId,
    roles: new Map(rows.filter((r) => r.role !== null).map((r) => [r.id, r.role as Role])),
    grants: new Set(rows.filter((r) => r.role === null).map((r) => r.id)),
  };
}

/**
 * Loaded on every signed-in request (usually with the session itself, server/auth/session.ts), so
 * one plain statement: roles and owner grants as rows of one union.
 */
export async function loadActor(em: EntityManager, userId: string): Promise<Actor> {
  // planned once per connection
  return actorFrom(userId, await queryPrepared<ActorRow>(em, 'actor', ACTOR_ROWS_SQL, [userId]));
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

/**
 * Electricians and admins edit schedules; inspectors and owners read them (shared/permissions.ts
 * `schedule.edit`, and `building.create` / `building.edit`, which the same roles hold).
 */
export function requireScheduleEditor(role: Role, action: Action = 'schedule.edit'): void {
  if (can(role, action)) return;
  throw new ForbiddenError(
    role === 'owner' ? 'Owners cannot edit schedules' : 'Inspectors read schedules but do not edit them',
  );
}

/** An action only admins hold (a building's delete and restore): "Only an admin can …". */
export function requireAdmin(role: Role, action: Action, what: string): void {
  if (!can(role, action)) throw new ForbiddenError(`Only an admin can ${what}`);
}
