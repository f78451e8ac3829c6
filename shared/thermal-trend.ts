/**
 * A circuit's thermal readings grouped by termination (the same component on the same phase), one
 * point per survey, each group's rise across surveys judged by riseTrend (shared/calc/thermography.ts:
 * NFPA 70B 2023 condition 2, results that deviate from earlier ones). Pure: the circuit's record
 * draws it, and a report could print it.
 */
import type { Assessment } from './assess';
import { riseTrend, type RiseTrend } from './calc';
import { THERMAL_COMPONENT_LABELS, type Reading } from './records';

export interface TrendInput {
  reading: Pick<Reading, 'kind' | 'component' | 'phase' | 'inspectionId'>;
  assessment: Assessment;
  /** the survey's date (its inspection's performedOn), YYYY-MM-DD; null when the inspection is not on the device */
  takenOn: string | null;
}

export interface TerminationTrend {
  /** component + phase, stable across surveys */
  key: string;
  /** "Lug · phase B" */
  label: string;
  trend: RiseTrend;
}

/**
 * Trends of every termination with at least one judged reading, most recent survey first. A rise
 * not judged (too lightly loaded) is left out; a test-pulse reading counts at its raw difference
 * (the judged rise). Two readings of one spot in one survey count once, the higher (the worse).
 */
export function terminationTrends(inputs: readonly TrendInput[]): TerminationTrend[] {
  const groups = new Map<string, { label: string; byDay: Map<string, number> }>();
  for (const { reading, assessment, takenOn } of inputs) {
    if (reading.kind !== 'thermal' || assessment.kind !== 'thermal') continue;
    if (assessment.judgedRiseC === null || takenOn === null) continue;
    const key = `${reading.component ?? 'other'}:${reading.phase ?? '-'}`;
    const label = [
      reading.component ? THERMAL_COMPONENT_LABELS[reading.component] : 'Termination',
      reading.phase ? (reading.phase === 'N' ? 'neutral' : `phase ${reading.phase}`) : null,
    ]
      .filter(Boolean)
      .join(' · ');
    const group = groups.get(key) ?? { label, byDay: new Map<string, number>() };
    group.byDay.set(takenOn, Math.max(group.byDay.get(takenOn) ?? Number.NEGATIVE_INFINITY, assessment.judgedRiseC));
    groups.set(key, group);
  }
  const trends = [...groups.entries()].map(([key, g]) => ({
    key,
    label: g.label,
    trend: riseTrend([...g.byDay.entries()].map(([day, riseC]) => ({ takenOn: day, riseC }))),
  }));
  const latest = (t: TerminationTrend) => t.trend.points[t.trend.points.length - 1]?.takenOn ?? '';
  return trends.sort((a, b) => latest(b).localeCompare(latest(a)) || a.label.localeCompare(b.label));
}
