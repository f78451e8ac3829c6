/**
 * NFPA 70B (2023) condition-based maintenance intervals and due dates.
 *
 * Source: NFPA 70B, 2023 edition — equipment condition is the worst of physical condition,
 * criticality and operating environment (1 good, 2 fair, 3 poor). Panelboards: condition 1 → 60
 * months (seen in the published text); condition 2 → 36, condition 3 → 12 (from memory).
 * Thermographic survey at least every 12 months, every 6 months in condition 3.
 */
import { EQUIPMENT_CONDITIONS, PANEL_KINDS } from '../domain';
import type { EquipmentCondition, PanelKind } from '../domain';
import { oneOf } from './guard';

export type MaintenanceTask = 'thermography' | 'maintenance';
/** Equipment kinds we schedule; a load centre is a panelboard for NFPA 70B purposes. */
export type MaintainedEquipment = PanelKind;

export interface NextDueInput {
  equipment: MaintainedEquipment;
  condition: EquipmentCondition;
  task: MaintenanceTask;
  /** 'YYYY-MM-DD' */
  lastDoneOn: string;
}

export interface NextDue {
  /** 'YYYY-MM-DD' */
  dueOn: string;
  intervalMonths: number;
  /** where the interval comes from, in words */
  basis: string;
  /** false when the interval is from memory and should be confirmed in the standard */
  verified: boolean;
}

const PANELBOARD_MONTHS: Record<EquipmentCondition, { months: number; verified: boolean }> = {
  1: { months: 60, verified: true },
  2: { months: 36, verified: false },
  3: { months: 12, verified: false },
};

/**
 * The maximum maintenance interval, months, for a task on equipment in a condition, NFPA 70B 2023;
 * null where we have no figure on file (switchboard maintenance intervals).
 * @throws RangeError on a condition other than 1, 2 or 3 (NFPA 70B has no other), an unknown
 * equipment kind or task.
 */
export function maintenanceIntervalMonths(
  equipment: MaintainedEquipment,
  condition: EquipmentCondition,
  task: MaintenanceTask,
): { months: number; basis: string; verified: boolean } | null {
  oneOf('NFPA 70B condition', condition, EQUIPMENT_CONDITIONS);
  oneOf('equipment', equipment, PANEL_KINDS);
  oneOf('task', task, ['thermography', 'maintenance'] as const);
  if (task === 'thermography') {
    const months = condition === 3 ? 6 : 12;
    return {
      months,
      basis: `NFPA 70B 2023: thermographic survey at least every ${months} months` +
        (condition === 3 ? ' for equipment in condition 3' : ''),
      verified: true,
    };
  }
  if (equipment === 'switchboard') return null;
  const { months, verified } = PANELBOARD_MONTHS[condition];
  return {
    months,
    basis: `NFPA 70B 2023, panelboards in condition ${condition}: every ${months} months` +
      (verified ? '' : ' (from memory: confirm in the standard)'),
    verified,
  };
}

/**
 * Next due date: lastDoneOn + the NFPA 70B 2023 interval ({@link maintenanceIntervalMonths}).
 * Calendar months in UTC; a day past the end of the target month is clamped to its last day
 * (Jan 31 + 1 month → Feb 28, or Feb 29 in a leap year). Null where no interval is on file
 * (maintenance of switchboards: take it from the standard's table and schedule by hand).
 * @throws RangeError when lastDoneOn is not a real 'YYYY-MM-DD' date, or as maintenanceIntervalMonths.
 */
export function nextDueDate({ equipment, condition, task, lastDoneOn }: NextDueInput): NextDue | null {
  const interval = maintenanceIntervalMonths(equipment, condition, task);
  if (interval === null) return null;
  return {
    dueOn: addMonthsUTC(lastDoneOn, interval.months),
    intervalMonths: interval.months,
    basis: interval.basis,
    verified: interval.verified,
  };
}

/**
 * Adds whole calendar months to a 'YYYY-MM-DD' date (proleptic Gregorian calendar, as ISO 8601 and
 * JavaScript's Date use it) in UTC, clamping to the end of the month.
 * @throws RangeError when the date is not a real calendar date or months is not a whole number.
 */
export function addMonthsUTC(date: string, months: number): string {
  const match = /^(\d{4})-(\d{2})-(\d{2})$/.exec(date);
  if (match === null) throw new RangeError(`expected a YYYY-MM-DD date, got "${date}"`);
  if (!Number.isInteger(months)) throw new RangeError(`months must be whole, got ${months}`);
  const year = Number(match[1]);
  const month = Number(match[2]) - 1;
  const day = Number(match[3]);
  if (month < 0 || month > 11 || day < 1 || day > daysInMonthUTC(year, month)) {
    throw new RangeError(`"${date}" is not a calendar date`);
  }
  const total = year * 12 + month + months;
  const newYear = Math.floor(total / 12);
  const newMonth = total - newYear * 12;
  const newDay = Math.min(day, daysInMonthUTC(newYear, newMonth));
  return `${String(newYear).padStart(4, '0')}-${String(newMonth + 1).padStart(2, '0')}-${String(newDay).padStart(2, '0')}`;
}

/** month is 0-based */
function daysInMonthUTC(year: number, month: number): number {
  // day 0 of the next month is the last day of this one
  const d = new Date(Date.UTC(2000, month + 1, 0));
  d.setUTCFullYear(year, month + 1, 0);
  return d.getUTCDate();
}
