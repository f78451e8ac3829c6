/**
 * What a reading means: the judgement of each kind of reading, from the shared computations.
 * The reading screens, the server's API answers and the printed report all call assessReading,
 * so they never disagree.
 */
import {
  SAFETY_CAUTION,
  lightLoadNote,
  loadCorrection,
  thermalPriority,
  torqueVerdict,
  tripTestVerdict,
  type TerminationReading,
  type TripTestResult,
  type TorqueVerdict,
} from './calc';
import { SYSTEM_INFO, type PanelSystem } from './domain';
import { VISUAL_CHECKS, type Priority, type ReadingFields } from './records';
import { formatTemp, type TemperatureUnit } from './units';

/**
 * How the rise was taken to the judgement: 'none' (no loads given), 'as-measured' (at or above the
 * reference load: never lowered), 'raised' (square law between 40 % and 100 %), 'too-light' (under
 * 40 %: not judged), 'test-pulse' (during a test pulse: raw difference, no correction).
 */
export type ThermalCorrection = 'none' | 'as-measured' | 'raised' | 'too-light' | 'test-pulse';

export interface ThermalAssessment {
  kind: 'thermal';
  /** the measured difference, °C */
  riseC: number;
  /** the rise raised to the reference load, when it was (null otherwise) */
  correctedRiseC: number | null;
  /** the rise the priority is judged on; null when too lightly loaded to judge */
  judgedRiseC: number | null;
  correction: ThermalCorrection;
  /** false for a reading taken during a test pulse (seconds): not thermal steady state */
  steadyState: boolean;
  priority: Priority | null;
  action: string;
  notes: string[];
}
export interface TorqueAssessment {
  kind: 'torque';
  verdict: TorqueVerdict;
}
export interface TripAssessment {
  kind: 'trip';
  result: TripTestResult | null;
}
export interface VisualAssessment {
  kind: 'visual';
}

export type Assessment = (ThermalAssessment | TorqueAssessment | TripAssessment | VisualAssessment) & {
  /** starting priority of a deficiency raised from this reading; null when nothing is wrong or not judged */
  priority: Priority | null;
  /** one line: what was found */
  summary: string;
  /** the standard and table it was judged on */
  basis: string;
  caution: string;
};

export interface AssessBand {
  points: readonly { multiple: number; minS: number; maxS: number }[];
  /** the rating the band was entered for (a band for another rating is flagged, not used) */
  ratingA?: number | null;
  instantaneousMultiple?: number | null;
  instantaneousTolerancePct?: number | null;
}

export interface AssessContext {
  /** the circuit the reading is on (trip tests need its rating) */
  circuit?: { ratingA: number | null } | null;
  panel?: { system: PanelSystem } | null;
  /** the band the trip test is judged against (the reading's, else the circuit's) */
  band?: AssessBand | null;
  /** the unit the summary's temperatures are written in (the user's choice; °C when absent) */
  temperatureUnit?: TemperatureUnit;
}

const round1 = (x: number) => Math.round(x * 10) / 10;

const THERMAL_BASIS =
  'ANSI/NETA MTS Table 100.18 (temperature rise); light-load readings raised by ΔT × (I_ref / I_meas)², ' +
  'Infraspection Institute (2023) [common practice], never lowered; under 40 % of normal load not judged (NFPA 70B 2023)';
const MAKER_TORQUE = 'The maker\u2019s instructions (NEC 110.14(D): the maker\u2019s value governs)';
const TABLE_TORQUE =
  'UL 486A-486B table (NEC Informative Annex I) as a fallback only: the maker\u2019s value governs where given';

/** Priority we give a failed trip test [CP, our choice]: a breaker that does not clear in time is P1. */
const TRIP_PRIORITY: Record<string, Priority | null> = {
  pass: null,
  slow: 1,
  'no-trip': 1,
  fast: 2,
  'unexpected-trip': 2,
};

/** A field the reading's kind needs, as a finite number (RangeError otherwise). */
function required(r: ReadingFields, field: keyof ReadingFields): number {
  const value = r[field];
  if (typeof value !== 'number' || !Number.isFinite(value)) {
    throw new RangeError(`${String(field)} must be a number for a ${r.kind} reading, got ${String(value)}`);
  }
  return value;
}

function assessThermal(r: ReadingFields, unit: TemperatureUnit): ThermalAssessment & Omit<Assessment, 'kind'> {
  const rise = (c: number) => formatTemp(c, unit, 'rise');
  const riseC = required(r, 'temperatureC') - required(r, 'referenceC');
  const notes: string[] = [];
  let correction: ThermalCorrection = 'none';
  let correctedRiseC: number | null = null;
  let judgedRiseC: number | null = riseC;
  const steadyState = !r.duringTestPulse;
  if (!steadyState) {
    correction = 'test-pulse';
    notes.push(
      'Taken during a test pulse of seconds (e.g. a trip test): not thermal steady state. Judged on the raw ' +
        'difference, with no load correction; the joint will run hotter under a lasting load.',
    );
  } else if (r.loadA !== null || r.referenceLoadA !== null) {
    const c = loadCorrection({ riseC, measuredA: required(r, 'loadA'), referenceA: required(r, 'referenceLoadA') });
    correction = c.outcome;
    judgedRiseC = c.riseC;
    if (c.outcome === 'raised') correctedRiseC = c.riseC;
    if (c.outcome !== 'as-measured') notes.push(c.reason);
    const light = c.outcome === 'raised' ? lightLoadNote({ measuredA: required(r, 'loadA'), normalA: required(r, 'referenceLoadA') }) : null;
    if (light) notes.push(light);
  }
  const basis = r.referenceBasis ?? 'similar';
  const over = basis === 'similar' ? 'over a similar component' : 'over ambient air';
  if (judgedRiseC === null) {
    return {
      kind: 'thermal',
      riseC,
      correctedRiseC,
      judgedRiseC,
      correction,
      steadyState,
      priority: null,
      action: 'Scan again under at least 40 % of normal load (NFPA 70B 2023).',
      notes,
      summary: `ΔT ${rise(riseC)} ${over}: too lightly loaded to judge`,
      basis: THERMAL_BASIS,
      caution: SAFETY_CAUTION,
    };
  }
  const p = thermalPriority({ riseC: judgedRiseC, basis });
  const corrected = correctedRiseC === null ? '' : ` (${rise(correctedRiseC)} at the reference load)`;
  const pulse = steadyState ? '' : ' during a test pulse, not steady state';
  return {
    kind: 'thermal',
    riseC,
    correctedRiseC,
    judgedRiseC,
    correction,
    steadyState,
    priority: p.priority,
    action: p.action,
    notes,
    summary: `ΔT ${rise(riseC)} ${over}${pulse}${corrected}: ${p.label ?? 'below the table'}`,
    basis: THERMAL_BASIS,
    caution: SAFETY_CAUTION,
  };
}

/**
 * Judge a reading.
 *
 * Bad input (our convention, DEVELOPERS.md "Bad input"): a field the reading's kind needs that is
 * missing or not a finite number — which the reading schema would refuse — throws a RangeError.
 * Missing context is not an error: a trip test on a circuit without a rating, a trip recorded with
 * no time, or with no band and not at 300 %, comes back with `result: null` (or basis 'none') and
 * says what is missing. A band that cannot be used (another rating, times rising with current) is
 * named in the summary and not used.
 */
export function assessReading(r: ReadingFields, ctx: AssessContext = {}): Assessment {
  switch (r.kind) {
    case 'thermal':
      return assessThermal(r, ctx.temperatureUnit ?? 'C');
    case 'torque': {
      const specified = required(r, 'specified');
      const asLeft = required(r, 'asLeft');
      if (r.unit === null) throw new RangeError('unit is required for a torque reading');
      const verdict = torqueVerdict({
        specified,
        // held: it did not move at the specified torque, so it was at least that tight
        asFound: r.asFound === 'held' ? specified : r.asFoundValue,
        asLeft,
        unit: r.unit,
        ...(r.conductorSize && r.screw ? { size: r.conductorSize, screw: r.screw, screwSize: r.screwSize } : {}),
      });
      const loose = verdict.asFound === 'loose';
      const badLeft = verdict.asLeft !== 'ok';
      const checkMaker = verdict.warnings.some((w) => w.startsWith('Check the maker'));
      return {
        kind: 'torque',
        verdict,
        // a termination found loose is a hot joint waiting to happen [CP, our choice]: P2
        priority: loose || badLeft ? 2 : null,
        summary:
          `As found ${verdict.asFound ?? 'not measured'}, as left ${verdict.asLeft}` +
          (checkMaker ? '; check the maker\u2019s value: far above the UL 486A-486B value for this screw' : ''),
        basis: r.specSource === 'fallback-table' ? TABLE_TORQUE : MAKER_TORQUE,
        caution: SAFETY_CAUTION,
      };
    }
    case 'trip': {
      const ratingA = ctx.circuit?.ratingA ?? null;
      const testA = required(r, 'testCurrentA');
      const notJudged = (summary: string): Assessment => ({
        kind: 'trip',
        result: null,
        priority: null,
        summary,
        basis: 'None',
        caution: SAFETY_CAUTION,
      });
      if (!ratingA || !ctx.panel) return notJudged('Cannot judge: the circuit needs its trip rating');
      if (r.tripped === null) return notJudged('Cannot judge: did it trip?');
      if (r.tripped && r.tripTimeS === null) return notJudged('Cannot judge: enter the time to trip');
      const band = ctx.band ?? null;
      const result = tripTestVerdict({
        ratingA,
        testA,
        tripS: r.tripped ? required(r, 'tripTimeS') : null,
        band: band?.points,
        bandRatingA: band?.ratingA ?? null,
        instantaneous:
          band?.instantaneousMultiple != null
            ? { multiple: band.instantaneousMultiple, tolerancePct: band.instantaneousTolerancePct ?? null }
            : null,
        voltageV: SYSTEM_INFO[ctx.panel.system].lineV,
      });
      const pct = Math.round(result.multiple * 100);
      const window = result.expected ? ` (expected ${result.expected.minS}–${round1(result.expected.maxS)} s)` : '';
      const problems = result.problems.length > 0 ? ` — ${result.problems.join(' ')}` : '';
      return {
        kind: 'trip',
        result,
        priority: result.verdict ? TRIP_PRIORITY[result.verdict] : null,
        summary: `${pct} % of rating: ${result.verdict ?? 'no judgement'}${window}${problems}`,
        basis: [result.basisNote, result.instantaneous?.note].filter(Boolean).join(' '),
        caution: SAFETY_CAUTION,
      };
    }
    case 'visual': {
      const check = r.check ? VISUAL_CHECKS[r.check] : null;
      return {
        kind: 'visual',
        priority: check?.priority ?? null,
        summary: check?.label ?? 'Visual finding',
        basis: 'Visual inspection [common practice]',
        caution: SAFETY_CAUTION,
      };
    }
  }
}

/**
 * What a reading says about a circuit's termination, for the nuisance-trip findings: a thermal
 * reading's judged rise (a test-pulse reading counts at its raw difference; a reading too lightly
 * loaded to judge counts for nothing), or a torque reading's as-found judgement. Null otherwise.
 */
export function terminationReadingOf(reading: ReadingFields, assessment: Assessment): TerminationReading | null {
  if (assessment.kind === 'thermal') {
    if (assessment.judgedRiseC === null) return null;
    return { kind: 'thermal', riseC: assessment.judgedRiseC, basis: reading.referenceBasis ?? 'similar' };
  }
  if (assessment.kind === 'torque' && assessment.verdict.asFound) {
    return { kind: 'torque', verdict: assessment.verdict.asFound };
  }
  return null;
}

/**
 * False when the reading could not be judged (a trip test with nothing to judge it against, a
 * thermal reading too lightly loaded): its null priority then means "not judged", not "no action".
 */
export function isJudged(assessment: Assessment): boolean {
  if (assessment.kind === 'trip') return assessment.result !== null && assessment.result.verdict !== null;
  if (assessment.kind === 'thermal') return assessment.judgedRiseC !== null;
  return true;
}
