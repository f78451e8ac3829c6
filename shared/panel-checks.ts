/**
 * The panel checks of shared/calc fed from the register's rows, so the screens and the printed
 * report ask the same question with the same inputs: fault current against interrupting ratings
 * (NEC 110.9/110.10), the measured peak as amperes for 220.87, a thermal reading's component
 * temperature against its rating (110.14(C)).
 */
import { faultCurrentCheck, terminationTempFor, type FaultCheck } from './calc';
import { DEMAND_BASIS_LABELS, FAULT_SOURCE_LABELS, SYSTEM_INFO, type InsulationTempC } from './domain';
import type { Circuit, Panel } from './schemas';

type FaultPanel = Pick<Panel, 'availableFaultKA' | 'shortCircuitKA' | 'seriesRated'>;
type FaultCircuit = Pick<Circuit, 'id' | 'position' | 'ratingA' | 'status' | 'interruptingKA'>;

/** How a finding names a breaker: "Position 7 (20 A)". */
export function breakerName(c: Pick<Circuit, 'position' | 'ratingA'>): string {
  return `Position ${c.position}${c.ratingA ? ` (${c.ratingA} A)` : ''}`;
}

/** The fault-current check of a panel and its breakers (spaces have none). */
export function panelFaultCheck(panel: FaultPanel, circuits: readonly FaultCircuit[]): FaultCheck {
  return faultCurrentCheck({
    // a device copy from before the fields existed has none: not recorded
    availableKA: panel.availableFaultKA ?? null,
    panelRatingKA: panel.shortCircuitKA,
    seriesRated: panel.seriesRated ?? false,
    breakers: circuits
      .filter((c) => c.status !== 'space')
      .map((c) => ({ id: c.id, label: breakerName(c), interruptingKA: c.interruptingKA ?? null })),
  });
}

/** "label, 2025-03-01" — where the available fault current was taken from, and when. */
export function faultSourceText(panel: Pick<Panel, 'availableFaultSource' | 'availableFaultOn'>): string {
  return [panel.availableFaultSource ? FAULT_SOURCE_LABELS[panel.availableFaultSource] : null, panel.availableFaultOn]
    .filter(Boolean)
    .join(', ');
}

/**
 * The recorded peak demand as amperes per phase: a peak in kVA is taken as balanced, so I =
 * kVA·1000 / V for single-phase 3-wire (line-to-line) and / (√3·V) for three-phase (any electrical
 * handbook). A peak recorded in amperes is taken as the worst phase's. Null when none is recorded.
 */
export function peakDemandA(panel: Pick<Panel, 'system' | 'peakDemand' | 'peakDemandUnit'>): number | null {
  if (panel.peakDemand === null || panel.peakDemand === undefined || !panel.peakDemandUnit) return null;
  if (panel.peakDemandUnit === 'A') return panel.peakDemand;
  const info = SYSTEM_INFO[panel.system];
  const volts = info.phases === 3 ? Math.sqrt(3) * info.lineV : info.lineV;
  return (panel.peakDemand * 1000) / volts;
}

/** "31.5 kVA, 12 months to 2026-10-31" */
export function peakDemandText(panel: Pick<Panel, 'peakDemand' | 'peakDemandUnit' | 'peakDemandBasis' | 'peakDemandOn'>): string | null {
  if (panel.peakDemand === null || panel.peakDemand === undefined) return null;
  const period = panel.peakDemandBasis ? DEMAND_BASIS_LABELS[panel.peakDemandBasis] : 'period not recorded';
  return `${panel.peakDemand} ${panel.peakDemandUnit ?? ''}, ${period}${panel.peakDemandOn ? ` to ${panel.peakDemandOn}` : ''}`;
}

/**
 * The temperature a conductor's end may reach: the lower of its insulation rating and its
 * termination rating (NEC 110.14(C): the termination as marked, else 60 °C up to 100 A or 14–1 AWG).
 * Null when neither the circuit's insulation nor a size to decide the termination is recorded.
 */
export function componentRatingC(
  circuit: Pick<Circuit, 'ratingA' | 'conductorSize' | 'insulationTempC' | 'terminationTempC'> | null | undefined,
  panel: Pick<Panel, 'terminationTempC'>,
): { ratingC: InsulationTempC; basis: string } | null {
  if (!circuit || circuit.insulationTempC === null) return null;
  const marked = circuit.terminationTempC ?? panel.terminationTempC ?? null;
  if (circuit.ratingA === null || circuit.conductorSize === null) {
    if (marked === null) return null;
    const ratingC = Math.min(marked, circuit.insulationTempC) as InsulationTempC;
    return { ratingC, basis: `insulation ${circuit.insulationTempC} °C, terminations ${marked} °C` };
  }
  const termination = terminationTempFor({ ratingA: circuit.ratingA, size: circuit.conductorSize, markedC: marked });
  const ratingC = Math.min(termination.tempC, circuit.insulationTempC) as InsulationTempC;
  return { ratingC, basis: `insulation ${circuit.insulationTempC} °C; ${termination.basis}` };
}
