import { ChoiceField, FieldRow, TextField, ToggleField } from '@/components/ui/fields';
import { numberOrNull, textOf } from '@/components/ui/form-values';
import type { FormBinders } from '@/components/ui/use-form-draft';
import { Text } from '@/components/ui/text';
import { SafetyNote } from '@/components/ui/safety-note';
import {
  DEMAND_BASES,
  DEMAND_BASIS_LABELS,
  DEMAND_UNITS,
  FAULT_SOURCES,
  SYSTEM_INFO,
  type DemandBasisKind,
  type DemandUnit,
  type FaultSource,
  type PanelSystem,
} from '@/shared/domain';
import type { Panel } from '@/shared/schemas';

/** The panel-check fields of the panel form, as typed (text boxes hold text until the save). */
export interface PanelCheckDraft {
  availableFaultKA: string;
  availableFaultOn: string;
  availableFaultSource: FaultSource | null;
  seriesRated: boolean;
  seriesRatingNote: string;
  feederRatingA: string;
  peakDemand: string;
  peakDemandUnit: DemandUnit | null;
  peakDemandBasis: DemandBasisKind | null;
  peakDemandOn: string;
  measuredA: string;
  measuredB: string;
  measuredC: string;
  measuredN: string;
  measuredOn: string;
}

/** A device copy from before these fields existed has none: each reads as not recorded. */
export function panelCheckDraft(panel: Panel): PanelCheckDraft {
  return {
    availableFaultKA: textOf(panel.availableFaultKA),
    availableFaultOn: panel.availableFaultOn ?? '',
    availableFaultSource: panel.availableFaultSource ?? null,
    seriesRated: panel.seriesRated ?? false,
    seriesRatingNote: panel.seriesRatingNote ?? '',
    feederRatingA: textOf(panel.feederRatingA),
    peakDemand: textOf(panel.peakDemand),
    peakDemandUnit: panel.peakDemandUnit ?? null,
    peakDemandBasis: panel.peakDemandBasis ?? null,
    peakDemandOn: panel.peakDemandOn ?? '',
    measuredA: textOf(panel.measuredA),
    measuredB: textOf(panel.measuredB),
    measuredC: textOf(panel.measuredC),
    measuredN: textOf(panel.measuredN),
    measuredOn: panel.measuredOn ?? '',
  };
}

/** The typed values for the schema, which names any field that does not hold. */
export function panelCheckValues(d: PanelCheckDraft) {
  return {
    ...d,
    availableFaultKA: numberOrNull(d.availableFaultKA),
    availableFaultOn: d.availableFaultOn.trim() || null,
    feederRatingA: numberOrNull(d.feederRatingA),
    peakDemand: numberOrNull(d.peakDemand),
    peakDemandOn: d.peakDemandOn.trim() || null,
    measuredA: numberOrNull(d.measuredA),
    measuredB: numberOrNull(d.measuredB),
    measuredC: numberOrNull(d.measuredC),
    measuredN: numberOrNull(d.measuredN),
    measuredOn: d.measuredOn.trim() || null,
  };
}

/**
 * Fault current (recorded from the NEC 110.24 label, the utility or an engineer — never computed),
 * series rating, feeder rating, measured peak demand (220.87) and clamp readings per phase.
 */
export function PanelCheckFields({ bind, system }: { bind: FormBinders<PanelCheckDraft>; system: PanelSystem }) {
  const { text, field } = bind;
  const threePhase = SYSTEM_INFO[system].phases === 3;
  return (
    <>
      <Text variant="label">Fault current (NEC 110.24)</Text>
      <FieldRow wrap>
        <TextField label="Available fault current (kA)" {...text('availableFaultKA')} keyboardType="decimal-pad" mono testID="field-fault-ka" />
        <TextField label="Dated" {...text('availableFaultOn')} placeholder="YYYY-MM-DD" mono testID="field-fault-on" />
      </FieldRow>
      <ChoiceField
        label="Taken from"
        choices={[{ value: null, label: 'Not recorded' }, ...FAULT_SOURCES.map((s) => ({ value: s as FaultSource | null, label: s === 'label' ? 'Label on the equipment' : s === 'utility' ? 'Utility' : 'Engineer’s study' }))]}
        {...field('availableFaultSource')}
        hint="Recorded, never computed here: copy it from the label, the utility’s letter or the study."
      />
      <ToggleField label="Series rated (NEC 240.86)" {...field('seriesRated')} hint="Only as tested and marked on the equipment." />
      <TextField label="Series rating as marked" {...text('seriesRatingNote')} />
      <Text variant="label">Demand (NEC 220.87)</Text>
      <FieldRow wrap>
        <TextField label="Feeder breaker (A)" {...text('feederRatingA')} keyboardType="number-pad" mono />
        <TextField label="Highest measured demand" {...text('peakDemand')} keyboardType="decimal-pad" mono testID="field-peak" />
      </FieldRow>
      <ChoiceField label="Demand unit" choices={[{ value: null, label: 'Not recorded' }, ...DEMAND_UNITS.map((u) => ({ value: u as DemandUnit | null, label: u }))]} {...field('peakDemandUnit')} />
      <ChoiceField
        label="Over"
        choices={[{ value: null, label: 'Not recorded' }, ...DEMAND_BASES.map((b) => ({ value: b as DemandBasisKind | null, label: DEMAND_BASIS_LABELS[b] }))]}
        {...field('peakDemandBasis')}
      />
      <TextField label="Period ended" {...text('peakDemandOn')} placeholder="YYYY-MM-DD" mono />
      <Text variant="label">Clamp readings</Text>
      <SafetyNote />
      <FieldRow wrap>
        <TextField label="A (A)" {...text('measuredA')} keyboardType="decimal-pad" mono testID="field-measured-a" />
        <TextField label="B (A)" {...text('measuredB')} keyboardType="decimal-pad" mono testID="field-measured-b" />
        {threePhase && <TextField label="C (A)" {...text('measuredC')} keyboardType="decimal-pad" mono testID="field-measured-c" />}
        <TextField label="N (A)" {...text('measuredN')} keyboardType="decimal-pad" mono />
      </FieldRow>
      <TextField label="Measured on" {...text('measuredOn')} placeholder="YYYY-MM-DD" mono testID="field-measured-on" />
    </>
  );
}
