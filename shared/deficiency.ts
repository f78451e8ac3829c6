/**
 * The deficiency workflow: who may do what, which status may follow which, and when a repair is
 * due. The server enforces it on every write; the screens use it to offer only what is allowed.
 *
 * open → scheduled → repaired → verified, or deferred by the owner (with a reason and a review
 * date). Inspectors and admins raise and verify (or reopen a repair that did not hold);
 * electricians and admins mark repaired with evidence (a photo or a note); owners defer or accept
 * the repair plan. Anyone who may see the building may comment.
 */
import type { Role } from './domain';
import { can, cannotText } from './permissions';
import { DEFAULT_DUE_DAYS, type DeficiencyFields, type DeficiencyStatus, type Priority } from './records';

export type DeficiencyAction =
  | 'raise'
  | 'edit'
  | 'reprioritise'
  | 'assign'
  | 'schedule'
  | 'repair'
  | 'verify'
  | 'reopen'
  | 'defer'
  | 'undefer'
  | 'accept';

const ACTION_WORDS: Record<DeficiencyAction, string> = {
  raise: 'raise deficiencies',
  edit: 'edit a deficiency',
  reprioritise: 'change a priority or due date',
  assign: 'assign a deficiency',
  schedule: 'schedule a repair',
  repair: 'mark a repair done',
  verify: 'verify a repair',
  reopen: 'reopen a deficiency',
  defer: 'defer a repair',
  undefer: 'take a deferral back',
  accept: 'accept a repair plan',
};

/** Who may take each step: the shared permission table (shared/permissions.ts). */
export function may(role: Role, action: DeficiencyAction): boolean {
  return can(role, `deficiency.${action}`);
}

/** "Owners cannot verify a repair" */
export function cannot(role: Role, action: DeficiencyAction): string {
  return cannotText(role, ACTION_WORDS[action]);
}

const STATUS_WORD: Record<DeficiencyStatus, string> = {
  open: 'An open deficiency',
  scheduled: 'A scheduled deficiency',
  repaired: 'A repaired deficiency',
  verified: 'A verified deficiency',
  deferred: 'A deferred deficiency',
};

/** The allowed status changes and the action each is. */
const TRANSITIONS: Record<DeficiencyStatus, Partial<Record<DeficiencyStatus, DeficiencyAction>>> = {
  open: { scheduled: 'schedule', repaired: 'repair', deferred: 'defer' },
  scheduled: { open: 'schedule', repaired: 'repair', deferred: 'defer' },
  repaired: { verified: 'verify', open: 'reopen' },
  verified: { open: 'reopen' },
  deferred: { open: 'undefer' },
};

/** Status changes this role may make from this status, with the action's name. */
export function nextStatuses(role: Role, from: DeficiencyStatus): { to: DeficiencyStatus; action: DeficiencyAction }[] {
  return Object.entries(TRANSITIONS[from])
    .filter(([, action]) => may(role, action))
    .map(([to, action]) => ({ to: to as DeficiencyStatus, action }));
}

/** The field a patch changes → the action it needs (status is judged by its transition). */
const FIELD_ACTION: Partial<Record<keyof DeficiencyFields, DeficiencyAction>> = {
  title: 'edit',
  description: 'edit',
  circuitId: 'edit',
  priority: 'reprioritise',
  priorityReason: 'reprioritise',
  dueOn: 'reprioritise',
  assigneeId: 'assign',
  repairNote: 'repair',
  deferReason: 'defer',
  reviewOn: 'defer',
  acceptedAt: 'accept',
};

export interface ChangeCheck {
  /** the role may not make this change: why (the whole change is refused) */
  forbidden: string | null;
  /** field → what is missing or wrong */
  fields: Record<string, string>;
}

/**
 * Check a change of a deficiency by a role: `before` as stored, `after` with the change merged in,
 * `changed` the fields the change sets. `repairPhotos` counts the deficiency's repair photos.
 */
export function checkDeficiencyChange(input: {
  role: Role;
  before: DeficiencyFields;
  after: DeficiencyFields;
  changed: readonly string[];
  repairPhotos: number;
}): ChangeCheck {
  const { role, before, after, changed } = input;
  const fields: Record<string, string> = {};
  const refuse = (action: DeficiencyAction) => ({ forbidden: cannot(role, action), fields });
  const was: Record<string, unknown> = before;
  const now: Record<string, unknown> = after;
  for (const field of changed) {
    if (field === 'status' || was[field] === now[field]) continue;
    const action = FIELD_ACTION[field as keyof DeficiencyFields];
    if (action && !may(role, action)) return refuse(action);
  }
  if (changed.includes('status') && after.status !== before.status) {
    const action = TRANSITIONS[before.status][after.status];
    if (!action) {
      fields.status = `${STATUS_WORD[before.status]} cannot become ${after.status}`;
      return { forbidden: null, fields };
    }
    if (!may(role, action)) return refuse(action);
    if (after.status === 'repaired' && !after.repairNote.trim() && input.repairPhotos === 0) {
      fields.repairNote = 'say what was done, or add a photo of the repair';
    }
    if (after.status === 'deferred') {
      if (!after.deferReason.trim()) fields.deferReason = 'say why the repair is deferred';
      if (!after.reviewOn) fields.reviewOn = 'choose when to look at it again';
    }
  }
  if (changed.includes('priority') && after.priority !== before.priority && !after.priorityReason.trim()) {
    fields.priorityReason = 'say why the priority changes';
  }
  return { forbidden: null, fields };
}

/** The raise-time rules: who may raise, and that a raised deficiency starts open. */
export function checkDeficiencyRaise(role: Role): string | null {
  return may(role, 'raise') ? null : cannot(role, 'raise');
}

/** Days to repair by priority, from the organisation's settings (defaults 0/30/90/365 [CP]: P1 is due the day raised). */
export function dueOnFor(priority: Priority, raisedOn: string, dueDays: Record<Priority, number> = DEFAULT_DUE_DAYS): string {
  const date = new Date(`${raisedOn}T00:00:00Z`);
  date.setUTCDate(date.getUTCDate() + dueDays[priority]);
  return date.toISOString().slice(0, 10);
}

/** Today as YYYY-MM-DD, UTC. */
export function todayISO(now = new Date()): string {
  return now.toISOString().slice(0, 10);
}

/** Open means someone still has to act: open, scheduled or repaired-but-not-verified. */
export function isOutstanding(status: DeficiencyStatus): boolean {
  return status === 'open' || status === 'scheduled' || status === 'repaired';
}
