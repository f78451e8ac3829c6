/**
 * Clamp-meter readings per phase beside the calculated load, and the neutral current of a
 * three-phase four-wire panel.
 *
 * Source: the phasor sum of three currents 120° apart at unity power factor,
 * I_N = √(Ia² + Ib² + Ic² − Ia·Ib − Ib·Ic − Ic·Ia) (standard circuit theory; any power-systems
 * text) [V]. It holds for linear loads of similar power factor; triplen harmonics of non-linear
 * loads (electronic power supplies, LED drivers, drives) add in the neutral and can make it carry
 * more than any phase [CP].
 */
import { nonNegative } from './guard';

export const NEUTRAL_CAUTION =
  'For linear loads only: non-linear loads (electronics, LED drivers, drives) add harmonic current ' +
  'to the neutral, which can then exceed the phase currents. Measure the neutral to be sure.';

/**
 * Neutral current of a 3φ 4W system from its three phase currents, A.
 * @throws RangeError on a negative or non-finite current.
 */
export function neutralCurrentA(a: number, b: number, c: number): number {
  nonNegative('phase A current', a);
  nonNegative('phase B current', b);
  nonNegative('phase C current', c);
  // rounding can leave a tiny negative under the root for a balanced set
  return Math.sqrt(Math.max(0, a * a + b * b + c * c - a * b - b * c - c * a));
}

export interface PhaseComparison {
  phase: 'A' | 'B' | 'C';
  measuredA: number;
  calculatedA: number;
  /** measured − calculated, A */
  differenceA: number;
  /** measured / calculated; null when nothing is calculated on the phase */
  ratio: number | null;
}

/**
 * Measured against calculated amps, phase by phase. A measured current far above the calculated one
 * means unrecorded load (or a wrong schedule); far below is the usual diversity of real use [CP].
 * @throws RangeError on a negative or non-finite current.
 */
export function compareMeasured(
  measured: Partial<Record<'A' | 'B' | 'C', number>>,
  calculated: Partial<Record<'A' | 'B' | 'C', number>>,
): PhaseComparison[] {
  const out: PhaseComparison[] = [];
  for (const phase of ['A', 'B', 'C'] as const) {
    const m = measured[phase];
    const c = calculated[phase];
    if (m === undefined || c === undefined) continue;
    nonNegative(`measured phase ${phase}`, m);
    nonNegative(`calculated phase ${phase}`, c);
    out.push({ phase, measuredA: m, calculatedA: c, differenceA: m - c, ratio: c > 0 ? m / c : null });
  }
  return out;
}
