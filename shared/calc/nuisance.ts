/**
 * Nuisance-trip analysis: trips well below the rating read beside thermal and torque records.
 *
 * Basis: a thermal-magnetic breaker carrying well under its rating (under about 80–90 %) should not
 * trip; such trips point at heat from elsewhere — most often a loose or corroded termination whose
 * heat reaches the thermal element — or at a faulty breaker (common practice of the trade [CP]).
 * Thermal severity by ANSI/NETA MTS Table 100.18 ({@link thermalPriority}).
 */
import { thermalPriority } from './thermal';
import type { ThermalBasis } from './thermal';
import { nonNegative, positive } from './guard';

/** Trips below this fraction of the rating count as "well below rating" [CP]. */
export const NUISANCE_TRIP_LOAD_FRACTION = 0.8;

export interface RecordedTrip {
  /** when it tripped (ISO date-time or date) */
  at: string;
  /** load current at or just before the trip, if known */
  loadA?: number | null;
}

export type TerminationReading =
  | { kind: 'thermal'; riseC: number; basis: ThermalBasis }
  | { kind: 'torque'; verdict: 'loose' | 'ok' | 'over' };

export interface NuisanceTripInput {
  ratingA: number;
  trips: readonly RecordedTrip[];
  /** readings at this circuit's terminations (breaker lug, neutral, bus connection) */
  readings: readonly TerminationReading[];
}

export interface NuisanceTripFindings {
  suspectTermination: boolean;
  reasons: string[];
  /** trips with a recorded load under 80 % of rating */
  lowLoadTrips: number;
  /** trips with no load recorded (cannot be judged) */
  tripsWithoutLoad: number;
  /** thermal readings at NETA priority 1–3 */
  hotTerminations: number;
  /** torque readings found loose */
  looseTerminations: number;
}

/**
 * Trips below 80 % of rating together with a hot termination (NETA MTS Table 100.18 priority 1–3)
 * or a termination whose torque was found loose → suspect the termination, not the breaker [CP].
 * Trips with no load recorded are counted but not judged.
 * @throws RangeError when ratingA is not > 0 or a trip's load is negative or not a number.
 */
export function nuisanceTripFindings({ ratingA, trips, readings }: NuisanceTripInput): NuisanceTripFindings {
  positive('ratingA', ratingA);
  for (const t of trips) if (t.loadA !== undefined && t.loadA !== null) nonNegative('a trip\u2019s loadA', t.loadA);
  const limitA = NUISANCE_TRIP_LOAD_FRACTION * ratingA;
  const judged = trips.filter((t) => t.loadA !== undefined && t.loadA !== null);
  const low = judged.filter((t) => (t.loadA as number) < limitA);
  const tripsWithoutLoad = trips.length - judged.length;

  const hot: { priority: number; riseC: number; basis: ThermalBasis }[] = [];
  let looseTerminations = 0;
  for (const reading of readings) {
    if (reading.kind === 'thermal') {
      const { priority } = thermalPriority({ riseC: reading.riseC, basis: reading.basis });
      if (priority !== null && priority <= 3) hot.push({ priority, riseC: reading.riseC, basis: reading.basis });
    } else if (reading.verdict === 'loose') {
      looseTerminations += 1;
    }
  }

  const reasons: string[] = [];
  if (low.length > 0) {
    const highest = Math.max(...low.map((t) => t.loadA as number));
    reasons.push(
      `${low.length} trip${low.length === 1 ? '' : 's'} with the load under 80 % of the ${ratingA} A ` +
        `rating (highest ${round(highest)} A): a breaker this lightly loaded should not trip.`,
    );
  }
  for (const h of hot.sort((a, b) => a.priority - b.priority)) {
    reasons.push(
      `A termination runs ${round(h.riseC)} °C above ${h.basis === 'similar' ? 'a similar connection' : 'ambient'} ` +
        `(NETA priority ${h.priority}).`,
    );
  }
  if (looseTerminations > 0) {
    reasons.push(
      `${looseTerminations} termination${looseTerminations === 1 ? ' was' : 's were'} found loose on the torque check.`,
    );
  }
  const suspectTermination = low.length > 0 && (hot.length > 0 || looseTerminations > 0);
  if (suspectTermination) {
    reasons.push(
      'Suspect the termination, not the breaker: heat from a loose or corroded lug reaches the ' +
        'breaker\u2019s thermal element. Clean and re-torque the terminations, then scan again under load, ' +
        'before replacing the breaker.',
    );
  } else if (low.length > 0) {
    reasons.push(
      'No hot or loose termination on record: scan the terminations under load and check their torque ' +
        'before blaming the breaker; look at the room temperature and the enclosure too.',
    );
  }
  if (tripsWithoutLoad > 0) {
    reasons.push(
      `${tripsWithoutLoad} trip${tripsWithoutLoad === 1 ? ' has' : 's have'} no load recorded: record the ` +
        'load to tell an overload from a nuisance trip.',
    );
  }
  return {
    suspectTermination,
    reasons,
    lowLoadTrips: low.length,
    tripsWithoutLoad,
    hotTerminations: hot.length,
    looseTerminations,
  };
}

function round(value: number): number {
  return Math.round(value * 10) / 10;
}
