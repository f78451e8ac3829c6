/**
 * What a thermographer records beyond the rise: the component's own temperature against what its
 * insulation or termination is rated for, the same spot's rise across surveys, and °F display.
 *
 * Sources: NEC 110.14(C) and Table 310.16 column headings (conductor insulation and terminations are
 * rated 60, 75 or 90 °C) [V]; NFPA 70B 2023 equipment condition 2 — results that deviate from earlier
 * ones [V]; the trend threshold below is our own rule [CP]; °F = °C × 9/5 + 32 (SI Brochure /
 * NIST SP 811) [V].
 */
import { finite, positive } from './guard';

export interface ComponentTempCheck {
  /** the component is hotter than the rating */
  over: boolean;
  /** rating − component temperature, °C (negative when over) */
  marginC: number;
  message: string;
}

/**
 * A component's absolute temperature against its rating (the insulation's or the termination's,
 * whichever is lower). At or above the rating the conductor insulation or the termination is
 * being aged past what it is listed for.
 * @throws RangeError on a non-finite temperature or a rating not > 0.
 */
export function componentTempCheck({ componentC, ratingC }: { componentC: number; ratingC: number }): ComponentTempCheck {
  finite('componentC', componentC);
  positive('ratingC', ratingC);
  const marginC = ratingC - componentC;
  const over = componentC >= ratingC;
  return {
    over,
    marginC,
    message: over
      ? `At ${round1(componentC)} °C the component is at or above its ${ratingC} °C rating.`
      : `${round1(marginC)} °C below its ${ratingC} °C rating.`,
  };
}

/** The rise change between surveys that we call a deviation, °C: the width of NETA's lowest band [CP]. */
export const TREND_DEVIATION_C = 3;

export interface RisePoint {
  /** the survey's date, YYYY-MM-DD */
  takenOn: string;
  riseC: number;
}

export interface RiseTrend {
  /** points in date order */
  points: RisePoint[];
  /** the latest rise minus the one before it, °C; null with fewer than two surveys */
  changeC: number | null;
  /** the latest survey deviates from the earlier ones (NFPA 70B condition 2) */
  deviates: boolean;
  message: string | null;
}

/**
 * The same termination's rise across surveys. It deviates when the latest rise is more than
 * {@link TREND_DEVIATION_C} °C above the highest earlier one [CP] — NFPA 70B 2023 counts results
 * that deviate from earlier ones toward condition 2.
 * @throws RangeError on a non-finite rise or a date that is not YYYY-MM-DD.
 */
export function riseTrend(points: readonly RisePoint[]): RiseTrend {
  for (const p of points) {
    finite('riseC', p.riseC);
    if (!/^\d{4}-\d{2}-\d{2}$/.test(p.takenOn)) throw new RangeError(`takenOn must be YYYY-MM-DD, got ${String(p.takenOn)}`);
  }
  const sorted = [...points].sort((a, b) => a.takenOn.localeCompare(b.takenOn));
  if (sorted.length < 2) return { points: sorted, changeC: null, deviates: false, message: null };
  const latest = sorted[sorted.length - 1];
  const earlier = sorted.slice(0, -1);
  const changeC = latest.riseC - earlier[earlier.length - 1].riseC;
  const highest = Math.max(...earlier.map((p) => p.riseC));
  const deviates = latest.riseC - highest > TREND_DEVIATION_C;
  return {
    points: sorted,
    changeC,
    deviates,
    message: deviates
      ? `The rise grew from at most ${round1(highest)} °C to ${round1(latest.riseC)} °C: a result that deviates ` +
        'from earlier surveys (NFPA 70B condition 2).'
      : null,
  };
}

export type TemperatureUnit = 'C' | 'F';

/**
 * A temperature stored in °C shown in the user's unit. A rise (a difference) converts by 9/5 only;
 * an absolute temperature also adds 32.
 * @throws RangeError on a non-finite value.
 */
export function displayTemp(valueC: number, unit: TemperatureUnit, kind: 'absolute' | 'rise'): string {
  finite('temperature', valueC);
  if (unit === 'C') return `${round1(valueC)} °C`;
  const f = kind === 'absolute' ? (valueC * 9) / 5 + 32 : (valueC * 9) / 5;
  return `${round1(f)} °F`;
}

/** A temperature typed in the user's unit, back to °C for storage. */
export function toCelsius(value: number, unit: TemperatureUnit, kind: 'absolute' | 'rise'): number {
  finite('temperature', value);
  if (unit === 'C') return value;
  return kind === 'absolute' ? ((value - 32) * 5) / 9 : (value * 5) / 9;
}

function round1(x: number): number {
  return Math.round(x * 10) / 10;
}
