/**
 * What a reading means: the judgement of each kind of reading, from the shared computations.
 * The reading screens, the server's API answers and the printed report all call assessReading,
 * so they never disagree.
 */
import {
  SAFETY_CAUTION,
  lightLoadNote,
  loadCorrectedRiseC,
  thermalPriority,
  torqueVerdict,
  tripTestVerdict,
  type TripTestResult,
  type TorqueVerdict,
} from './calc';
import { SYSTEM_INFO, type PanelSystem } from './domain';
import { VISUAL_CHECKS, type Priority, type ReadingFields } from './records';

export interface ThermalAssessment {
  kind: 'thermal';
  riseC: number;
  /** the rise corrected to the reference load, when both loads were given */
  correctedRiseC: number | null;
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
  /** starting priority of a deficiency raised from this reading; null when nothing is wrong */
  priority: Priority | null;
  /** one line: what was found */
  summary: string;
  /** the standard and table it was judged on */
  basis: string;
  caution: string;
};

export interface AssessContext {
  /** the circuit the reading is on (trip tests need its rating) */
  circuit?: { ratingA: number | null } | null;
  panel?: { system: PanelSystem } | null;
  /** the band the trip test is judged against (the reading's, else the circuit's) */
  band?: { points: readonly { multiple: number; minS: number; maxS: number }[] } | null;
}

const round1 = (x: number) => Math.round(x * 10) / 10;

const THERMAL_BASIS =
  'ANSI/NETA MTS Table 100.18 (temperature rise); load correction ΔT × (I_ref / I_meas)², ' +
  'Infraspection Institute (2023) [common practice]';
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

/**
 * Judge a reading. Throws nothing on incomplete data: a trip test on a circuit without a rating, or
 * with no band and not at 300 %, comes back with `result: null` or basis 'none' and says what is missing.
 */
export function assessReading(r: ReadingFields, ctx: AssessContext = {}): Assessment {
  switch (r.kind) {
    case 'thermal': {
      const riseC = (r.temperatureC ?? 0) - (r.referenceC ?? 0);
      const notes: string[] = [];
      let correctedRiseC: number | null = null;
      if (r.loadA && r.referenceLoadA) {
        correctedRiseC = loadCorrectedRiseC({ riseC, measuredA: r.loadA, referenceA: r.referenceLoadA });
        const light = lightLoadNote({ measuredA: r.loadA, normalA: r.referenceLoadA });
        if (light) notes.push(light);
      }
      const judged = correctedRiseC ?? riseC;
      const basis = r.referenceBasis ?? 'similar';
      const p = thermalPriority({ riseC: judged, basis });
      const over = basis === 'similar' ? 'over a similar component' : 'over ambient air';
      const corrected = correctedRiseC === null ? '' : ` (${round1(correctedRiseC)} °C at the reference load)`;
      return {
        kind: 'thermal',
        riseC,
        correctedRiseC,
        priority: p.priority,
        action: p.action,
        notes,
        summary: `ΔT ${round1(riseC)} °C ${over}${corrected}: ${p.label ?? 'below the table'}`,
        basis: THERMAL_BASIS,
        caution: SAFETY_CAUTION,
      };
    }
    case 'torque': {
      const specified = r.specified ?? 0;
      const verdict = torqueVerdict({
        specified,
        // held: it did not move at the specified torque, so it was at least that tight
        asFound: r.asFound === 'held' ? specified : r.asFoundValue,
        asLeft: r.asLeft ?? 0,
        unit: r.unit ?? 'lbf-in',
        ...(r.conductorSize && r.screw ? { size: r.conductorSize, screw: r.screw } : {}),
      });
      const loose = verdict.asFound === 'loose';
      const badLeft = verdict.asLeft !== 'ok';
      return {
        kind: 'torque',
        verdict,
        // a termination found loose is a hot joint waiting to happen [CP, our choice]: P2
        priority: loose || badLeft ? 2 : null,
        summary: `As found ${verdict.asFound ?? 'not measured'}, as left ${verdict.asLeft}`,
        basis: r.specSource === 'fallback-table' ? TABLE_TORQUE : MAKER_TORQUE,
        caution: SAFETY_CAUTION,
      };
    }
    case 'trip': {
      const ratingA = ctx.circuit?.ratingA ?? null;
      if (!ratingA || !r.testCurrentA || !ctx.panel) {
        return {
          kind: 'trip',
          result: null,
          priority: null,
          summary: 'Cannot judge: the circuit needs its trip rating',
          basis: 'None',
          caution: SAFETY_CAUTION,
        };
      }
      const result = tripTestVerdict({
        ratingA,
        testA: r.testCurrentA,
        tripS: r.tripped ? (r.tripTimeS ?? 0) : null,
        band: ctx.band?.points,
        voltageV: SYSTEM_INFO[ctx.panel.system].lineV,
      });
      const pct = Math.round(result.multiple * 100);
      const window = result.expected ? ` (expected ${result.expected.minS}–${round1(result.expected.maxS)} s)` : '';
      return {
        kind: 'trip',
        result,
        priority: result.verdict ? TRIP_PRIORITY[result.verdict] : null,
        summary: `${pct} % of rating: ${result.verdict ?? 'no judgement'}${window}`,
        basis: result.basisNote,
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
