/**
 * The maintenance due list: for each panel, its next thermographic survey and its next
 * maintenance, from its NFPA 70B (2023) condition and the last inspection of that kind on record
 * ({@link nextDueDate} in shared/calc/maintenance.ts holds the intervals and their sources).
 *
 * - Thermography is due from the last thermal-survey or full-maintenance inspection covering the
 *   panel (signed or not: the work was done on that day).
 * - Maintenance is due from the last full-maintenance inspection.
 * - With no inspection of that kind on record the task is due now; the words name the kind that is
 *   missing ("no full maintenance on record") when the panel has other inspections, so a panel
 *   with a survey and a torque audit never reads as uninspected.
 * - Deleted inspections do not count.
 */
import { maintenanceIntervalMonths, nextDueDate, type MaintenanceTask } from './calc/maintenance';
import type { EquipmentCondition, PanelKind } from './domain';
import type { InspectionKind } from './records';

export interface DuePanel {
  id: string;
  buildingId: string;
  tag: string;
  kind: PanelKind;
  condition: EquipmentCondition;
  deletedAt?: string | null;
}

export interface DueInspection {
  id: string;
  kind: InspectionKind;
  panelIds: readonly string[];
  /** 'YYYY-MM-DD' */
  performedOn: string;
  deletedAt?: string | null;
}

export type DueState = 'overdue' | 'never' | 'soon' | 'later' | 'no-interval';

export interface DueItem {
  panelId: string;
  buildingId: string;
  tag: string;
  task: MaintenanceTask;
  condition: EquipmentCondition;
  /** the inspection the due date counts from; null when none is on record */
  lastInspectionId: string | null;
  lastDoneOn: string | null;
  /** the latest inspection of any kind covering the panel (what the user remembers was done) */
  lastInspection: { kind: InspectionKind; performedOn: string } | null;
  /** null when never inspected (due now) or when no interval is on file */
  dueOn: string | null;
  /** days from today to dueOn (negative = overdue); 0 when never inspected */
  daysLeft: number | null;
  intervalMonths: number | null;
  state: DueState;
  /** where the interval comes from, or why there is none */
  basis: string;
  /** false when the interval is from memory (NFPA 70B figures to confirm) */
  verified: boolean;
}

/** Due within this many days counts as "due soon". */
export const DUE_SOON_DAYS = 30;

const KINDS_FOR: Record<MaintenanceTask, readonly InspectionKind[]> = {
  thermography: ['thermal-survey', 'full-maintenance'],
  maintenance: ['full-maintenance'],
};

const TASKS: readonly MaintenanceTask[] = ['thermography', 'maintenance'];

/** What a task counts from, in words: "no full maintenance on record". */
const COUNTS_FROM: Record<MaintenanceTask, string> = {
  thermography: 'thermal survey or full maintenance',
  maintenance: 'full maintenance',
};

const latest = (list: readonly DueInspection[]) =>
  [...list].sort((a, b) => b.performedOn.localeCompare(a.performedOn) || b.id.localeCompare(a.id))[0];

function daysBetween(from: string, to: string): number {
  return Math.round((Date.parse(`${to}T00:00:00Z`) - Date.parse(`${from}T00:00:00Z`)) / 86_400_000);
}

const STATE_ORDER: Record<DueState, number> = { overdue: 0, never: 1, soon: 2, later: 3, 'no-interval': 4 };

/** Most urgent first: overdue (longest overdue first), never inspected, due soon, later, no interval. */
export function byDue(a: DueItem, b: DueItem): number {
  return (
    STATE_ORDER[a.state] - STATE_ORDER[b.state] ||
    (a.daysLeft ?? 0) - (b.daysLeft ?? 0) ||
    a.tag.localeCompare(b.tag, undefined, { numeric: true }) ||
    a.task.localeCompare(b.task)
  );
}

/**
 * Every panel's two tasks with their due dates, most urgent first. `today` is 'YYYY-MM-DD'.
 */
export function maintenanceDue(
  panels: readonly DuePanel[],
  inspections: readonly DueInspection[],
  today: string,
): DueItem[] {
  const live = inspections.filter((i) => !i.deletedAt);
  const items: DueItem[] = [];
  for (const panel of panels) {
    if (panel.deletedAt) continue;
    const covering = live.filter((i) => i.panelIds.includes(panel.id));
    const any = latest(covering);
    const lastInspection = any ? { kind: any.kind, performedOn: any.performedOn } : null;
    for (const task of TASKS) {
      const last = latest(covering.filter((i) => KINDS_FOR[task].includes(i.kind)));
      const base = { panelId: panel.id, buildingId: panel.buildingId, tag: panel.tag, task, condition: panel.condition, lastInspection };
      if (!last) {
        const interval = maintenanceIntervalMonths(panel.kind, panel.condition, task);
        items.push({
          ...base,
          lastInspectionId: null,
          lastDoneOn: null,
          dueOn: null,
          daysLeft: 0,
          intervalMonths: interval?.months ?? null,
          state: 'never',
          basis: `once done, ${interval ? interval.basis : 'no interval on file for this equipment'}`,
          verified: interval?.verified ?? false,
        });
        continue;
      }
      const next = nextDueDate({ equipment: panel.kind, condition: panel.condition, task, lastDoneOn: last.performedOn });
      if (!next) {
        items.push({
          ...base,
          lastInspectionId: last.id,
          lastDoneOn: last.performedOn,
          dueOn: null,
          daysLeft: null,
          intervalMonths: null,
          state: 'no-interval',
          basis: 'no NFPA 70B interval on file for this equipment: schedule it from the standard’s table',
          verified: false,
        });
        continue;
      }
      const daysLeft = daysBetween(today, next.dueOn);
      items.push({
        ...base,
        lastInspectionId: last.id,
        lastDoneOn: last.performedOn,
        dueOn: next.dueOn,
        daysLeft,
        intervalMonths: next.intervalMonths,
        state: daysLeft < 0 ? 'overdue' : daysLeft <= DUE_SOON_DAYS ? 'soon' : 'later',
        basis: next.basis,
        verified: next.verified,
      });
    }
  }
  return items.sort(byDue);
}

/** Overdue, never inspected, or due within {@link DUE_SOON_DAYS} days. */
export function isDue(item: DueItem): boolean {
  return item.state === 'overdue' || item.state === 'never' || item.state === 'soon';
}

export const TASK_LABELS: Record<MaintenanceTask, string> = {
  thermography: 'Thermal survey',
  maintenance: 'Maintenance',
};

/** "overdue by 12 days", "due in 5 days", "due today", "no full maintenance on record — due now" */
export function dueWords(item: DueItem): string {
  switch (item.state) {
    case 'never':
      return item.lastInspection
        ? `no ${COUNTS_FROM[item.task]} on record — due now`
        : 'no inspection on record — due now';
    case 'no-interval':
      return 'no interval on file';
    default: {
      const d = item.daysLeft ?? 0;
      if (d < 0) return `overdue by ${-d} day${d === -1 ? '' : 's'}`;
      if (d === 0) return 'due today';
      return `due in ${d} day${d === 1 ? '' : 's'}`;
    }
  }
}
