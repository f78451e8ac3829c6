/**
 * Termination torque: unit conversion, UL 486A-486B fallback values, as-found / as-left judgement.
 *
 * Sources: NEC 110.14(D) (2020) — tighten to the value marked on the equipment or in its
 * instructions; the maker's value always wins. UL 486A-486B tightening torque table, as also
 * printed in NEC Informative Annex I, used only as a labelled fallback. Unit definitions:
 * 1 lbf = 4.448 221 615 260 5 N, 1 in = 0.0254 m (exact), so 1 N·m = 8.850 746 lbf-in.
 */
import type { ConductorSize } from '../domain';
import { finite, nonNegative, positive } from './guard';

export type TorqueUnit = 'N·m' | 'lbf-in' | 'lbf-ft';

const NEWTONS_PER_LBF = 4.4482216152605;
/** newton-metres in one of each unit */
const NM_PER_UNIT: Record<TorqueUnit, number> = {
  'N·m': 1,
  'lbf-in': NEWTONS_PER_LBF * 0.0254,
  'lbf-ft': NEWTONS_PER_LBF * 0.3048,
};

/**
 * Converts a torque between N·m, lbf-in and lbf-ft from the definitions of the pound-force and
 * the inch (NIST SP 811: 1 lbf = 4.448 221 615 260 5 N; 1 in = 0.0254 m), i.e.
 * 1 N·m = 8.850 746 lbf-in and 1 lbf-ft = 12 lbf-in.
 * @throws RangeError on a negative or non-finite value, or an unknown unit.
 */
export function convertTorque(value: number, from: TorqueUnit, to: TorqueUnit): number {
  nonNegative('torque', value);
  if (NM_PER_UNIT[from] === undefined || NM_PER_UNIT[to] === undefined) {
    throw new RangeError(`torque units are N·m, lbf-in or lbf-ft, got ${String(from)} → ${String(to)}`);
  }
  if (from === to) return value;
  return (value * NM_PER_UNIT[from]) / NM_PER_UNIT[to];
}

/**
 * UL 486A-486B (NEC Informative Annex I) Table I.1 columns, by wire size: slotted head No. 10 and
 * larger with slot ≤ 1.2 mm wide and ≤ 6.4 mm long; slotted wider or longer; split-bolt connectors
 * (hex head); other hex-head connectors. Slotted set screws take the slotted columns.
 */
export type WireScrewKind = 'slotted-small' | 'slotted-large' | 'split-bolt' | 'hex';
/**
 * Every screw kind: Table I.1 by wire size; Table I.2 slotted heads smaller than No. 10 (slot
 * under 1.2 mm wide: 'narrow', 1.2 mm and over: 'wide') by slot length; Table I.3 internal-drive
 * socket (hex socket set screws) by socket size across flats.
 */
export type ScrewKind = WireScrewKind | 'slotted-under-10-narrow' | 'slotted-under-10-wide' | 'socket';

/** [N·m, lbf-in] as printed (the two are each rounded, not exact conversions of one another). */
type Printed = readonly [number, number];

interface TorqueRow {
  sizes: readonly ConductorSize[];
  values: Record<WireScrewKind, Printed | null>;
}

/** UL 486A-486B tightening torque (NEC Informative Annex I), 14 AWG … 350 kcmil rows. */
const UL_486_TORQUE: readonly TorqueRow[] = [
  {
    sizes: ['14', '12', '10'], // printed row: 30–10 AWG
    values: { 'slotted-small': [2.3, 20], 'slotted-large': [4.0, 35], 'split-bolt': [9.0, 80], hex: [8.5, 75] },
  },
  {
    sizes: ['8'],
    values: { 'slotted-small': [2.8, 25], 'slotted-large': [4.5, 40], 'split-bolt': [9.0, 80], hex: [8.5, 75] },
  },
  {
    sizes: ['6', '4'],
    values: { 'slotted-small': [4.0, 35], 'slotted-large': [5.1, 45], 'split-bolt': [18.6, 165], hex: [12.4, 110] },
  },
  {
    sizes: ['3'],
    values: { 'slotted-small': [4.0, 35], 'slotted-large': [5.6, 50], 'split-bolt': [31.1, 275], hex: [16.9, 150] },
  },
  {
    sizes: ['2'],
    values: { 'slotted-small': [4.5, 40], 'slotted-large': [5.6, 50], 'split-bolt': [31.1, 275], hex: [16.9, 150] },
  },
  {
    sizes: ['1'],
    values: { 'slotted-small': null, 'slotted-large': [5.6, 50], 'split-bolt': [31.1, 275], hex: [16.9, 150] },
  },
  {
    sizes: ['1/0', '2/0'],
    values: { 'slotted-small': null, 'slotted-large': [5.6, 50], 'split-bolt': [43.5, 385], hex: [20.3, 180] },
  },
  {
    sizes: ['3/0', '4/0'],
    values: { 'slotted-small': null, 'slotted-large': [5.6, 50], 'split-bolt': [56.5, 500], hex: [28.2, 250] },
  },
  {
    sizes: ['250', '300', '350'],
    values: { 'slotted-small': null, 'slotted-large': [5.6, 50], 'split-bolt': [73.4, 650], hex: [36.7, 325] },
  },
];

export interface FallbackTorque {
  lbfIn: number;
  nm: number;
  basis: 'UL 486A-486B fallback';
}

/** Table I.2 slot lengths, mm ('<4': less than 4 mm). */
export type SlotLengthMm = '<4' | '4' | '4.8' | '5.5' | '6.4';

/**
 * UL 486A-486B Table I.2 (NEC Informative Annex I): slotted-head screws smaller than No. 10, for
 * 8 AWG and smaller conductors, [slot under 1.2 mm wide, 1.2 mm and wider], [N·m, lbf-in] as
 * printed — seen in a published copy of Annex I. Longer slots (7.1 mm and over) are not on file.
 */
const UL_486_SMALL_SLOTTED: Record<SlotLengthMm, readonly [Printed, Printed]> = {
  '<4': [[0.79, 7], [1.0, 9]],
  '4': [[0.79, 7], [1.4, 12]],
  '4.8': [[0.79, 7], [1.4, 12]],
  '5.5': [[0.79, 7], [1.4, 12]],
  '6.4': [[1.0, 9], [1.4, 12]],
};
const SMALL_SCREW_WIRES: readonly ConductorSize[] = ['14', '12', '10', '8'];

/**
 * Tightening torque from the UL 486A-486B tables (NEC Informative Annex I) for a wire size and
 * screw kind — a fallback only when the maker gives no value (NEC 110.14(D)). Table I.1 by wire size;
 * slotted screws smaller than No. 10 (Table I.2, 8 AWG and smaller only) by `screwSize` = slot
 * length; socket (Table I.3) by `screwSize` = size across flats. Null where the tables have no entry
 * (small slotted screws on 1 AWG and larger, a size not on file, no slot length or socket size given).
 */
export function fallbackTorque({
  size,
  screw,
  screwSize,
}: {
  size: ConductorSize;
  screw: ScrewKind;
  screwSize?: string | null;
}): FallbackTorque | null {
  if (screw === 'socket') {
    return screwSize ? fallbackSocketTorque(screwSize as SocketAcrossFlatsIn) : null;
  }
  if (screw === 'slotted-under-10-narrow' || screw === 'slotted-under-10-wide') {
    if (!SMALL_SCREW_WIRES.includes(size) || !screwSize) return null;
    const row = UL_486_SMALL_SLOTTED[screwSize as SlotLengthMm];
    if (row === undefined) return null;
    const printed = row[screw === 'slotted-under-10-narrow' ? 0 : 1];
    return { nm: printed[0], lbfIn: printed[1], basis: 'UL 486A-486B fallback' };
  }
  const row = UL_486_TORQUE.find((r) => r.sizes.includes(size));
  const printed = row?.values[screw] ?? null;
  if (printed === null) return null;
  return { nm: printed[0], lbfIn: printed[1], basis: 'UL 486A-486B fallback' };
}

/** Internal-drive socket sizes across flats, inches, in the UL 486A-486B table. */
export type SocketAcrossFlatsIn = '1/8' | '5/32' | '3/16' | '7/32' | '1/4' | '5/16' | '3/8' | '1/2' | '9/16';

const SOCKET_LBF_IN: Record<SocketAcrossFlatsIn, number> = {
  '1/8': 45,
  '5/32': 100,
  '3/16': 120,
  '7/32': 150,
  '1/4': 200,
  '5/16': 275,
  '3/8': 375,
  '1/2': 500,
  '9/16': 600,
};

/**
 * Tightening torque for internal-drive socket-head screws by socket size across flats, UL 486A-486B
 * table (NEC Informative Annex I); the table prints lbf-in only, N·m here is converted.
 * A fallback only when the maker gives no value.
 */
export function fallbackSocketTorque(acrossFlatsIn: SocketAcrossFlatsIn): FallbackTorque | null {
  const lbfIn = SOCKET_LBF_IN[acrossFlatsIn];
  if (lbfIn === undefined) return null;
  return { lbfIn, nm: convertTorque(lbfIn, 'lbf-in', 'N·m'), basis: 'UL 486A-486B fallback' };
}

export type TorqueJudgement = 'ok' | 'loose' | 'over';

export interface TorqueVerdictInput {
  /** the maker's (or the fallback) specified torque, in `unit` */
  specified: number;
  /** torque found before re-tightening, in `unit` */
  asFound?: number | null;
  /** torque left after the work, in `unit` */
  asLeft: number;
  unit: TorqueUnit;
  /** allowed deviation from specified, ±%; 10 by default [CP] */
  tolerancePct?: number;
  /** wire size and screw kind, to compare the specified value with the UL 486A-486B table */
  size?: ConductorSize;
  screw?: ScrewKind;
  /** slot length (slotted smaller than No. 10) or socket size across flats (socket) */
  screwSize?: string | null;
}

export interface TorqueVerdict {
  asFound: TorqueJudgement | null;
  asLeft: TorqueJudgement;
  warnings: string[];
  /** the UL 486A-486B value for size and screw, when both are given and the table has one */
  fallback: FallbackTorque | null;
}

/**
 * A specified value this many times the UL 486A-486B value or more (40 % above) draws a warning
 * to check the maker's figure before tightening [CP, our threshold]: a small screw into a soft lug
 * can strip. The maker's value still governs.
 */
export const TORQUE_FAR_ABOVE_TABLE_FACTOR = 1.4;

/**
 * The warning to show before tightening when a specified value is 40 % or more above the UL
 * 486A-486B value for that screw and wire ({@link TORQUE_FAR_ABOVE_TABLE_FACTOR} [CP]); null when
 * it is not, or the tables have no value for the screw and wire given. The maker's value still governs.
 * @throws RangeError when specified is not a finite number > 0.
 */
export function makerValueWarning({
  specified,
  unit,
  size,
  screw,
  screwSize,
}: {
  specified: number;
  unit: TorqueUnit;
  size?: ConductorSize | null;
  screw?: ScrewKind | null;
  screwSize?: string | null;
}): string | null {
  positive('specified torque', specified);
  if (!size || !screw) return null;
  const table = fallbackTorque({ size, screw, screwSize: screwSize ?? null });
  if (table === null) return null;
  const specifiedLbfIn = convertTorque(specified, unit, 'lbf-in');
  if (specifiedLbfIn < TORQUE_FAR_ABOVE_TABLE_FACTOR * table.lbfIn - 1e-9) return null;
  const abovePct = Math.round((100 * (specifiedLbfIn - table.lbfIn)) / table.lbfIn);
  return (
    `Check the maker\u2019s value: ${abovePct} % above the UL 486A-486B value for this screw ` +
    `(${round(specified)} ${unit} against ${table.lbfIn} lbf-in, ${table.nm} N·m, for this screw and wire). ` +
    'Confirm it before tightening: too much can strip a small screw or crush a soft lug. Where the ' +
    'maker\u2019s instructions confirm it, their value governs.'
  );
}

/**
 * Judges as-found and as-left torque against the specified value (NEC 110.14(D): the maker's value
 * governs). The ±10 % default window is common practice [CP], not a published limit — it is a
 * setting. Below the window is 'loose', above it 'over'; the window's edges are 'ok'.
 * Warns, before tightening, when the specified value is 40 % or more above the UL 486A-486B value
 * for that screw and wire ({@link TORQUE_FAR_ABOVE_TABLE_FACTOR}), and when the as-left value is out.
 * @throws RangeError when specified is not a finite number > 0, asFound / asLeft is negative or
 * not a number, or tolerancePct is negative or not a number.
 */
export function torqueVerdict(input: TorqueVerdictInput): TorqueVerdict {
  const { specified, asLeft, unit, size, screw } = input;
  const tolerancePct = input.tolerancePct ?? 10;
  positive('specified torque', specified);
  nonNegative('as-left torque', asLeft);
  if (input.asFound !== undefined && input.asFound !== null) nonNegative('as-found torque', input.asFound);
  nonNegative('tolerancePct', finite('tolerancePct', tolerancePct));
  const judge = (value: number): TorqueJudgement => {
    const deviationPct = (100 * (value - specified)) / specified;
    // a hair of slack so a reading exactly on the edge is not lost to rounding
    if (deviationPct < -tolerancePct - 1e-9) return 'loose';
    if (deviationPct > tolerancePct + 1e-9) return 'over';
    return 'ok';
  };
  const warnings: string[] = [];
  const fallback =
    size !== undefined && screw !== undefined ? fallbackTorque({ size, screw, screwSize: input.screwSize ?? null }) : null;
  const makerCheck = makerValueWarning({ specified, unit, size, screw, screwSize: input.screwSize ?? null });
  if (makerCheck !== null) warnings.push(makerCheck);
  const asLeftJudgement = judge(asLeft);
  if (asLeftJudgement !== 'ok') {
    warnings.push(
      `As left, ${round(asLeft)} ${unit} is ${asLeftJudgement === 'loose' ? 'below' : 'above'} the ` +
        `±${tolerancePct} % window around ${round(specified)} ${unit}: set it again with a calibrated tool.`,
    );
  }
  const asFound = input.asFound ?? null;
  return {
    asFound: asFound === null ? null : judge(asFound),
    asLeft: asLeftJudgement,
    warnings,
    fallback,
  };
}

function round(value: number): number {
  return Math.round(value * 100) / 100;
}
