/**
 * Loads: the 125 % continuous-load rule, panel phase loading and imbalance, NEC 220 demand factors.
 *
 * Sources: NFPA 70 (NEC) 210.20(A) / 215.3 (2017–2023), Table 220.42 and Table 220.44 (2017–2020
 * text), NEMA MG 1 definition of percent unbalance (clause 14.36, from memory for the number).
 */
import { SYSTEM_INFO } from '../domain';
import type { LoadKind, PanelSystem, Phase } from '../domain';
import { occupiedPositions, phaseOf } from './layout';
import { nonNegative, positive } from './guard';

/**
 * The names of the panel's load figures, with their rule, for every screen and report that shows
 * them: the sizing figure is larger than the connected one (it counts continuous loads at 125 %),
 * so neither may be called "demand" (NEC 220 demand factors are not applied here).
 */
export const PANEL_LOAD_FIGURES = {
  connected: {
    label: 'Connected load',
    rule: 'the loads on the schedule added up, as recorded (not measured)',
  },
  sizing: {
    label: 'Sizing load',
    rule:
      '125 % of continuous + non-continuous loads, the minimum for the overcurrent device and conductors ' +
      '(NEC 210.19(A)(1), 210.20(A), 215.2(A)(1), 215.3)',
  },
} as const;

export interface RequiredOcpdInput {
  continuousA: number;
  noncontinuousA: number;
}

/**
 * Minimum overcurrent device rating: noncontinuous load + 125 % of continuous load.
 * NEC 210.20(A) (branch circuits) and 215.3 (feeders), 2017–2023; does not apply to an assembly
 * listed for 100 % operation. The same figure is the minimum conductor ampacity, 210.19(A)(1).
 * @throws RangeError when either load is negative or not a finite number.
 */
export function requiredOcpdA({ continuousA, noncontinuousA }: RequiredOcpdInput): number {
  nonNegative('continuousA', continuousA);
  nonNegative('noncontinuousA', noncontinuousA);
  return noncontinuousA + 1.25 * continuousA;
}

/**
 * Percent unbalance by the NEMA MG 1 definition: 100 × (largest deviation from the average) /
 * average. Used here on phase currents or voltages alike. All zeros (or no values) → 0.
 * Worked examples: 462/463/455 → 1.09 %; 460/467/450 → 1.96 %.
 * @throws RangeError on a negative or non-finite value.
 */
export function unbalancePct(values: readonly number[]): number {
  if (values.length === 0) return 0;
  for (const v of values) {
    if (!Number.isFinite(v) || v < 0) {
      throw new RangeError(`unbalance needs values ≥ 0, got ${v}`);
    }
  }
  const average = values.reduce((sum, v) => sum + v, 0) / values.length;
  if (average === 0) return 0;
  const maxDeviation = Math.max(...values.map((v) => Math.abs(v - average)));
  return (100 * maxDeviation) / average;
}

/**
 * The voltage from a phase conductor to neutral.
 * - Systems with a neutral: SYSTEM_INFO.neutralV — except the high leg of a 120/240 V 3φ 4W
 *   delta, which NEC 408.3(E)(1) places on phase B (from memory) and which sits at
 *   lineV × √3 / 2 ≈ 208 V to neutral.
 * - 3-wire systems with no neutral: the equivalent lineV / √3, so that a balanced 3φ load split
 *   over three phases gives the right line current.
 */
export function phaseToNeutralV(system: PanelSystem, phase: Phase): number {
  const info = SYSTEM_INFO[system];
  if (system === '120/240V-3ph-4w-highleg' && phase === 'B') return (info.lineV * Math.sqrt(3)) / 2;
  return info.neutralV ?? info.lineV / Math.sqrt(3);
}

export interface CircuitCurrentInput {
  system: PanelSystem;
  position: number;
  poles: number;
  loadVA: number;
}

/**
 * Line current drawn by one circuit's load, A: 1-pole VA / phase-to-neutral volts
 * ({@link phaseToNeutralV}); 2-pole (line-to-line single-phase load) VA / lineV; 3-pole
 * VA / (√3 × lineV). Ohm's-law power relations for single- and three-phase loads (any
 * electrical handbook). Null for a 3-pole on a single-phase system or poles outside 1–3.
 * @throws RangeError on a negative or non-finite load, or a position that is not a whole number ≥ 1.
 */
export function circuitCurrentA({ system, position, poles, loadVA }: CircuitCurrentInput): number | null {
  nonNegative('loadVA', loadVA);
  const info = SYSTEM_INFO[system];
  if (poles === 1) return loadVA / phaseToNeutralV(system, phaseOf(system, position));
  if (poles === 2) return loadVA / info.lineV;
  if (poles === 3 && info.phases === 3) return loadVA / (Math.sqrt(3) * info.lineV);
  return null;
}

export interface PanelLoadPanel {
  system: PanelSystem;
  /** main breaker rating; omit or null for main lugs only */
  mainRatingA?: number | null;
  busRatingA: number;
}

export interface PanelLoadCircuit {
  position: number;
  poles: number;
  /** connected load; null counts as 0 */
  loadVA: number | null;
  continuous: boolean;
  loadKind: LoadKind;
}

export interface PhaseLoad {
  /** connected VA on this phase (multi-pole loads split evenly over their poles) */
  va: number;
  /** connected line current on this phase */
  amps: number;
  /** sizing VA on this phase (continuous × 1.25 + non-continuous) */
  sizingVA: number;
  /** sizing line current on this phase (continuous × 1.25 + non-continuous) */
  sizingA: number;
}

export interface PanelLoad {
  phases: { A: PhaseLoad; B: PhaseLoad; C?: PhaseLoad };
  /** connected load, VA */
  totalVA: number;
  /** NEMA MG 1 unbalance of the phase amps, % */
  imbalancePct: number;
  /** sizing load: continuous at 125 % + noncontinuous at 100 %, VA (NEC 210.20(A), 215.3) */
  sizingVA: number;
  /** worst phase sizing amps / min(main, bus) × 100; null when no positive rating is given */
  utilisationPct: number | null;
  /** the rating utilisation is measured against: min(main ?? bus, bus) */
  capacityA: number | null;
  /** connected VA by load kind */
  byLoadKindVA: Partial<Record<LoadKind, number>>;
  /** circuits left out: poles not 1–3, a 3-pole on 1φ, or a position < 1 (panelLayout says why) */
  skippedCircuits: number;
}

/**
 * Connected and sizing loading of a panel, per phase ({@link PANEL_LOAD_FIGURES}).
 *
 * Conventions (documented because panel schedules differ):
 * - Phase of every occupied position from {@link phaseOf}; a multi-pole load's VA is split evenly
 *   over its poles for the per-phase VA.
 * - Per-phase amps are the sum of the line currents of the circuits on that phase
 *   ({@link circuitCurrentA}). For 1-pole and 3-pole loads, and every load on a 1φ 120/240 V
 *   panel, that is phase VA / line-to-neutral volts (1φ: phase VA / 120; for 3-pole loads to
 *   within the rounding of nominal voltages, 208 ≈ 120 × √3). For a 2-pole
 *   line-to-line load on a three-phase panel it is VA / lineV on each of its two lines (what a
 *   clamp meter reads for that load), 2/√3 more than (VA/2)/V_LN. 3-wire systems without a
 *   neutral use lineV / √3 as the phase voltage. Arithmetic sums ignore phase angle, which errs
 *   high [CP].
 * - imbalancePct: NEMA MG 1 definition applied to the phase amps. No standard limits panel
 *   current imbalance; flagging more than about 10–20 % is common practice [CP].
 * - sizingVA: continuous loads at 125 % plus noncontinuous at 100 %, the NEC 215.3 / 210.20(A)
 *   sizing rule (2017–2023); it is not a demand load: NEC 220 demand factors are not applied here (see
 *   {@link lightingDemandVA}, {@link receptacleDemandVA}).
 * - utilisationPct: worst phase sizing amps over min(main rating ?? bus rating, bus rating).
 * Zero load gives zeros, never NaN.
 * @throws RangeError when the bus or main rating is not a finite number > 0, or a circuit's load
 * is negative or not a finite number.
 */
export function panelLoad(panel: PanelLoadPanel, circuits: readonly PanelLoadCircuit[]): PanelLoad {
  const { system, busRatingA } = panel;
  positive('busRatingA', busRatingA);
  if (panel.mainRatingA !== undefined && panel.mainRatingA !== null) positive('mainRatingA', panel.mainRatingA);
  for (const c of circuits) if (c.loadVA !== null) nonNegative(`loadVA at position ${c.position}`, c.loadVA);
  const threePhase = SYSTEM_INFO[system].phases === 3;
  const phaseNames: Phase[] = threePhase ? ['A', 'B', 'C'] : ['A', 'B'];
  const acc: Record<Phase, PhaseLoad> = {
    A: { va: 0, amps: 0, sizingVA: 0, sizingA: 0 },
    B: { va: 0, amps: 0, sizingVA: 0, sizingA: 0 },
    C: { va: 0, amps: 0, sizingVA: 0, sizingA: 0 },
  };
  const byLoadKindVA: Partial<Record<LoadKind, number>> = {};
  let totalVA = 0;
  let sizingVA = 0;
  let skippedCircuits = 0;

  for (const circuit of circuits) {
    const { position, poles } = circuit;
    const loadVA = circuit.loadVA ?? 0;
    const validPoles = Number.isInteger(poles) && poles >= 1 && poles <= 3 && (threePhase || poles < 3);
    if (!validPoles || !Number.isInteger(position) || position < 1) {
      skippedCircuits += 1;
      continue;
    }
    const factor = circuit.continuous ? 1.25 : 1;
    const lineA = circuitCurrentA({ system, position, poles, loadVA }) ?? 0;
    for (const p of occupiedPositions(position, poles)) {
      const phase = phaseOf(system, p);
      acc[phase].va += loadVA / poles;
      acc[phase].amps += lineA;
      acc[phase].sizingVA += (factor * loadVA) / poles;
      acc[phase].sizingA += factor * lineA;
    }
    totalVA += loadVA;
    sizingVA += factor * loadVA;
    byLoadKindVA[circuit.loadKind] = (byLoadKindVA[circuit.loadKind] ?? 0) + loadVA;
  }

  const imbalancePct = unbalancePct(phaseNames.map((phase) => acc[phase].amps));
  const main = panel.mainRatingA ?? busRatingA;
  const capacity = Math.min(main, busRatingA);
  const capacityA = Number.isFinite(capacity) && capacity > 0 ? capacity : null;
  const worstSizingA = Math.max(...phaseNames.map((phase) => acc[phase].sizingA));
  const utilisationPct = capacityA === null ? null : (100 * worstSizingA) / capacityA;

  return {
    phases: threePhase ? { A: acc.A, B: acc.B, C: acc.C } : { A: acc.A, B: acc.B },
    totalVA,
    imbalancePct,
    sizingVA,
    utilisationPct,
    capacityA,
    byLoadKindVA,
    skippedCircuits,
  };
}

/** Occupancies with their own row in NEC Table 220.42. */
export type LightingOccupancy = 'dwelling' | 'hotel' | 'warehouse' | 'hospital' | 'other';

/** [upper bound of the step in VA (Infinity for the rest), demand factor] */
type DemandStep = readonly [number, number];

/**
 * NEC Table 220.42 (2017–2020 text) lighting load demand factors. The hospital row is printed
 * 40 % / 20 % in the source used; another source prints 50 % / 40 % (conflict noted in
 * REFERENCES.md). Hotel/motel covers apartment houses without tenant cooking.
 */
const TABLE_220_42: Record<LightingOccupancy, readonly DemandStep[]> = {
  dwelling: [[3_000, 1], [120_000, 0.35], [Infinity, 0.25]],
  hotel: [[20_000, 0.5], [100_000, 0.4], [Infinity, 0.3]],
  warehouse: [[12_500, 1], [Infinity, 0.5]],
  hospital: [[50_000, 0.4], [Infinity, 0.2]],
  other: [[Infinity, 1]],
};

function applySteps(steps: readonly DemandStep[], va: number): number {
  let demand = 0;
  let lower = 0;
  for (const [upper, factor] of steps) {
    if (va <= lower) break;
    demand += (Math.min(va, upper) - lower) * factor;
    lower = upper;
  }
  return demand;
}

/**
 * General lighting demand load, VA, by NEC Table 220.42 (2017–2020; renumbered 220.45 in 2023, from memory).
 * E.g. dwelling: first 3 000 VA at 100 %, 3 001–120 000 VA at 35 %, the rest at 25 %.
 * @throws RangeError on negative or non-finite VA.
 */
export function lightingDemandVA(occupancy: LightingOccupancy, va: number): number {
  assertVA(va);
  return applySteps(TABLE_220_42[occupancy], va);
}

/**
 * Non-dwelling receptacle demand load, VA, NEC Table 220.44 (2017–2020; renumbered 220.47 in 2023, from memory): first
 * 10 kVA at 100 %, the remainder at 50 %. Worked example: 20 160 VA → 15 080 VA.
 * @throws RangeError on negative or non-finite VA.
 */
export function receptacleDemandVA(va: number): number {
  assertVA(va);
  return applySteps([[10_000, 1], [Infinity, 0.5]], va);
}

function assertVA(va: number): void {
  if (!Number.isFinite(va) || va < 0) throw new RangeError(`load must be ≥ 0 VA, got ${va}`);
}
