/**
 * Conductor ampacity and the overcurrent-protection rules that go with it.
 *
 * Sources: NFPA 70 (NEC) Table 310.16 (numbered 310.15(B)(16) in 2017), 2014/2017 text — the
 * 2020/2023 editions are believed unchanged for these rows (from memory); 240.4(B), 240.4(D),
 * 240.6(A) (2023 list), 110.14(C).
 */
import { conductorSizeLabel } from '../domain';
import type { ConductorMaterial, ConductorSize, InsulationTempC } from '../domain';
import { positive } from './guard';
import { ambientCorrectionFactor, bundlingAdjustmentFactor } from './corrections';

/** [60 °C, 75 °C, 90 °C] allowable ampacity, A */
type AmpacityRow = readonly [number, number, number];

/**
 * NEC Table 310.16 (2014/2017 text): not more than three current-carrying conductors in raceway,
 * cable or earth, 30 °C ambient; columns 60 / 75 / 90 °C. Aluminium 14 AWG is not listed.
 */
const TABLE_310_16: Record<ConductorMaterial, Partial<Record<ConductorSize, AmpacityRow>>> = {
  Cu: {
    '14': [15, 20, 25],
    '12': [20, 25, 30],
    '10': [30, 35, 40],
    '8': [40, 50, 55],
    '6': [55, 65, 75],
    '4': [70, 85, 95],
    '3': [85, 100, 115],
    '2': [95, 115, 130],
    '1': [110, 130, 145],
    '1/0': [125, 150, 170],
    '2/0': [145, 175, 195],
    '3/0': [165, 200, 225],
    '4/0': [195, 230, 260],
    '250': [215, 255, 290],
    '300': [240, 285, 320],
    '350': [260, 310, 350],
    '400': [280, 335, 380],
    '500': [320, 380, 430],
  },
  Al: {
    '12': [15, 20, 25],
    '10': [25, 30, 35],
    '8': [35, 40, 45],
    '6': [40, 50, 55],
    '4': [55, 65, 75],
    '3': [65, 75, 85],
    '2': [75, 90, 100],
    '1': [85, 100, 115],
    '1/0': [100, 120, 135],
    '2/0': [115, 135, 150],
    '3/0': [130, 155, 175],
    '4/0': [150, 180, 205],
    '250': [170, 205, 230],
    '300': [195, 230, 260],
    '350': [210, 250, 280],
    '400': [225, 270, 305],
    '500': [260, 310, 350],
  },
};

const COLUMN: Record<InsulationTempC, 0 | 1 | 2> = { 60: 0, 75: 1, 90: 2 };

export interface AmpacityInput {
  size: ConductorSize;
  material: ConductorMaterial;
  tempC: InsulationTempC;
}

/**
 * Allowable ampacity in amperes from NEC Table 310.16 (2014/2017 text; 310.15(B)(16) in 2017),
 * ≤ 3 current-carrying conductors, 30 °C ambient, no adjustment or correction applied.
 * Returns null for a size/material the table does not list (aluminium 14 AWG) or an unknown size.
 */
export function ampacity({ size, material, tempC }: AmpacityInput): number | null {
  const row = TABLE_310_16[material]?.[size];
  const column = COLUMN[tempC];
  if (row === undefined || column === undefined) return null;
  return row[column];
}

/**
 * Small-conductor overcurrent limit, NEC 240.4(D) (2017–2023): copper 14 AWG 15 A, 12 AWG 20 A,
 * 10 AWG 30 A; aluminium (and copper-clad aluminium) 12 AWG 15 A, 10 AWG 25 A. Null where 240.4(D)
 * sets no limit (larger sizes; aluminium 14 AWG is not a branch-circuit size at all).
 * Article 430/440 motor and air-conditioning circuits are excepted by 240.4(G) (from memory).
 */
export function smallConductorLimitA(
  size: ConductorSize,
  material: ConductorMaterial,
): number | null {
  if (material === 'Cu') {
    if (size === '14') return 15;
    if (size === '12') return 20;
    if (size === '10') return 30;
    return null;
  }
  if (size === '12') return 15;
  if (size === '10') return 25;
  return null;
}

/**
 * Standard ampere ratings for fuses and inverse-time breakers, NEC 240.6(A) (2023 list).
 * Fuses also come in 1, 3, 6 and 10 A (see {@link FUSE_ONLY_RATINGS_A}); 601 A appears in 2017
 * material but not in 2023 summaries, so it is left out (unresolved in REFERENCES.md).
 */
export const STANDARD_RATINGS_A: readonly number[] = [
  15, 20, 25, 30, 35, 40, 45, 50, 60, 70, 80, 90, 100, 110, 125, 150, 175, 200, 225, 250, 300,
  350, 400, 450, 500, 600, 700, 800, 1000, 1200, 1600, 2000, 2500, 3000, 4000, 5000, 6000,
];

/** Additional standard fuse ratings, NEC 240.6(A) (2023). */
export const FUSE_ONLY_RATINGS_A: readonly number[] = [1, 3, 6, 10];

/**
 * The smallest NEC 240.6(A) (2023) standard rating at or above `amps`, or null above 6000 A.
 * @throws RangeError when amps is not a finite number > 0.
 */
export function nextStandardRatingA(amps: number): number | null {
  positive('amps', amps);
  for (const rating of STANDARD_RATINGS_A) if (rating >= amps) return rating;
  return null;
}

export interface ConductorCheckInput {
  /** breaker / fuse rating */
  ratingA: number;
  size: ConductorSize;
  material: ConductorMaterial;
  insulationTempC: InsulationTempC;
  /**
   * Temperature rating the terminations are listed and marked for; null or absent when not known,
   * and then NEC 110.14(C)(1) decides: (a) circuits rated 100 A or less, or 14–1 AWG conductors,
   * at 60 °C; (b) over 100 A and larger than 1 AWG at 75 °C.
   */
  terminalTempC?: InsulationTempC | null;
  /** ambient temperature where the conductors run, °C; absent or null → the table's 30 °C */
  ambientC?: number | null;
  /** current-carrying conductors in the raceway or cable; absent or null → three or fewer */
  currentCarrying?: number | null;
}

/** Conductor sizes 110.14(C)(1)(a) names: 14 AWG through 1 AWG. */
const SMALL_TERMINATION_SIZES: readonly ConductorSize[] = ['14', '12', '10', '8', '6', '4', '3', '2', '1'];

/**
 * The termination temperature to use, NEC 110.14(C)(1) (2020/2023): the marked rating when known;
 * unknown → 60 °C for circuits ≤ 100 A or 14–1 AWG conductors ((a)), else 75 °C ((b)).
 */
export function terminationTempFor({
  ratingA,
  size,
  markedC,
}: {
  ratingA: number;
  size: ConductorSize;
  markedC: InsulationTempC | null | undefined;
}): { tempC: InsulationTempC; basis: string } {
  positive('ratingA', ratingA);
  if (markedC !== null && markedC !== undefined) {
    if (![60, 75, 90].includes(markedC)) throw new RangeError(`termination rating must be 60, 75 or 90 °C, got ${String(markedC)}`);
    return { tempC: markedC, basis: `terminations marked ${markedC} °C` };
  }
  if (ratingA <= 100 || SMALL_TERMINATION_SIZES.includes(size)) {
    return { tempC: 60, basis: 'termination rating not recorded: 60 °C for 100 A or less or 14–1 AWG, NEC 110.14(C)(1)(a)' };
  }
  return { tempC: 75, basis: 'termination rating not recorded: 75 °C over 100 A, NEC 110.14(C)(1)(b)' };
}

export interface ConductorCheck {
  /** the rating is allowed on this conductor */
  ok: boolean;
  /**
   * Largest device rating allowed on this conductor (ampacity, 240.4(B) next size up, then the
   * 240.4(D) cap), or null when the table has no ampacity for the conductor.
   */
  allowedA: number | null;
  /** why the check failed, in plain words; empty when ok */
  reasons: string[];
  /** temperature column used: the lower of insulation and terminal temperature (110.14(C)) */
  tempC: InsulationTempC;
  /** where the termination temperature came from (marked, or the 110.14(C)(1) rule) */
  terminationBasis: string;
  /**
   * ampacity the check uses: Table 310.16 at tempC; with a correction, the insulation column's
   * ampacity × the factors, no more than the termination column allows (110.14(C))
   */
  ampacityA: number | null;
  /** ambient × bundling factor applied (1 when neither is recorded) */
  correctionFactor: number;
  /** the factors in words (Table 310.15(B)(1), 310.15(C)(1)); null when none applied */
  correctionBasis: string | null;
  /** device rating the ampacity alone allows, with the 240.4(B) next size up where it applies */
  allowedByAmpacityA: number | null;
  /** 240.4(B) next standard size up was used */
  nextSizeUpApplied: boolean;
  /** the 240.4(D) limit for this conductor, if any */
  smallConductorLimitA: number | null;
  /** the rating exceeds what the ampacity (with 240.4(B)) allows */
  overAmpacity: boolean;
  /** the rating exceeds the 240.4(D) limit */
  overSmallConductorLimit: boolean;
}

/**
 * Is the conductor protected by a device of `ratingA`?
 *
 * - Ampacity from NEC Table 310.16 (2014/2017 text) at the lower of the insulation and terminal
 *   temperature ratings (NEC 110.14(C)); an unknown terminal rating follows 110.14(C)(1)
 *   ({@link terminationTempFor}): 60 °C at 100 A or less or for 14–1 AWG.
 * - NEC 240.4(B): where that ampacity is not a 240.6(A) standard rating, the next higher standard
 *   rating is allowed if it is ≤ 800 A (the multioutlet cord-and-plug exclusion is not modelled;
 *   exact conditions from memory).
 * - NEC 240.4(D) caps small conductors (14–10 AWG) regardless of ampacity.
 * @throws RangeError when ratingA is not a finite number > 0.
 */
export function conductorCheck(input: ConductorCheckInput): ConductorCheck {
  const { ratingA, size, material, insulationTempC } = input;
  const termination = terminationTempFor({ ratingA, size, markedC: input.terminalTempC });
  const terminalTempC = termination.tempC;
  const tempC = insulationTempC < terminalTempC ? insulationTempC : terminalTempC;
  const terminationBasis = termination.basis;
  const correction = correctedAmpacity(input, tempC);
  const ampacityA = correction.ampacityA;
  const limitA = smallConductorLimitA(size, material);
  const label = `${conductorSizeLabel(size)} ${material === 'Cu' ? 'copper' : 'aluminium'}`;
  const reasons: string[] = [];

  if (ampacityA === null) {
    reasons.push(
      correction.notAllowed ?? `NEC Table 310.16 lists no ampacity for ${label}; use a listed conductor size.`,
    );
    return {
      correctionFactor: correction.factor,
      correctionBasis: correction.basis,
      ok: false,
      allowedA: null,
      reasons,
      tempC,
      terminationBasis,
      ampacityA,
      allowedByAmpacityA: null,
      nextSizeUpApplied: false,
      smallConductorLimitA: limitA,
      overAmpacity: true,
      overSmallConductorLimit: limitA !== null && ratingA > limitA,
    };
  }

  let allowedByAmpacityA = ampacityA;
  let nextSizeUpApplied = false;
  if (!STANDARD_RATINGS_A.includes(ampacityA)) {
    const next = nextStandardRatingA(ampacityA);
    if (next !== null && next <= 800) {
      allowedByAmpacityA = next;
      nextSizeUpApplied = true;
    }
  }
  const allowedA = limitA === null ? allowedByAmpacityA : Math.min(allowedByAmpacityA, limitA);
  const overAmpacity = ratingA > allowedByAmpacityA;
  const overSmallConductorLimit = limitA !== null && ratingA > limitA;

  if (overAmpacity) {
    reasons.push(
      `${label} is good for ${round1(ampacityA)} A at ${tempC} °C (NEC Table 310.16` +
        `${correction.basis ? `, ${correction.basis}` : ''}; ${terminationBasis})` +
        (nextSizeUpApplied ? `, ${allowedByAmpacityA} A with the next size up (240.4(B))` : '') +
        `; a ${ratingA} A breaker is too big for it.`,
    );
  }
  if (overSmallConductorLimit) {
    reasons.push(
      `NEC 240.4(D) limits ${label} to a ${limitA} A breaker; this one is ${ratingA} A.`,
    );
  }
  return {
    correctionFactor: correction.factor,
    correctionBasis: correction.basis,
    ok: ratingA <= allowedA,
    allowedA,
    reasons,
    tempC,
    terminationBasis,
    ampacityA,
    allowedByAmpacityA,
    nextSizeUpApplied,
    smallConductorLimitA: limitA,
    overAmpacity,
    overSmallConductorLimit,
  };
}

function round1(x: number): number {
  return Math.round(x * 10) / 10;
}

/**
 * The ampacity after correction for ambient (Table 310.15(B)(1)) and adjustment for more than
 * three current-carrying conductors (Table 310.15(C)(1)). The factors apply to the insulation's own
 * column, and the result may not exceed the termination column's ampacity (110.14(C): higher-rated
 * insulation may be used for adjustment and correction, ending at the termination's column).
 * With neither recorded, this is Table 310.16 at `tempC` exactly as before.
 */
function correctedAmpacity(
  input: ConductorCheckInput,
  tempC: InsulationTempC,
): { ampacityA: number | null; factor: number; basis: string | null; notAllowed: string | null } {
  const { size, material, insulationTempC } = input;
  const atTermination = ampacity({ size, material, tempC });
  const hasAmbient = input.ambientC !== null && input.ambientC !== undefined;
  const hasCount = input.currentCarrying !== null && input.currentCarrying !== undefined;
  if (!hasAmbient && !hasCount) return { ampacityA: atTermination, factor: 1, basis: null, notAllowed: null };
  const parts: string[] = [];
  let factor = 1;
  if (hasAmbient) {
    const ambientC = input.ambientC as number;
    const f = ambientCorrectionFactor(ambientC, insulationTempC);
    if (f === null) {
      return {
        ampacityA: null,
        factor: 0,
        basis: `${ambientC} °C ambient`,
        notAllowed: `${insulationTempC} °C insulation may not be used at ${ambientC} °C ambient (NEC Table 310.15(B)(1)).`,
      };
    }
    factor *= f;
    if (f !== 1) parts.push(`× ${f} for ${ambientC} °C ambient, Table 310.15(B)(1)`);
  }
  if (hasCount) {
    const count = input.currentCarrying as number;
    const f = bundlingAdjustmentFactor(count);
    factor *= f;
    if (f !== 1) parts.push(`× ${f} for ${count} current-carrying conductors, Table 310.15(C)(1)`);
  }
  const atInsulation = ampacity({ size, material, tempC: insulationTempC });
  if (atInsulation === null || atTermination === null) return { ampacityA: null, factor, basis: null, notAllowed: null };
  const corrected = atInsulation * factor;
  return {
    ampacityA: Math.min(corrected, atTermination),
    factor,
    basis: parts.length > 0 ? `${atInsulation} A at ${insulationTempC} °C ${parts.join(' ')}` : null,
    notAllowed: null,
  };
}
