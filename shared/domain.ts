/**
 * Domain vocabulary shared by client, server and the computations.
 * Trade terms as the trade uses them (NEC / NFPA 70 wording); identifiers are ours.
 */

/** Electrical systems a panel can be on (DESIGN.md §3). */
export const SYSTEMS = [
  '120/240V-1ph-3w',
  '208Y/120V-3ph-4w',
  '480Y/277V-3ph-4w',
  '240V-3ph-3w-delta',
  '480V-3ph-3w',
  '120/240V-3ph-4w-highleg',
] as const;
export type PanelSystem = (typeof SYSTEMS)[number];

export interface SystemInfo {
  label: string;
  /** number of phases on the bus (1 = split-phase single-phase, 3 = three-phase) */
  phases: 1 | 3;
  /** line-to-line voltage */
  lineV: number;
  /** line-to-neutral voltage, null for 3-wire systems without a neutral */
  neutralV: number | null;
}

export const SYSTEM_INFO: Record<PanelSystem, SystemInfo> = {
  '120/240V-1ph-3w': { label: '120/240 V 1φ 3W', phases: 1, lineV: 240, neutralV: 120 },
  '208Y/120V-3ph-4w': { label: '208Y/120 V 3φ 4W', phases: 3, lineV: 208, neutralV: 120 },
  '480Y/277V-3ph-4w': { label: '480Y/277 V 3φ 4W', phases: 3, lineV: 480, neutralV: 277 },
  '240V-3ph-3w-delta': { label: '240 V 3φ 3W delta', phases: 3, lineV: 240, neutralV: null },
  '480V-3ph-3w': { label: '480 V 3φ 3W', phases: 3, lineV: 480, neutralV: null },
  '120/240V-3ph-4w-highleg': {
    label: '120/240 V 3φ 4W high-leg delta',
    phases: 3,
    lineV: 240,
    neutralV: 120,
  },
};

export type Phase = 'A' | 'B' | 'C';

/** Conductor sizes, NEC Table 310.16 rows from 14 AWG to 500 kcmil. */
export const CONDUCTOR_SIZES = [
  '14', '12', '10', '8', '6', '4', '3', '2', '1',
  '1/0', '2/0', '3/0', '4/0',
  '250', '300', '350', '400', '500',
] as const;
export type ConductorSize = (typeof CONDUCTOR_SIZES)[number];

/** "12 AWG", "250 kcmil" */
export function conductorSizeLabel(size: ConductorSize): string {
  return Number(size) >= 250 ? `${size} kcmil` : `${size} AWG`;
}

export const MATERIALS = ['Cu', 'Al'] as const;
export type ConductorMaterial = (typeof MATERIALS)[number];

export const INSULATION_TEMPS_C = [60, 75, 90] as const;

/** Where a panel's available fault current was taken from (NEC 110.24 label, the utility, an engineer's study). */
export const FAULT_SOURCES = ['label', 'utility', 'engineer'] as const;
export type FaultSource = (typeof FAULT_SOURCES)[number];
export const FAULT_SOURCE_LABELS: Record<FaultSource, string> = { label: 'label', utility: 'utility', engineer: 'engineer' };
/** NEC 220.87: a year of demand data, or a 30-day recording of 15-minute averages. */
export const DEMAND_BASES = ['year', '30-day'] as const;
export type DemandBasisKind = (typeof DEMAND_BASES)[number];
export const DEMAND_BASIS_LABELS: Record<DemandBasisKind, string> = { year: '12 months', '30-day': '30 days recorded' };
export const DEMAND_UNITS = ['A', 'kVA'] as const;
export type DemandUnit = (typeof DEMAND_UNITS)[number];
export type InsulationTempC = (typeof INSULATION_TEMPS_C)[number];

export const PANEL_KINDS = ['panelboard', 'switchboard', 'load-centre'] as const;
export type PanelKind = (typeof PANEL_KINDS)[number];

export const BREAKER_TYPES = [
  'standard', 'gfci', 'afci', 'dual-function', 'shunt-trip', 'surge', 'other',
] as const;
export type BreakerType = (typeof BREAKER_TYPES)[number];

export const LOAD_KINDS = [
  'lighting', 'receptacles', 'motor', 'hvac', 'appliance', 'feeder', 'other',
] as const;
export type LoadKind = (typeof LOAD_KINDS)[number];

/** in-use: a breaker feeding a load; spare: a breaker with nothing on it; space: no breaker. */
export const CIRCUIT_STATUSES = ['in-use', 'spare', 'space'] as const;
export type CircuitStatus = (typeof CIRCUIT_STATUSES)[number];

export const ROLES = ['admin', 'electrician', 'inspector', 'owner'] as const;
export type Role = (typeof ROLES)[number];

/** NFPA 70B (2023) equipment condition */
export const EQUIPMENT_CONDITIONS = [1, 2, 3] as const;
export type EquipmentCondition = (typeof EQUIPMENT_CONDITIONS)[number];
