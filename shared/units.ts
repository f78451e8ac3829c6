/**
 * Temperatures on screen and in the report: stored in °C always, shown and typed in the user's
 * unit. Every temperature the app shows goes through {@link formatTemp}; every one typed comes
 * back through {@link parseTempInput}. The conversion itself is shared/calc/thermography.ts
 * (°F = °C × 9/5 + 32; a rise, being a difference, converts by 9/5 only — SI Brochure / NIST SP 811).
 */
import { toCelsius, type TemperatureUnit } from './calc/thermography';
import { finite } from './calc/guard';

export type { TemperatureUnit };
export const TEMPERATURE_UNITS: readonly TemperatureUnit[] = ['C', 'F'];
export const DEFAULT_TEMPERATURE_UNIT: TemperatureUnit = 'C';

/** An absolute temperature (a reading, the ambient) or a difference between two (a rise, ΔT). */
export type TempKind = 'absolute' | 'rise';

export function isTemperatureUnit(value: unknown): value is TemperatureUnit {
  return value === 'C' || value === 'F';
}

export function unitSymbol(unit: TemperatureUnit): string {
  return unit === 'C' ? '°C' : '°F';
}

/**
 * A °C value in the user's unit, unrounded (for a chart's scale).
 * @throws RangeError on a value that is not a finite number.
 */
export function fromCelsius(valueC: number, unit: TemperatureUnit, kind: TempKind): number {
  finite('temperature', valueC);
  if (unit === 'C') return valueC;
  return kind === 'absolute' ? (valueC * 9) / 5 + 32 : (valueC * 9) / 5;
}

/** One decimal at most, without a trailing ".0" (58, 136.4). */
function tidy(x: number): string {
  const r = Math.round(x * 10) / 10;
  return String(Object.is(r, -0) ? 0 : r);
}

/**
 * "58 °C", "136.4 °F"; a rise reads "22 °C" or "39.6 °F". Null or undefined (not recorded) gives
 * `missing`. NaN and ±Infinity are refused: a stored temperature is always a finite number.
 * @throws RangeError on a value that is not a finite number.
 */
export function formatTemp(valueC: number | null | undefined, unit: TemperatureUnit, kind: TempKind, missing = '?'): string {
  if (valueC === null || valueC === undefined) return missing;
  return `${tidy(fromCelsius(valueC, unit, kind))} ${unitSymbol(unit)}`;
}

/** A stored °C value as the text a form field shows in the user's unit ('' when not recorded). */
export function tempInputText(valueC: number | null | undefined, unit: TemperatureUnit, kind: TempKind): string {
  if (valueC === null || valueC === undefined) return '';
  return tidy(fromCelsius(valueC, unit, kind));
}

/**
 * What the user typed in their unit, as °C for storage: null for an empty field, NaN for text
 * that is not a number (the form's schema then names the field). When the text is exactly what
 * {@link tempInputText} shows for `previousC`, the stored value comes back unchanged, so opening
 * and saving a reading in °F does not move 58 °C to 57.99 °C by rounding.
 */
export function parseTempInput(text: string, unit: TemperatureUnit, kind: TempKind, previousC?: number | null): number | null {
  const t = text.trim().replace(/,/g, ''); // as numberOrNull: a comma is a thousands separator
  if (t === '') return null;
  if (previousC !== null && previousC !== undefined && Number.isFinite(previousC) && t === tempInputText(previousC, unit, kind)) {
    return previousC;
  }
  const n = Number(t);
  if (!Number.isFinite(n)) return Number.NaN;
  // a tenth of a degree is what the fields show: keep the stored value to that, not 57.99999
  return Math.round(toCelsius(n, unit, kind) * 1e6) / 1e6;
}
