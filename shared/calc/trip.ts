/**
 * Breaker trip tests: time-current bands, inverse-time verdicts, instantaneous pickup.
 *
 * Sources: the maker's published time-current curve is the reference; ANSI/NETA ATS 7.6.1.1 says to
 * use it and fall back to the NETA table only when none is available. Inverse-time tests at 300 % of
 * rating (NEMA AB 4 6.5.4.2). ANSI/NETA Table 100.7 (300 % maximum trip times — from memory, low
 * confidence) and Table 100.8 (instantaneous pickup tolerances). UL 489: 100 % of rating is carried
 * indefinitely.
 */

/** One point of a band read off the maker's time-current curve. */
export interface TripBandPoint {
  /** current as a multiple of the rating (e.g. 3 for 300 %) */
  multiple: number;
  /** minimum (total clearing band lower edge) time, s */
  minS: number;
  /** maximum time, s */
  maxS: number;
}

export interface TripTimes {
  minS: number;
  maxS: number;
}

/**
 * Band at `multiple` by log–log interpolation: log(time) is linear in log(multiple) between the
 * two neighbouring points, as on the log–log paper curves are drawn on [CP]. Null outside the
 * range of the points (no extrapolation) or with no points.
 * @throws RangeError on a non-positive multiple or time, minS > maxS, or two points at one multiple.
 */
export function tripBand(points: readonly TripBandPoint[], multiple: number): TripTimes | null {
  for (const p of points) {
    if (!(p.multiple > 0) || !(p.minS > 0) || !(p.maxS > 0)) {
      throw new RangeError('band points need multiple, minS and maxS all > 0');
    }
    if (p.minS > p.maxS) throw new RangeError(`band point at ${p.multiple}× has minS > maxS`);
  }
  const sorted = [...points].sort((a, b) => a.multiple - b.multiple);
  for (let i = 1; i < sorted.length; i += 1) {
    if (sorted[i].multiple === sorted[i - 1].multiple) {
      throw new RangeError(`two band points at ${sorted[i].multiple}×`);
    }
  }
  if (!(multiple > 0) || sorted.length === 0) return null;
  const first = sorted[0];
  const last = sorted[sorted.length - 1];
  if (multiple < first.multiple || multiple > last.multiple) return null;
  for (let i = 0; i < sorted.length; i += 1) {
    const lo = sorted[i];
    if (multiple === lo.multiple) return { minS: lo.minS, maxS: lo.maxS };
    const hi = sorted[i + 1];
    if (hi !== undefined && multiple < hi.multiple) {
      const t = Math.log(multiple / lo.multiple) / Math.log(hi.multiple / lo.multiple);
      const logLerp = (a: number, b: number): number => Math.exp(Math.log(a) + t * Math.log(b / a));
      // clamp guards the last bit of floating-point error so the result never leaves the band
      const clamp = (v: number, a: number, b: number): number =>
        Math.min(Math.max(v, Math.min(a, b)), Math.max(a, b));
      const minS = clamp(logLerp(lo.minS, hi.minS), lo.minS, hi.minS);
      // min ≤ max holds at both points, so it holds between them; rounding must not undo that
      const maxS = Math.max(minS, clamp(logLerp(lo.maxS, hi.maxS), lo.maxS, hi.maxS));
      return { minS, maxS };
    }
  }
  return null;
}

/**
 * ANSI/NETA Table 100.7, maximum inverse-time trip time at 300 % of rating, molded-case breakers,
 * s — FROM MEMORY, LOW CONFIDENCE (REFERENCES.md [M]). [highest rating of the row, ≤ 250 V, 251–600 V].
 */
const NETA_300PCT_MAX_S: readonly (readonly [number, number | null, number | null])[] = [
  [30, 50, 70],
  [50, 80, 100],
  [100, 140, 160],
  [150, 200, 250],
  [225, 230, 275],
  [400, 300, 350],
  [600, null, 450],
  [800, 500, 500],
  [1000, 600, 600],
];

/**
 * Maximum trip time at 300 % from ANSI/NETA Table 100.7 — values from memory, low confidence:
 * use only when the maker publishes no curve. Null for ratings under 15 A or over 1000 A, over
 * 600 V, or where the table has no entry (401–600 A at ≤ 250 V).
 */
export function netaMaxTripS300({ ratingA, voltageV }: { ratingA: number; voltageV: number }): number | null {
  if (ratingA < 15 || !(voltageV > 0) || voltageV > 600) return null;
  for (const [upTo, lowV, highV] of NETA_300PCT_MAX_S) {
    if (ratingA <= upTo) return voltageV <= 250 ? lowV : highV;
  }
  return null;
}

/** How close to 300 % a test must be for the NETA 300 % fallback: ±5 % of the multiple [CP]. */
export const NETA_FALLBACK_MULTIPLE_TOLERANCE = 0.05;

export type TripVerdict = 'pass' | 'slow' | 'fast' | 'no-trip' | 'unexpected-trip';
export type TripBasis = 'maker-band' | 'neta-300pct-fallback' | 'carry-rating' | 'none';

export interface TripTestInput {
  ratingA: number;
  /** test current */
  testA: number;
  /** time to trip, s; null when it did not trip */
  tripS: number | null;
  /** band from the maker's published curve */
  band?: readonly TripBandPoint[];
  /** system voltage the breaker is applied at (picks the NETA column) */
  voltageV: number;
}

export interface TripTestResult {
  /** null when there is nothing to judge against (basis 'none') */
  verdict: TripVerdict | null;
  /** time window the trip should fall in; null when no trip is expected or no data */
  expected: TripTimes | null;
  basis: TripBasis;
  /** plain words on where `expected` comes from and how far to trust it */
  basisNote: string;
  /** testA / ratingA */
  multiple: number;
}

const NETA_NOTE =
  'No maker\u2019s curve given: judged against the NETA Table 100.7 maximum at 300 % ' +
  '(figures from memory, low confidence; the table gives no usable minimum here). ' +
  'Confirm against the maker\u2019s published time-current curve.';

/**
 * Verdict of an inverse-time trip test.
 *
 * - At or below 100 % of rating a breaker must carry the current indefinitely (UL 489): any trip
 *   is 'unexpected-trip', holding is 'pass' (basis 'carry-rating', expected null).
 * - Above 100 %: the maker's band (log–log {@link tripBand}) when given and covering the
 *   multiple — ANSI/NETA ATS 7.6.1.1 puts the maker's curve first.
 * - Else, only for a test at 300 % (±5 %), the NETA Table 100.7 maximum as a fallback (from
 *   memory, low confidence); minS is 0 so the fallback can never call a trip 'fast'.
 * - Otherwise there is no data: basis 'none', verdict null, expected null (no throw, so a screen
 *   can still show the recorded time and ask for the maker's curve).
 * Within the window: 'pass'; earlier than minS 'fast'; later than maxS 'slow'; tripS null 'no-trip'.
 * @throws RangeError when ratingA or testA is not > 0, or tripS < 0.
 */
export function tripTestVerdict(input: TripTestInput): TripTestResult {
  const { ratingA, testA, tripS, band, voltageV } = input;
  if (!(ratingA > 0) || !(testA > 0)) throw new RangeError('ratingA and testA must be > 0');
  if (tripS !== null && !(tripS >= 0)) throw new RangeError(`tripS must be ≥ 0, got ${tripS}`);
  const multiple = testA / ratingA;

  if (testA <= ratingA) {
    return {
      verdict: tripS === null ? 'pass' : 'unexpected-trip',
      expected: null,
      basis: 'carry-rating',
      basisNote: 'At or below its rating a breaker must carry the current without tripping (UL 489).',
      multiple,
    };
  }

  let expected: TripTimes | null = null;
  let basis: TripBasis = 'none';
  let basisNote =
    `No maker\u2019s curve covers ${Math.round(multiple * 100)} % and the NETA fallback covers only ` +
    'a 300 % test: enter the band from the maker\u2019s published curve to judge this test.';

  if (band !== undefined && band.length > 0) {
    expected = tripBand(band, multiple);
    if (expected !== null) {
      basis = 'maker-band';
      basisNote = 'Judged against the band entered from the maker\u2019s published time-current curve.';
    }
  }
  if (expected === null && Math.abs(multiple / 3 - 1) <= NETA_FALLBACK_MULTIPLE_TOLERANCE + 1e-9) {
    const maxS = netaMaxTripS300({ ratingA, voltageV });
    if (maxS !== null) {
      expected = { minS: 0, maxS };
      basis = 'neta-300pct-fallback';
      basisNote = NETA_NOTE;
    }
  }
  if (expected === null) return { verdict: null, expected: null, basis: 'none', basisNote, multiple };

  let verdict: TripVerdict;
  if (tripS === null) verdict = 'no-trip';
  else if (tripS < expected.minS) verdict = 'fast';
  else if (tripS > expected.maxS) verdict = 'slow';
  else verdict = 'pass';
  return { verdict, expected, basis, basisNote, multiple };
}

export type InstantaneousTripKind = 'thermal-magnetic-adjustable' | 'electronic' | 'non-adjustable';

/** [minus %, plus %] of the setting. */
const PICKUP_TOLERANCE_PCT: Record<InstantaneousTripKind, readonly [number, number]> = {
  'thermal-magnetic-adjustable': [30, 40], // ANSI/NETA Table 100.8, seen in the published text
  electronic: [30, 30], // from memory
  'non-adjustable': [25, 25], // from memory
};

export interface InstantaneousPickupResult {
  ok: boolean;
  lowA: number;
  highA: number;
  basis: string;
}

/**
 * Instantaneous pickup tolerance, ANSI/NETA Table 100.8: adjustable thermal-magnetic −30 % / +40 %
 * of the setting (e.g. 4 000 A → 2 800–5 600 A; 2 775 A fails); electronic ±30 % and
 * non-adjustable ±25 % are from memory. The maker's published tolerance wins where given.
 */
export function instantaneousPickupCheck({
  settingA,
  pickupA,
  kind,
}: {
  settingA: number;
  pickupA: number;
  kind: InstantaneousTripKind;
}): InstantaneousPickupResult {
  const [minusPct, plusPct] = PICKUP_TOLERANCE_PCT[kind];
  // integer percentages keep 4 000 A × 70 % exactly 2 800 A
  const lowA = (settingA * (100 - minusPct)) / 100;
  const highA = (settingA * (100 + plusPct)) / 100;
  return {
    ok: pickupA >= lowA && pickupA <= highA,
    lowA,
    highA,
    basis:
      kind === 'thermal-magnetic-adjustable'
        ? 'ANSI/NETA Table 100.8, adjustable thermal-magnetic −30 % / +40 %'
        : `ANSI/NETA Table 100.8, ${kind} ±${minusPct} % (from memory)`,
  };
}
