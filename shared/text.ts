/**
 * Rules for the text and dates every body of the API may carry (REST and sync share them through
 * shared/schemas.ts and shared/records.ts): a date must be a day of the calendar, and text holds
 * no control characters (PostgreSQL refuses NUL; the others corrupt printed reports and CSV) and
 * no lone UTF-16 surrogates (not Unicode: PostgreSQL refuses them too).
 */
import { z } from 'zod';

/** Days in a month of the proleptic Gregorian calendar (ISO 8601). */
function daysInMonth(year: number, month: number): number {
  if (month === 2) return year % 4 === 0 && (year % 100 !== 0 || year % 400 === 0) ? 29 : 28;
  return [4, 6, 9, 11].includes(month) ? 30 : 31;
}

/** `YYYY-MM-DD` naming a real day from 0001-01-01 to 9999-12-31 (`2026-02-31` is not one). */
export function isCalendarDate(value: string): boolean {
  const match = /^(\d{4})-(\d{2})-(\d{2})$/.exec(value);
  if (!match) return false;
  const [year, month, day] = match.slice(1).map(Number);
  return year >= 1 && month >= 1 && month <= 12 && day >= 1 && day <= daysInMonth(year, month);
}

// C0 controls, DEL and C1 controls; multi-line text keeps tab, line feed and carriage return
const CONTROL = /[\u0000-\u001f\u007f-\u009f]/;
const CONTROL_EXCEPT_LINES = /[\u0000-\u0008\u000b\u000c\u000e-\u001f\u007f-\u009f]/;
// with the u flag a paired surrogate is one code point; only a lone one is of category Cs
const LONE_SURROGATE = /\p{Cs}/u;

/** Why the text cannot be stored, or null when it can. */
export function textProblem(value: string, multiline: boolean): string | null {
  if (LONE_SURROGATE.test(value)) return 'contains a broken character (a lone surrogate)';
  if ((multiline ? CONTROL_EXCEPT_LINES : CONTROL).test(value)) {
    return multiline ? 'contains a control character' : 'contains a control character or a line break';
  }
  return null;
}

function cleanString(max: number, multiline: boolean) {
  return z
    .string({ error: 'must be text' })
    .superRefine((value, ctx) => {
      const problem = textProblem(value, multiline);
      if (problem) ctx.addIssue({ code: 'custom', message: problem });
    })
    .trim()
    .max(max, `at most ${max} characters`);
}

/** One line of text (a name, a tag, a label): no control characters, no line breaks. */
export const text = (max: number) => cleanString(max, false);
/** Text that may run over several lines (notes, descriptions): tab and line breaks allowed. */
export const longText = (max: number) => cleanString(max, true);
export const requiredText = (max: number, what: string) => text(max).min(1, `${what} is required`);
export const requiredLongText = (max: number, what: string) => longText(max).min(1, `${what} is required`);

/** A calendar date as `YYYY-MM-DD`. */
export const isoDate = z
  .string({ error: 'a date as YYYY-MM-DD' })
  .regex(/^\d{4}-\d{2}-\d{2}$/, 'a date as YYYY-MM-DD')
  .refine(isCalendarDate, 'not a day of the calendar');
