/**
 * Ampacity correction for ambient temperature and adjustment for more than three current-carrying
 * conductors.
 *
 * Sources (NEC 2020/2023 numbering; 2017 numbers them 310.15(B)(2)(a) and 310.15(B)(3)(a)):
 * - Table 310.15(B)(1), ambient temperature correction on a 30 °C basis [M — the table is from
 *   memory; every entry agrees, to two decimals, with the equation form of 310.15(B)
 *   √((Tc − Ta)/(Tc − 30)) at the top of its range, which is [V] and is the tests' oracle].
 * - Table 310.15(C)(1), adjustment for more than three current-carrying conductors [V].
 */
import type { InsulationTempC } from '../domain';
import { finite, wholeFrom } from './guard';

/** [upper end of the ambient range °C, factor at 60, 75, 90 °C insulation]; null = not allowed. */
const AMBIENT_TABLE: readonly [number, number | null, number | null, number | null][] = [
  [10, 1.29, 1.2, 1.15],
  [15, 1.22, 1.15, 1.12],
  [20, 1.15, 1.11, 1.08],
  [25, 1.08, 1.05, 1.04],
  [30, 1.0, 1.0, 1.0],
  [35, 0.91, 0.94, 0.96],
  [40, 0.82, 0.88, 0.91],
  [45, 0.71, 0.82, 0.87],
  [50, 0.58, 0.75, 0.82],
  [55, 0.41, 0.67, 0.76],
  [60, null, 0.58, 0.71],
  [65, null, 0.47, 0.65],
  [70, null, 0.33, 0.58],
  [75, null, null, 0.5],
  [80, null, null, 0.41],
  [85, null, null, 0.29],
];

const COLUMN: Record<InsulationTempC, 1 | 2 | 3> = { 60: 1, 75: 2, 90: 3 };

/**
 * The Table 310.15(B)(1) factor for an ambient temperature and an insulation rating, or null where
 * the conductor may not be used at all (the ambient reaches its rating). Ambient is rounded up to the
 * whole degree, so 30.5 °C reads the 31–35 °C row (the safe side).
 * @throws RangeError on a non-finite ambient or one below −40 °C.
 */
export function ambientCorrectionFactor(ambientC: number, insulationTempC: InsulationTempC): number | null {
  finite('ambientC', ambientC);
  if (ambientC < -40) throw new RangeError(`ambientC must be −40 °C or more, got ${ambientC}`);
  const whole = Math.ceil(ambientC);
  const row = AMBIENT_TABLE.find(([top]) => whole <= top);
  if (!row) return null;
  return row[COLUMN[insulationTempC]];
}

/**
 * The Table 310.15(C)(1) adjustment for the number of current-carrying conductors in a raceway or
 * cable: 1 for three or fewer, 0.8 for 4–6, 0.7 for 7–9, 0.5 for 10–20, 0.45 for 21–30, 0.4 for
 * 31–40, 0.35 for 41 and more.
 * @throws RangeError when the count is not a whole number ≥ 1.
 */
export function bundlingAdjustmentFactor(currentCarrying: number): number {
  wholeFrom('currentCarrying', currentCarrying, 1);
  if (currentCarrying <= 3) return 1;
  if (currentCarrying <= 6) return 0.8;
  if (currentCarrying <= 9) return 0.7;
  if (currentCarrying <= 20) return 0.5;
  if (currentCarrying <= 30) return 0.45;
  if (currentCarrying <= 40) return 0.4;
  return 0.35;
}
