/**
 * Who may do what: the one table of role × action × record state, read by the server's guards
 * (server/auth/access.ts, server/sync/kinds) and by the screens' `can…` helpers, so a rule is
 * changed in one place. The server enforces it on every write; a screen uses it only to offer
 * what will be accepted.
 */
import type { Role } from './domain';

export const ACTIONS = [
  'building.create',
  'building.edit',
  'building.delete',
  'building.restore',
  /** panels, circuits, CSV import and conflict resolution: the schedule itself */
  'schedule.edit',
  /** inspections, readings, recorded trips and photos: create, change, delete */
  'inspection.record',
  'inspection.sign',
  /** any change of a deficiency at all (each changed field then needs its own action below) */
  'deficiency.write',
  'deficiency.raise',
  'deficiency.edit',
  'deficiency.reprioritise',
  'deficiency.assign',
  'deficiency.schedule',
  'deficiency.repair',
  'deficiency.verify',
  'deficiency.reopen',
  'deficiency.defer',
  'deficiency.undefer',
  'deficiency.accept',
  /** a deficiency raised by mistake: the raisers' call */
  'deficiency.delete',
  'comment.add',
  /** the organisation's time-current band library */
  'band.edit',
  'settings.edit',
  /** members, roles, invitations and owner grants of an organisation */
  'people.manage',
  /** e-mail an inspection report to the building's owners */
  'report.send',
  /** a panel's arc-flash label (the study's figures): kept with the schedule */
  'arc-flash.edit',
] as const;
export type Action = (typeof ACTIONS)[number];

const EVERYONE: readonly Role[] = ['admin', 'electrician', 'inspector', 'owner'];
const SCHEDULE: readonly Role[] = ['admin', 'electrician'];
const FIELD_WORKERS: readonly Role[] = ['admin', 'electrician', 'inspector'];
const RAISERS: readonly Role[] = ['admin', 'inspector'];

const WHO: Record<Action, readonly Role[]> = {
  'building.create': SCHEDULE,
  'building.edit': SCHEDULE,
  'building.delete': ['admin'],
  'building.restore': ['admin'],
  'schedule.edit': SCHEDULE,
  'inspection.record': FIELD_WORKERS,
  'inspection.sign': RAISERS,
  'deficiency.write': EVERYONE,
  'deficiency.raise': RAISERS,
  'deficiency.edit': RAISERS,
  'deficiency.reprioritise': RAISERS,
  'deficiency.assign': ['admin', 'inspector', 'electrician'],
  'deficiency.schedule': ['admin', 'inspector', 'electrician'],
  'deficiency.repair': ['admin', 'electrician'],
  'deficiency.verify': RAISERS,
  'deficiency.reopen': RAISERS,
  'deficiency.defer': ['owner', 'admin'],
  'deficiency.undefer': ['owner', 'admin'],
  'deficiency.accept': ['owner'],
  'deficiency.delete': RAISERS,
  'comment.add': EVERYONE,
  'band.edit': FIELD_WORKERS,
  'settings.edit': ['admin'],
  'people.manage': ['admin'],
  'report.send': RAISERS,
  'arc-flash.edit': SCHEDULE,
};

/** What a rule may depend on besides the role. */
export interface RecordState {
  /** the inspection the record belongs to is signed off (frozen) */
  signed?: boolean;
}

/** Actions a signature freezes, whoever asks: a signed inspection takes no more records. */
const FROZEN_WHEN_SIGNED: ReadonlySet<Action> = new Set<Action>(['inspection.record', 'inspection.sign']);

/** May this role do this, to a record in this state? No role (not a member): never. */
export function can(role: Role | null | undefined, action: Action, state: RecordState = {}): boolean {
  if (!role || !WHO[action].includes(role)) return false;
  if (state.signed && FROZEN_WHEN_SIGNED.has(action)) return false;
  return true;
}

/** The roles that may do an action (for messages and lists). */
export function rolesFor(action: Action): readonly Role[] {
  return WHO[action];
}

/** "Owners cannot record a reading": the usual refusal, in the plural of the role. */
export function cannotText(role: Role, what: string): string {
  return `${role[0].toUpperCase()}${role.slice(1)}s cannot ${what}`;
}
