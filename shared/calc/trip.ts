/**
 * Breaker trip tests: time-current bands, inverse-time verdicts, instantaneous pickup.
 *
 * Sources: the maker's published time-current curve is the reference; ANSI/NETA ATS 7.6.1.1 says to
 * use it and fall back to the NETA table only when none is available. Inverse-time tests at 300 % of
 * rating (NEMA AB 4 6.5.4.2). ANSI/NETA Table 100.7 (300 % maximum trip times — from memory, low
 * confidence) and Table 100.8 (instantaneous pickup tolerances). UL 489: 100 % of rating is carried
 * indefinitely. Regions of a band [CP]: the inverse-time (thermal) points are judged between
 * themselves on log–log axes; at and above the instantaneous pickup (a multiple with its
 * tolerance) the breaker clears without intentional delay; never a line from one region into the other.
 */
import { finite, nonNegative, positive } from './guard';

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
 * @throws RangeError on a multiple that is not a finite number > 0, and on a band {@link bandProblem}
 * refuses.
 */
export function tripBand(points: readonly TripBandPoint[], multiple: number): TripTimes | null {
  positive('multiple', multiple);
  const problem = bandProblem(points);
  if (problem !== null) throw new RangeError(problem);
  const sorted = [...points].sort((a, b) => a.multiple - b.multiple);
  if (sorted.length === 0) return null;
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
 * Why a band cannot be used, or null when it can: every multiple and time a finite number > 0,
 * minS ≤ maxS at each point, no two points at one multiple, and neither time rising as current
 * rises (an inverse-time band falls; a rise is an entry error [CP]).
 */
export function bandProblem(points: readonly TripBandPoint[]): string | null {
  for (const p of points) {
    const values = [p.multiple, p.minS, p.maxS];
    if (!values.every((v) => typeof v === 'number' && Number.isFinite(v) && v > 0)) {
      return 'band points need multiple, minS and maxS all finite and > 0';
    }
    if (p.minS > p.maxS) return `the band point at ${p.multiple}× has its minimum time above its maximum`;
  }
  const sorted = [...points].sort((a, b) => a.multiple - b.multiple);
  for (let i = 1; i < sorted.length; i += 1) {
    const [lo, hi] = [sorted[i - 1], sorted[i]];
    if (hi.multiple === lo.multiple) return `two band points at ${hi.multiple}×`;
    if (hi.maxS > lo.maxS || hi.minS > lo.minS) {
      return `the band\u2019s times rise with current between ${lo.multiple}× and ${hi.multiple}×: check the points entered`;
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
 * @throws RangeError when ratingA or voltageV is not a finite number > 0.
 */
export function netaMaxTripS300({ ratingA, voltageV }: { ratingA: number; voltageV: number }): number | null {
  positive('ratingA', ratingA);
  positive('voltageV', voltageV);
  if (ratingA < 15 || voltageV > 600) return null;
  for (const [upTo, lowV, highV] of NETA_300PCT_MAX_S) {
    if (ratingA <= upTo) return voltageV <= 250 ? lowV : highV;
  }
  return null;
}

/** How close to 300 % a test must be for the NETA 300 % fallback: ±5 % of the multiple [CP]. */
export const NETA_FALLBACK_MULTIPLE_TOLERANCE = 0.05;

export type TripVerdict = 'pass' | 'slow' | 'fast' | 'no-trip' | 'unexpected-trip';
export type TripBasis = 'maker-band' | 'neta-300pct-fallback' | 'carry-rating' | 'instantaneous' | 'none';
/** carry: at or below the rating; thermal: inverse-time; pickup-tolerance: within the
 * instantaneous pickup's tolerance (either may clear it); instantaneous: above the pickup band */
export type TripRegion = 'carry' | 'thermal' | 'pickup-tolerance' | 'instantaneous';

/**
 * Longest clearing time counted as instantaneous ("no intentional delay"), s — our choice [CP]
 * (about six cycles at 60 Hz, well above a molded-case breaker's instantaneous clearing); the
 * maker's curve governs.
 */
export const INSTANTANEOUS_MAX_CLEARING_S = 0.1;

export interface InstantaneousSetting {
  /** pickup as a multiple of the rating */
  multiple: number;
  /** the band's ± tolerance, %; null: ANSI/NETA Table 100.8 non-adjustable ±25 % (from memory) */
  tolerancePct: number | null;
}

export interface TripTestInput {
  ratingA: number;
  /** test current */
  testA: number;
  /** time to trip, s; null when it did not trip */
  tripS: number | null;
  /** band from the maker's published curve */
  band?: readonly TripBandPoint[];
  /** the band's instantaneous pickup, when it has one */
  instantaneous?: InstantaneousSetting | null;
  /** the rating the band was entered for; a band for another rating is not used */
  bandRatingA?: number | null;
  /** system voltage the breaker is applied at (picks the NETA column) */
  voltageV: number;
}

export interface InstantaneousVerdict {
  /** pickup band, multiples of rating */
  lowMultiple: number;
  highMultiple: number;
  /** the ANSI/NETA Table 100.8 pickup check on this test: null when the test says nothing about it */
  ok: boolean | null;
  note: string;
  basis: string;
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
  region: TripRegion;
  /** the instantaneous region's verdict, when the band has a pickup */
  instantaneous: InstantaneousVerdict | null;
  /** what stopped the band being used (a band for another rating, a band with rising times) */
  problems: string[];
}

const NETA_NOTE =
  'No maker\u2019s curve given: judged against the NETA Table 100.7 maximum at 300 % ' +
  '(figures from memory, low confidence; the table gives no usable minimum here). ' +
  'Confirm against the maker\u2019s published time-current curve.';

const fmt = (x: number): string => String(Math.round(x * 100) / 100);

/**
 * Verdict of a trip test, the inverse-time (thermal) and instantaneous regions judged apart.
 *
 * - At or below 100 % of rating a breaker must carry the current indefinitely (UL 489): any trip
 *   is 'unexpected-trip', holding is 'pass' (region 'carry').
 * - A band entered for another rating than the circuit's, or one whose times rise with current, is
 *   not used: the reason is in `problems`.
 * - With an instantaneous pickup (multiple ± tolerance, the band's or ANSI/NETA Table 100.8's):
 *   below the pickup band the thermal points alone judge it (points at or above the pickup band's
 *   lower edge belong to the instantaneous region and are left out); a test beyond the last thermal
 *   point is outside the band's data — no line is drawn into the instantaneous region [CP]. Within
 *   the pickup tolerance either an instantaneous clearing or a time inside the thermal band passes.
 *   Above it the breaker must clear within {@link INSTANTANEOUS_MAX_CLEARING_S} [CP]. A clearing
 *   that fast below the pickup band fails the Table 100.8 pickup check ({@link instantaneousPickupCheck}).
 * - Without a usable band, only a test at 300 % (±5 %) is judged, on the NETA Table 100.7 maximum
 *   (from memory, low confidence); minS is 0 so the fallback never calls a trip 'fast'.
 * - Otherwise basis 'none', verdict null.
 * Within the window: 'pass'; earlier than minS 'fast'; later than maxS 'slow'; tripS null 'no-trip'.
 * @throws RangeError when ratingA, testA or voltageV is not a finite number > 0, or tripS is
 * negative or not a number.
 */
export function tripTestVerdict(input: TripTestInput): TripTestResult {
  const { ratingA, testA, tripS, voltageV } = input;
  positive('ratingA', ratingA);
  positive('testA', testA);
  positive('voltageV', voltageV);
  if (tripS !== null) nonNegative('tripS', tripS);
  const multiple = testA / ratingA;
  const problems: string[] = [];

  let band = input.band !== undefined && input.band.length > 0 ? input.band : undefined;
  let inst = input.instantaneous ?? null;
  if (band !== undefined || inst !== null) {
    const bandRatingA = input.bandRatingA ?? null;
    if (bandRatingA !== null && bandRatingA !== ratingA) {
      problems.push(
        `The band is for a ${fmt(bandRatingA)} A breaker; this circuit is ${fmt(ratingA)} A: the band was not used. ` +
          'Choose the band for this breaker.',
      );
      band = undefined;
      inst = null;
    }
  }
  if (band !== undefined) {
    const problem = bandProblem(band);
    if (problem !== null) {
      problems.push(`The band cannot be used: ${problem}.`);
      band = undefined;
    }
  }

  if (testA <= ratingA) {
    return {
      verdict: tripS === null ? 'pass' : 'unexpected-trip',
      expected: null,
      basis: 'carry-rating',
      basisNote: 'At or below its rating a breaker must carry the current without tripping (UL 489).',
      multiple,
      region: 'carry',
      instantaneous: null,
      problems,
    };
  }

  let instantaneous: InstantaneousVerdict | null = null;
  let lowX = Infinity;
  let highX = Infinity;
  if (inst !== null) {
    positive('instantaneous multiple', inst.multiple);
    const settingA = inst.multiple * ratingA;
    const check = instantaneousPickupCheck({
      settingA,
      pickupA: testA,
      kind: 'non-adjustable',
      ...(inst.tolerancePct !== null ? { tolerancePct: inst.tolerancePct } : {}),
    });
    lowX = check.lowA / ratingA;
    highX = check.highA / ratingA;
    instantaneous = { lowMultiple: lowX, highMultiple: highX, ok: null, note: '', basis: check.basis };
  }
  const region: TripRegion = multiple < lowX ? 'thermal' : multiple <= highX ? 'pickup-tolerance' : 'instantaneous';
  const quick = tripS !== null && tripS <= INSTANTANEOUS_MAX_CLEARING_S;
  const pickupWords = instantaneous
    ? `instantaneous pickup ${fmt(instantaneous.lowMultiple)}–${fmt(instantaneous.highMultiple)}× rating`
    : '';

  // the thermal points: those below the pickup band's lower edge
  const thermalPoints = band?.filter((p) => p.multiple < lowX) ?? [];
  const thermal = thermalPoints.length > 0 && region !== 'instantaneous' ? tripBand(thermalPoints, multiple) : null;
  const lastThermal = thermalPoints.length > 0 ? Math.max(...thermalPoints.map((p) => p.multiple)) : null;

  const done = (verdict: TripVerdict | null, expected: TripTimes | null, basis: TripBasis, basisNote: string): TripTestResult => ({
    verdict, expected, basis, basisNote, multiple, region, instantaneous, problems,
  });
  const judge = (expected: TripTimes): TripVerdict =>
    tripS === null ? 'no-trip' : tripS < expected.minS ? 'fast' : tripS > expected.maxS ? 'slow' : 'pass';

  if (instantaneous !== null && region === 'instantaneous') {
    instantaneous.ok = tripS === null ? false : quick;
    instantaneous.note = quick
      ? `Cleared in ${fmt(tripS ?? 0)} s above the ${pickupWords}: the instantaneous element works.`
      : `Above the ${pickupWords} it should clear within ${INSTANTANEOUS_MAX_CLEARING_S} s; it did not.`;
    const expected = { minS: 0, maxS: INSTANTANEOUS_MAX_CLEARING_S };
    return done(judge(expected), expected, 'instantaneous',
      `Instantaneous region (${pickupWords}): clearing without intentional delay, within ${INSTANTANEOUS_MAX_CLEARING_S} s [common practice]; the maker\u2019s curve governs.`);
  }
  if (instantaneous !== null && region === 'pickup-tolerance') {
    if (quick) {
      instantaneous.ok = true;
      instantaneous.note = `Picked up instantaneously within the ${pickupWords} (ANSI/NETA Table 100.8).`;
      return done('pass', { minS: 0, maxS: thermal?.maxS ?? INSTANTANEOUS_MAX_CLEARING_S }, 'instantaneous',
        `Within the ${pickupWords}: an instantaneous clearing passes.`);
    }
    instantaneous.note = `Within the ${pickupWords} the breaker may clear instantaneously or on its thermal band.`;
    if (thermal !== null) {
      const verdict = judge(thermal);
      return done(verdict, thermal, 'maker-band', `Within the ${pickupWords}: judged on the thermal band (or an instantaneous clearing).`);
    }
    if (tripS === null) return done('no-trip', null, 'instantaneous', `Within the ${pickupWords} it should have cleared.`);
    return done(null, null, 'none',
      `Within the ${pickupWords}, and outside the band\u2019s thermal data (its points end at ${lastThermal === null ? '—' : `${fmt(lastThermal)}×`}): enter the thermal curve up to the pickup to judge this test.`);
  }

  // thermal region (or no instantaneous pickup on file)
  if (instantaneous !== null && quick) {
    instantaneous.ok = false;
    instantaneous.note = `Cleared in ${fmt(tripS ?? 0)} s at ${fmt(multiple)}×, below the ${pickupWords}: the pickup is low (ANSI/NETA Table 100.8).`;
    return done('fast', thermal, thermal ? 'maker-band' : 'instantaneous', instantaneous.note);
  }
  if (thermal !== null) {
    return done(judge(thermal), thermal, 'maker-band',
      'Judged against the band entered from the maker\u2019s published time-current curve' +
        (instantaneous ? `, thermal region (below the ${pickupWords}).` : '.'));
  }
  if (Math.abs(multiple / 3 - 1) <= NETA_FALLBACK_MULTIPLE_TOLERANCE + 1e-9) {
    const maxS = netaMaxTripS300({ ratingA, voltageV });
    if (maxS !== null) {
      const expected = { minS: 0, maxS };
      return done(judge(expected), expected, 'neta-300pct-fallback', NETA_NOTE);
    }
  }
  if (band !== undefined && lastThermal !== null && multiple > lastThermal) {
    return done(null, null, 'none',
      `${fmt(multiple)}× is outside the band\u2019s thermal data (its points end at ${fmt(lastThermal)}×` +
        (instantaneous ? `; ${pickupWords}` : '') +
        '): no line is drawn beyond them. Enter more of the maker\u2019s curve to judge this test.');
  }
  return done(null, null, 'none',
    `No maker\u2019s curve covers ${Math.round(multiple * 100)} % and the NETA fallback covers only ` +
      'a 300 % test: enter the band from the maker\u2019s published curve to judge this test.');
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
 * non-adjustable ±25 % are from memory. The maker's published tolerance wins where given
 * (`tolerancePct`, symmetric).
 * @throws RangeError when settingA or pickupA is not a finite number > 0, or tolerancePct is out of 0–100.
 */
export function instantaneousPickupCheck({
  settingA,
  pickupA,
  kind,
  tolerancePct,
}: {
  settingA: number;
  pickupA: number;
  kind: InstantaneousTripKind;
  /** the maker's ± tolerance, %, which wins over the table where given */
  tolerancePct?: number;
}): InstantaneousPickupResult {
  positive('settingA', settingA);
  positive('pickupA', pickupA);
  if (PICKUP_TOLERANCE_PCT[kind] === undefined) throw new RangeError(`unknown instantaneous trip kind ${String(kind)}`);
  if (tolerancePct !== undefined) {
    finite('tolerancePct', tolerancePct);
    if (tolerancePct < 0 || tolerancePct >= 100) throw new RangeError(`tolerancePct must be 0 to under 100, got ${tolerancePct}`);
  }
  const [minusPct, plusPct] = tolerancePct !== undefined ? [tolerancePct, tolerancePct] : PICKUP_TOLERANCE_PCT[kind];
  // integer percentages keep 4 000 A × 70 % exactly 2 800 A
  const lowA = (settingA * (100 - minusPct)) / 100;
  const highA = (settingA * (100 + plusPct)) / 100;
  return {
    ok: pickupA >= lowA && pickupA <= highA,
    lowA,
    highA,
    basis:
      tolerancePct !== undefined
        ? `the maker\u2019s tolerance ±${tolerancePct} % of the setting`
        : kind === 'thermal-magnetic-adjustable'
        ? 'ANSI/NETA Table 100.8, adjustable thermal-magnetic −30 % / +40 %'
        : `ANSI/NETA Table 100.8, ${kind} ±${minusPct} % (from memory)`,
  };
}
