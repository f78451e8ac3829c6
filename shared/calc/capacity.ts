/**
 * Room on a panel for a new load, from its measured demand, and where the new breaker would go.
 *
 * Source: NEC 220.87 (2020/2023), determining existing loads [V, wording M]: the existing load may
 * be the maximum demand from one year of data — or, where that is not available, from a 30-day
 * recording of the highest average over 15-minute intervals — taken at 125 %, plus the new load;
 * the sum must not exceed the rating of the feeder or service (the section adds further conditions:
 * overcurrent protection, and in 2023 no solar or other sources that hide demand — the user must
 * confirm them). Continuous new loads count at 125 % (210.19(A), 215.2(A)) [V].
 */
import { SYSTEM_INFO, type PanelSystem } from '../domain';
import { finite, nonNegative, positive } from './guard';
import { occupiedPositions, panelLayout, type LayoutCircuit } from './layout';

export type DemandBasis = 'year' | '30-day';

export interface NewLoad {
  /** the new load's calculated load, VA (NEC 220) */
  va: number;
  /** the voltage it is connected at: line-to-neutral for 1 pole, line-to-line for 2 and 3 */
  volts: number;
  poles: 1 | 2 | 3;
  continuous: boolean;
}

export interface SpareCapacityInput {
  system: PanelSystem;
  spaces: number;
  circuits: readonly LayoutCircuit[];
  /** the panel's rating: its main breaker, else its bus (the lower of the two) */
  panelRatingA: number;
  /** the feeder's overcurrent device, when recorded */
  feederRatingA?: number | null;
  /** highest measured demand on the worst phase, A */
  peakDemandA: number;
  /** how the peak was measured: a year of data, or a 30-day recording of 15-minute averages */
  basis: DemandBasis;
  newLoad: NewLoad;
}

export interface SpareCapacity {
  /** the measured peak at 125 % (220.87) */
  existingA: number;
  /** the new load's line current, at 125 % when continuous */
  newLoadA: number;
  /** existing at 125 % plus the new load, A, on the worst phase */
  totalA: number;
  /** the lower of the panel's and the feeder's rating */
  limitA: number;
  /** which rating limits: 'panel' or 'feeder' */
  limitedBy: 'panel' | 'feeder';
  fits: boolean;
  /** limitA − totalA (negative when it does not fit) */
  headroomA: number;
  /** the positions the new breaker would take (the first free run), or null when there is none */
  positions: number[] | null;
  /** the rule applied, in words, for the screen and the report */
  rule: string;
}

/**
 * Line current of a new load: VA / V for 1 and 2 poles, VA / (√3 V) for 3 poles (any electrical
 * handbook), × 1.25 when continuous.
 */
function newLoadCurrentA(system: PanelSystem, load: NewLoad): number {
  nonNegative('new load VA', load.va);
  positive('new load volts', load.volts);
  if (![1, 2, 3].includes(load.poles)) throw new RangeError(`poles must be 1, 2 or 3, got ${String(load.poles)}`);
  if (load.poles === 3 && SYSTEM_INFO[system].phases === 1) {
    throw new RangeError('a 3-pole load needs a three-phase panel');
  }
  const amps = load.poles === 3 ? load.va / (Math.sqrt(3) * load.volts) : load.va / load.volts;
  return load.continuous ? amps * 1.25 : amps;
}

/** The first start position whose poles are all free and within the panel, or null. */
export function freePositionsFor(
  panel: { system: PanelSystem; spaces: number },
  circuits: readonly LayoutCircuit[],
  poles: number,
): number[] | null {
  const { slots } = panelLayout(panel, circuits);
  for (const slot of slots) {
    const wanted = occupiedPositions(slot.position, poles);
    if (wanted.every((p) => p <= panel.spaces && slots[p - 1].circuitId === null)) return wanted;
  }
  return null;
}

/**
 * Can the panel take the new load (NEC 220.87)? 1.25 × the measured peak of the worst phase plus
 * the new load's current must not exceed the lower of the panel's and the feeder's rating. The new
 * load is added in full to the worst phase, which errs safe [CP].
 * @throws RangeError on a rating not > 0, a negative or non-finite peak, or a bad new load.
 */
export function spareCapacity(input: SpareCapacityInput): SpareCapacity {
  positive('panelRatingA', input.panelRatingA);
  if (input.feederRatingA !== null && input.feederRatingA !== undefined) positive('feederRatingA', input.feederRatingA);
  nonNegative('peakDemandA', input.peakDemandA);
  finite('spaces', input.spaces);
  const existingA = 1.25 * input.peakDemandA;
  const newLoadA = newLoadCurrentA(input.system, input.newLoad);
  const totalA = existingA + newLoadA;
  const feeder = input.feederRatingA ?? null;
  const limitedBy = feeder !== null && feeder < input.panelRatingA ? 'feeder' : 'panel';
  const limitA = limitedBy === 'feeder' ? (feeder as number) : input.panelRatingA;
  const source = input.basis === 'year' ? 'a year of demand data' : 'a 30-day recording of 15-minute averages';
  return {
    existingA,
    newLoadA,
    totalA,
    limitA,
    limitedBy,
    fits: totalA <= limitA,
    headroomA: limitA - totalA,
    positions: freePositionsFor(input, input.circuits, input.newLoad.poles),
    rule:
      `NEC 220.87: the highest demand from ${source} at 125 % (${round1(existingA)} A) plus the new load ` +
      `(${round1(newLoadA)} A${input.newLoad.continuous ? ', continuous at 125 %' : ''}) against the ` +
      `${limitedBy}’s ${limitA} A rating.`,
  };
}

function round1(x: number): number {
  return Math.round(x * 10) / 10;
}
