/**
 * Thermographic findings: load correction and severity.
 *
 * Sources: ANSI/NETA MTS Table 100.18 (thermographic survey suggested actions based on temperature
 * rise); Infraspection Institute load-correction relation (2023); NFPA 70B (2023) survey under at
 * least 40 % of normal load.
 */

import { finite, positive } from './guard';

export interface LoadCorrectionInput {
  /** temperature rise measured, °C */
  riseC: number;
  /** current when the rise was measured */
  measuredA: number;
  /** current to correct to (e.g. the rating or the normal full load) */
  referenceA: number;
  /** 1.6–2.0; 2 is the conservative usual choice [CP] */
  exponent?: number;
}

/**
 * What the load correction did:
 * - 'as-measured': measured at or above the reference load; the rise is never lowered [CP].
 * - 'raised': measured between 40 % and 100 % of the reference load; raised by the square law.
 * - 'too-light': measured under 40 % of the reference load (NFPA 70B 2023): too lightly loaded to
 *   judge, riseC null — multiplying it up would invent a figure (2 °C at 10 % is not 200 °C).
 */
export interface LoadCorrection {
  outcome: 'as-measured' | 'raised' | 'too-light';
  /** the rise to judge, °C; null when too lightly loaded to judge */
  riseC: number | null;
  /** measuredA / referenceA */
  loadFraction: number;
  /** one sentence on what was done and why */
  reason: string;
}

/**
 * Load correction of a thermographic rise to the reference (normal) load.
 *
 * Raise only: ΔT_r = ΔT_m × (I_r / I_m)^n (Infraspection Institute, 2023; n between 1.6 and 2.0,
 * default 2 [CP]; IEC 61439-1 10.10.2.3.1 implies n ≈ 1.64), used only for a reading taken between
 * 40 % (NFPA 70B 2023: surveys under at least 40 % of normal load) and 100 % of the reference load.
 * At or above the reference load the measured rise stands [CP]: a joint that is hot at high load is
 * not made cool by arithmetic. Under 40 % the reading is too lightly loaded to judge.
 * @throws RangeError on a non-finite rise, a measured or reference load not > 0, or an exponent
 * outside 1–3.
 */
export function loadCorrection({ riseC, measuredA, referenceA, exponent = 2 }: LoadCorrectionInput): LoadCorrection {
  finite('riseC', riseC);
  positive('measuredA', measuredA);
  positive('referenceA', referenceA);
  finite('exponent', exponent);
  if (exponent < 1 || exponent > 3) throw new RangeError(`exponent must be between 1 and 3, got ${exponent}`);
  const loadFraction = measuredA / referenceA;
  const pct = percentOfNormal(measuredA, referenceA);
  if (loadFraction >= 1) {
    return {
      outcome: 'as-measured',
      riseC,
      loadFraction,
      reason: `Measured at ${pct} % of the reference load: judged as measured (a rise is never corrected down).`,
    };
  }
  if (loadFraction < THERMOGRAPHY_LOAD_MIN_FRACTION) {
    return {
      outcome: 'too-light',
      riseC: null,
      loadFraction,
      reason:
        `Measured at ${pct} % of the reference load, under the 40 % NFPA 70B asks for: too lightly loaded ` +
        'to judge. Scan again under more load.',
    };
  }
  return {
    outcome: 'raised',
    riseC: riseC * (1 / loadFraction) ** exponent,
    loadFraction,
    reason:
      `Measured at ${pct} % of the reference load: raised by (I_ref / I_meas)^${exponent} ` +
      '(Infraspection Institute square law).',
  };
}

/**
 * The rise to judge after {@link loadCorrection}: raised below the reference load, as measured at
 * or above it, null when too lightly loaded to judge.
 * @throws RangeError as loadCorrection.
 */
export function loadCorrectedRiseC(input: LoadCorrectionInput): number | null {
  return loadCorrection(input).riseC;
}

/**
 * 'similar': rise over a similar component under similar load; 'ambient': rise over ambient air.
 */
export type ThermalBasis = 'similar' | 'ambient';
export type ThermalPriorityLevel = 1 | 2 | 3 | 4;

export interface ThermalPriority {
  priority: ThermalPriorityLevel | null;
  /** suggested action from the table */
  action: string;
  /** our short name for the priority (DESIGN.md §6) */
  label: string | null;
}

const ACTIONS: Record<ThermalPriorityLevel, { action: string; label: string }> = {
  1: { action: 'Major discrepancy: repair immediately.', label: 'P1 now' },
  2: { action: 'Monitor until corrective measures can be taken.', label: 'P2 soon' },
  3: { action: 'Probable deficiency: repair as time permits.', label: 'P3 planned' },
  4: { action: 'Possible deficiency: warrants investigation.', label: 'P4 watch' },
};

/**
 * Upper bound (inclusive) of each band, °C, in priority order 4 → 1; ANSI/NETA MTS Table 100.18.
 * 'similar' has no priority-2 band: 1–3 → 4, 4–15 → 3, > 15 → 1.
 */
const BANDS: Record<ThermalBasis, readonly (readonly [number, ThermalPriorityLevel])[]> = {
  similar: [[3, 4], [15, 3], [Infinity, 1]],
  ambient: [[10, 4], [20, 3], [40, 2], [Infinity, 1]],
};

/**
 * NETA priority of a temperature rise, ANSI/NETA MTS Table 100.18.
 *
 * The table prints whole-degree bands (1–3, 4–15, > 15 …). A fractional rise between two bands
 * goes to the more severe one: each band runs up to and including its printed upper figure, so
 * 3.0 °C (similar) is priority 4 and 3.5 °C is priority 3; 10.5 °C (ambient) is priority 3.
 * This is the same as rounding the rise up to the next whole degree, except that anything below
 * 1 °C is below the table: priority null, no thermographic action.
 * @throws RangeError on a non-finite rise.
 */
export function thermalPriority({ riseC, basis }: { riseC: number; basis: ThermalBasis }): ThermalPriority {
  if (!Number.isFinite(riseC)) throw new RangeError(`riseC must be a number, got ${riseC}`);
  if (BANDS[basis] === undefined) throw new RangeError(`basis must be similar or ambient, got ${String(basis)}`);
  if (riseC < 1) {
    return {
      priority: null,
      action: 'Rise below 1 °C: below the table, no action from this reading.',
      label: null,
    };
  }
  for (const [upper, priority] of BANDS[basis]) {
    if (riseC <= upper) return { priority, ...ACTIONS[priority] };
  }
  // unreachable: the last band is open-ended
  return { priority: 1, ...ACTIONS[1] };
}

/** NFPA 70B (2023): thermographic surveys under at least 40 % of normal load. */
export const THERMOGRAPHY_LOAD_MIN_FRACTION = 0.4;

/**
 * True when a thermographic reading was taken below 40 % of the normal load (NFPA 70B 2023), so
 * the finding should say it was taken under light load (and a rise may understate the problem).
 * @throws RangeError when normalA is not > 0 or measuredA is negative or not a number.
 */
export function takenUnderLightLoad({ measuredA, normalA }: { measuredA: number; normalA: number }): boolean {
  positive('normalA', normalA);
  if (!Number.isFinite(measuredA) || measuredA < 0) throw new RangeError(`measuredA must be ≥ 0, got ${measuredA}`);
  // compare the ratio (not measured vs 0.4 × normal) so exactly 40 % is not light load
  return measuredA / normalA < THERMOGRAPHY_LOAD_MIN_FRACTION;
}

/**
 * The load at a reading as a whole percentage of its normal load (11 A of 12.5 A → 88): the one
 * figure every screen, report and the demo's words give for it.
 * @throws RangeError on a normal load not > 0 or a measured load < 0 or not finite.
 */
export function percentOfNormal(measuredA: number, normalA: number): number {
  positive('normalA', normalA);
  if (!Number.isFinite(measuredA) || measuredA < 0) throw new RangeError(`measuredA must be ≥ 0, got ${measuredA}`);
  return Math.round((100 * measuredA) / normalA);
}

/**
 * A note to print beside a finding taken under less than 40 % of normal load (NFPA 70B 2023: the
 * load is recorded and a lighter-load finding says so), or null when the load was enough.
 */
export function lightLoadNote({ measuredA, normalA }: { measuredA: number; normalA: number }): string | null {
  if (!takenUnderLightLoad({ measuredA, normalA })) return null;
  const pct = percentOfNormal(measuredA, normalA);
  return `Taken at ${pct} % of normal load, under the 40 % NFPA 70B asks for: the rise at full load will be higher.`;
}
