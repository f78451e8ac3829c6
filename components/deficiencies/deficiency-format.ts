/**
 * How deficiencies read on screen: due dates in words, where a finding is, and the history's
 * field changes in plain words. Pure functions, shared by the Findings list, the deficiency screen
 * and the circuit's record.
 */
import { directoryText } from '@/components/register/circuit-format';
import type { BuildingView } from '@/hooks/building-view';
import { PRIORITY_LABELS, STATUS_LABELS, type Deficiency, type DeficiencyStatus, type Priority } from '@/shared/records';
import { isOutstanding } from '@/shared/deficiency';

const DAY_MS = 86_400_000;

/** Whole days from `from` to `to` (both YYYY-MM-DD). */
export function daysBetween(from: string, to: string): number {
  return Math.round((Date.parse(`${to}T00:00:00Z`) - Date.parse(`${from}T00:00:00Z`)) / DAY_MS);
}

const plural = (n: number, word: string) => `${n} ${word}${n === 1 ? '' : 's'}`;

/** "overdue by 3 days", "due today", "due in 12 days" (relative to `today`, YYYY-MM-DD). */
export function dueWords(dueOn: string, today: string): string {
  const days = daysBetween(today, dueOn);
  if (days < 0) return `overdue by ${plural(-days, 'day')}`;
  if (days === 0) return 'due today';
  if (days === 1) return 'due tomorrow';
  return `due in ${plural(days, 'day')}`;
}

/** The due line of a deficiency: overdue only matters while someone still has to act. */
export function dueLine(d: Pick<Deficiency, 'dueOn' | 'status' | 'reviewOn'>, today: string): { text: string; overdue: boolean } {
  if (d.status === 'verified') return { text: `was due ${dateWords(d.dueOn)}`, overdue: false };
  if (d.status === 'deferred') {
    return { text: d.reviewOn ? `deferred: look again ${dateWords(d.reviewOn)}` : 'deferred', overdue: false };
  }
  const overdue = isOutstanding(d.status) && daysBetween(today, d.dueOn) < 0;
  return { text: `${dueWords(d.dueOn, today)} (${dateWords(d.dueOn)})`, overdue };
}

const MONTHS = ['Jan', 'Feb', 'Mar', 'Apr', 'May', 'Jun', 'Jul', 'Aug', 'Sep', 'Oct', 'Nov', 'Dec'];

/** "12 Mar 2026" for a YYYY-MM-DD date (no time zone games: the date as written). */
export function dateWords(iso: string): string {
  const [y, m, d] = iso.slice(0, 10).split('-').map(Number);
  if (!y || !m || !d) return iso;
  return `${d} ${MONTHS[m - 1]} ${y}`;
}

/** "12 Mar 2026, 14:05" in the device's time zone, for an ISO date-time. */
export function dateTimeWords(iso: string): string {
  const at = new Date(iso);
  if (Number.isNaN(at.getTime())) return iso;
  const pad = (n: number) => String(n).padStart(2, '0');
  return `${at.getDate()} ${MONTHS[at.getMonth()]} ${at.getFullYear()}, ${pad(at.getHours())}:${pad(at.getMinutes())}`;
}

/** Where a deficiency is: building · panel tag · circuit position and description. */
export function whereParts(view: BuildingView, d: Pick<Deficiency, 'panelId' | 'circuitId'>): {
  building: string;
  panel: string | null;
  circuit: string | null;
} {
  const panel = d.panelId ? view.panel(d.panelId) : undefined;
  const circuit = d.circuitId ? view.circuit(d.circuitId) : undefined;
  return {
    building: view.building.name,
    panel: panel ? `Panel ${panel.tag}` : d.panelId ? 'a deleted panel' : null,
    circuit: circuit ? `circuit ${circuit.position}, ${directoryText(circuit)}` : d.circuitId ? 'a deleted circuit' : null,
  };
}

export function whereText(view: BuildingView, d: Pick<Deficiency, 'panelId' | 'circuitId'>): string {
  const w = whereParts(view, d);
  return [w.building, w.panel, w.circuit].filter(Boolean).join(' · ');
}

/** A person of the organisation by id; '' names (rows the server has not answered yet) are "you". */
export function personName(people: readonly { id: string; name: string }[], id: string | null, me: string | null): string {
  if (!id) return 'nobody';
  if (id === me) return 'you';
  return people.find((p) => p.id === id)?.name ?? 'someone no longer in the organisation';
}

/** The author of a row: the name the server gave, else "you" (made here, not answered yet). */
export function authorName(name: string, userId: string | null, me: string | null): string {
  if (userId && userId === me) return 'you';
  return name || 'you';
}

/** Field names in the words of the history. */
export const FIELD_WORDS: Record<string, string> = {
  title: 'title',
  description: 'description',
  panelId: 'panel',
  circuitId: 'circuit',
  priority: 'priority',
  priorityReason: 'reason for the priority',
  dueOn: 'due',
  status: 'status',
  assigneeId: 'assigned to',
  repairNote: 'repair note',
  deferReason: 'reason to defer',
  reviewOn: 'look again on',
  acceptedAt: 'repair plan accepted',
};

const clip = (s: string, n = 120) => (s.length > n ? `${s.slice(0, n - 1)}…` : s);

/** A stored value of a field in words (statuses and priorities by their labels). */
export function valueWords(
  field: string,
  value: unknown,
  ctx: { view: BuildingView; people: readonly { id: string; name: string }[]; me: string | null },
): string {
  if (value === null || value === undefined || value === '') return 'none';
  switch (field) {
    case 'status':
      return STATUS_LABELS[value as DeficiencyStatus] ?? String(value);
    case 'priority':
      return PRIORITY_LABELS[value as Priority] ?? String(value);
    case 'assigneeId':
      return personName(ctx.people, value as string, ctx.me);
    case 'circuitId': {
      const c = ctx.view.circuit(value as string);
      return c ? `circuit ${c.position}, ${directoryText(c)}` : 'a deleted circuit';
    }
    case 'panelId': {
      const p = ctx.view.panel(value as string);
      return p ? `panel ${p.tag}` : 'a deleted panel';
    }
    case 'dueOn':
    case 'reviewOn':
      return dateWords(String(value));
    case 'acceptedAt':
      return dateTimeWords(String(value));
    default:
      return typeof value === 'string' ? `“${clip(value)}”` : String(value);
  }
}

/** The lines of one recorded change: "status: Open → Repaired". */
export function changeLines(
  changes: Record<string, [unknown, unknown]>,
  ctx: Parameters<typeof valueWords>[2],
): string[] {
  return Object.entries(changes).map(([field, [before, after]]) => {
    const name = FIELD_WORDS[field] ?? field;
    if (field === 'acceptedAt') return after ? 'accepted the repair plan' : 'took back the acceptance of the repair plan';
    return `${name}: ${valueWords(field, before, ctx)} → ${valueWords(field, after, ctx)}`;
  });
}

/** "YYYY-MM-DD" → whether it is a real calendar date. */
export function isRealDate(iso: string): boolean {
  if (!/^\d{4}-\d{2}-\d{2}$/.test(iso)) return false;
  const at = new Date(`${iso}T00:00:00Z`);
  return !Number.isNaN(at.getTime()) && at.toISOString().slice(0, 10) === iso;
}
