/**
 * Voltage drop from NFPA 70 (NEC) Chapter 9 Table 8 DC resistances.
 *
 * Table 8 (2017–2023), ohms per 1 000 ft at 75 °C, uncoated stranded copper and stranded
 * aluminium. Entries REFERENCES.md lists as seen are unmarked; every other entry is "from memory"
 * (checked only for consistency with K × 1 000 / circular mils, K ≈ 12.9 Cu, 21.2 Al).
 * 210.19(A) Informational Note: 3 % on a branch circuit, 5 % feeder + branch — advice, not a rule.
 */
import type { ConductorMaterial, ConductorSize } from '../domain';
import { nonNegative, positive } from './guard';

/** NEC Chapter 9 Table 8, Ω/kft at 75 °C. Aluminium 14 AWG is left out (not a listed size here). */
export const TABLE_8_OHM_PER_KFT: Record<ConductorMaterial, Partial<Record<ConductorSize, number>>> = {
  Cu: {
    '14': 3.14,
    '12': 1.98,
    '10': 1.24,
    '8': 0.778,
    '6': 0.491,
    '4': 0.308,
    '3': 0.245, // from memory
    '2': 0.194,
    '1': 0.154, // from memory
    '1/0': 0.122,
    '2/0': 0.0967, // from memory
    '3/0': 0.0766, // from memory
    '4/0': 0.0608,
    '250': 0.0515,
    '300': 0.0429, // from memory
    '350': 0.0367, // from memory
    '400': 0.0321, // from memory
    '500': 0.0258,
  },
  Al: {
    '12': 3.25,
    '10': 2.04, // from memory
    '8': 1.28, // from memory
    '6': 0.808, // from memory
    '4': 0.508, // from memory
    '3': 0.403, // from memory
    '2': 0.319, // from memory
    '1': 0.253, // from memory
    '1/0': 0.201, // from memory
    '2/0': 0.159, // from memory
    '3/0': 0.126, // from memory
    '4/0': 0.1,
    '250': 0.0847, // from memory
    '300': 0.0707, // from memory
    '350': 0.0605, // from memory
    '400': 0.0529, // from memory
    '500': 0.0424,
  },
};

/**
 * DC resistance, Ω per 1 000 ft at 75 °C, NEC Chapter 9 Table 8 (2017–2023); null if not on file.
 */
export function resistanceOhmPerKft(size: ConductorSize, material: ConductorMaterial): number | null {
  return TABLE_8_OHM_PER_KFT[material]?.[size] ?? null;
}

export interface VoltageDropInput {
  size: ConductorSize;
  material: ConductorMaterial;
  /** load current */
  amps: number;
  /** one-way length of the circuit */
  lengthFt: number;
  /** the voltage the drop is a percentage of (1-pole: line-to-neutral; multi-pole: line-to-line) */
  volts: number;
  /** 1 for a single-phase (two-wire or line-to-line) circuit, 3 for a three-phase circuit */
  phases: 1 | 3;
}

export interface VoltageDrop {
  volts: number;
  percent: number;
  /** Table 8 resistance used */
  ohmPerKft: number;
}

/**
 * Voltage drop with NEC Chapter 9 Table 8 (2017–2023) resistances: VD = 2·R·I·L / 1000 single-phase
 * (out and back), √3·R·I·L / 1000 three-phase, L one-way in feet, R in Ω/kft. Resistance only
 * (reactance ignored, good for small conductors at unity power factor [CP]). Null for a size with
 * no Table 8 entry on file.
 * @throws RangeError when volts is not > 0 or amps / length are negative, or any is not a finite number.
 */
export function voltageDrop(input: VoltageDropInput): VoltageDrop | null {
  const { size, material, amps, lengthFt, volts, phases } = input;
  positive('volts', volts);
  nonNegative('amps', amps);
  nonNegative('lengthFt', lengthFt);
  const ohmPerKft = resistanceOhmPerKft(size, material);
  if (ohmPerKft === null) return null;
  const factor = phases === 3 ? Math.sqrt(3) : 2;
  const drop = (factor * ohmPerKft * amps * lengthFt) / 1000;
  return { volts: drop, percent: (100 * drop) / volts, ohmPerKft };
}

/**
 * Branch-circuit voltage drop above which a warning is shown: 3 %, NEC 210.19(A) Informational
 * Note (2017–2020; advice, not a requirement).
 */
export const BRANCH_VOLTAGE_DROP_ADVICE_PCT = 3;
