/**
 * Thermographic findings: load correction and severity.
 *
 * Sources: ANSI/NETA MTS Table 100.18 (thermographic survey suggested actions based on temperature
 * rise); Infraspection Institute load-correction relation (2023); NFPA 70B (2023) survey under at
 * least 40 % of normal load.
 */

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
 * Rise corrected to another load: ΔT_r = ΔT_m × (I_r / I_m)^n (Infraspection Institute, 2023;
 * n between 1.6 and 2.0, default 2 [CP]; IEC 61439-1 10.10.2.3.1 implies n ≈ 1.64).
 * @throws RangeError when measuredA ≤ 0 (a rise at no load cannot be scaled) or referenceA < 0.
 */
export function loadCorrectedRiseC({
  riseC,
  measuredA,
  referenceA,
  exponent = 2,
}: LoadCorrectionInput): number {
  if (!(measuredA > 0)) throw new RangeError(`measuredA must be > 0, got ${measuredA}`);
  if (!(referenceA >= 0)) throw new RangeError(`referenceA must be ≥ 0, got ${referenceA}`);
  return riseC * (referenceA / measuredA) ** exponent;
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
 * @throws RangeError when normalA ≤ 0.
 */
export function takenUnderLightLoad({ measuredA, normalA }: { measuredA: number; normalA: number }): boolean {
  if (!(normalA > 0)) throw new RangeError(`normalA must be > 0, got ${normalA}`);
  // compare the ratio (not measured vs 0.4 × normal) so exactly 40 % is not light load
  return measuredA / normalA < THERMOGRAPHY_LOAD_MIN_FRACTION;
}

/**
 * A note to print beside a finding taken under less than 40 % of normal load (NFPA 70B 2023: the
 * load is recorded and a lighter-load finding says so), or null when the load was enough.
 */
export function lightLoadNote({ measuredA, normalA }: { measuredA: number; normalA: number }): string | null {
  if (!takenUnderLightLoad({ measuredA, normalA })) return null;
  const pct = Math.round((100 * measuredA) / normalA);
  return `Taken at ${pct} % of normal load, under the 40 % NFPA 70B asks for: the rise at full load will be higher.`;
}
