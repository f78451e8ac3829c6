/**
 * Available fault current against interrupting and short-circuit ratings.
 *
 * Sources: NEC 110.9 (equipment intended to interrupt current at fault levels has an interrupting
 * rating at least equal to the current available at its line terminals) and 110.10 (short-circuit
 * current ratings) [V]; NEC 110.24 (the maximum available fault current is field-marked with the
 * date of its calculation, and updated after modifications) [V]; NEC 240.86 (series ratings, only as
 * tested and marked) [V]. The fault current is recorded from the 110.24 label, the utility or the
 * engineer's study — never computed here.
 */
import { positive } from './guard';

export interface FaultBreaker {
  id: string;
  /** how the finding names the breaker, e.g. "Position 7 (20 A)" */
  label: string;
  /** the breaker's interrupting rating, kA; null when not recorded */
  interruptingKA: number | null | undefined;
}

export interface FaultCheckInput {
  /** maximum available fault current at the panel's line terminals, kA; null when not recorded */
  availableKA: number | null | undefined;
  /** the panelboard's marked short-circuit current rating, kA; null when not recorded */
  panelRatingKA: number | null | undefined;
  breakers: readonly FaultBreaker[];
  /** the panel is marked as part of a tested series combination (240.86) */
  seriesRated?: boolean;
}

export interface FaultFinding {
  subject: 'panel' | 'breaker';
  /** the breaker's id, or null for the panel */
  id: string | null;
  ratedKA: number;
  availableKA: number;
  message: string;
}

export type FaultCheck =
  | { judged: false; reason: string }
  | {
      judged: true;
      availableKA: number;
      /** equipment rated below the available fault current */
      findings: FaultFinding[];
      /** what has no rating recorded and so could not be judged */
      notRecorded: string[];
      /** the series-rating caution when a finding stands on a series-rated panel, else null */
      seriesNote: string | null;
    };

const SERIES_NOTE =
  'A series rating (NEC 240.86) allows a lower-rated breaker only in the tested combination marked on ' +
  'the equipment: check the marking names this breaker and its upstream device.';

/**
 * Which equipment is rated below the available fault current (NEC 110.9, 110.10). Without a
 * recorded available fault current nothing is judged (a reason says so): the figure is recorded,
 * not computed. A rating equal to the available current is adequate ("at least equal").
 * @throws RangeError on an available current or a rating that is recorded but not a finite number > 0.
 */
export function faultCurrentCheck(input: FaultCheckInput): FaultCheck {
  if (input.availableKA === null || input.availableKA === undefined) {
    return {
      judged: false,
      reason: 'No available fault current is recorded for this panel (NEC 110.24 label, the utility or an engineer’s study).',
    };
  }
  const availableKA = positive('availableKA', input.availableKA);
  const findings: FaultFinding[] = [];
  const notRecorded: string[] = [];
  if (input.panelRatingKA === null || input.panelRatingKA === undefined) {
    notRecorded.push('the panel’s short-circuit current rating');
  } else if (positive('panelRatingKA', input.panelRatingKA) < availableKA) {
    findings.push({
      subject: 'panel',
      id: null,
      ratedKA: input.panelRatingKA,
      availableKA,
      message: `The panel is rated ${input.panelRatingKA} kA short-circuit; ${availableKA} kA is available (NEC 110.10).`,
    });
  }
  for (const breaker of input.breakers) {
    if (breaker.interruptingKA === null || breaker.interruptingKA === undefined) {
      notRecorded.push(breaker.label);
      continue;
    }
    if (positive(`interruptingKA of ${breaker.label}`, breaker.interruptingKA) < availableKA) {
      findings.push({
        subject: 'breaker',
        id: breaker.id,
        ratedKA: breaker.interruptingKA,
        availableKA,
        message: `${breaker.label} interrupts ${breaker.interruptingKA} kA; ${availableKA} kA is available (NEC 110.9).`,
      });
    }
  }
  return {
    judged: true,
    availableKA,
    findings,
    notRecorded,
    seriesNote: input.seriesRated && findings.length > 0 ? SERIES_NOTE : null,
  };
}
