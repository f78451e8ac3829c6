import { StyleSheet, View } from 'react-native';
import { PANEL_KINDS, SYSTEM_INFO, SYSTEMS, type EquipmentCondition, type InsulationTempC, type PanelKind, type PanelSystem } from '@/shared/domain';
import { panelLayout } from '@/shared/calc';
import { fieldErrors, panelCreateBody, type Circuit, type Panel, type PanelPatchBody } from '@/shared/schemas';
import { Button } from '@/components/ui/button';
import { DateField } from '@/components/ui/date-field';
import { ChoiceField, FieldRow, FormProblems, TextField } from '@/components/ui/fields';
import { changedFields, numberOrNull, textOf } from '@/components/ui/form-values';
import { bindForm, useFormDraft } from '@/components/ui/use-form-draft';
import { PanelCheckFields, panelCheckDraft, panelCheckValues } from './panel-check-fields';
import { space } from '@/components/ui/theme';

const KIND_LABELS: Record<PanelKind, string> = {
  panelboard: 'Panelboard',
  switchboard: 'Switchboard',
  'load-centre': 'Load centre',
};

export interface PanelFormProps {
  panel: Panel;
  /** its circuits: the spaces and system must still hold them */
  circuits: Circuit[];
  onSubmit: (patch: PanelPatchBody) => void;
}

export function PanelForm({ panel, circuits, onSubmit }: PanelFormProps) {
  const { draft, set, errors, setErrors, text, field } = useFormDraft(() => ({
    ...panelCheckDraft(panel),
    tag: panel.tag,
    location: panel.location,
    kind: panel.kind,
    system: panel.system,
    busRatingA: textOf(panel.busRatingA),
    mainRatingA: textOf(panel.mainRatingA),
    shortCircuitKA: textOf(panel.shortCircuitKA),
    // a copy persisted before the field existed has none
    terminationTempC: panel.terminationTempC ?? null,
    spaces: textOf(panel.spaces),
    maker: panel.maker,
    model: panel.model,
    installedOn: panel.installedOn ?? '',
    condition: panel.condition,
  }));

  const submit = () => {
    const candidate = {
      ...draft,
      ...panelCheckValues(draft),
      busRatingA: numberOrNull(draft.busRatingA),
      mainRatingA: numberOrNull(draft.mainRatingA),
      shortCircuitKA: numberOrNull(draft.shortCircuitKA),
      spaces: numberOrNull(draft.spaces),
      installedOn: draft.installedOn.trim() || null,
      fedFromPanelId: panel.fedFromPanelId,
      fedFromPosition: panel.fedFromPosition,
    };
    const parsed = panelCreateBody.safeParse(candidate);
    if (!parsed.success) {
      setErrors(fieldErrors(parsed.error));
      return;
    }
    const { id: _id, ...fields } = parsed.data;
    const { problems } = panelLayout({ system: fields.system, spaces: fields.spaces }, circuits);
    if (problems.length > 0) {
      setErrors({ spaces: `existing circuits would not fit: ${problems[0].message}` });
      return;
    }
    onSubmit(changedFields(panel, fields));
  };

  return (
    <View style={styles.form}>
      <FieldRow>
        <TextField label="Tag" {...text('tag')} mono testID="field-tag" />
        <TextField label="Spaces" {...text('spaces')} keyboardType="number-pad" mono testID="field-spaces" />
      </FieldRow>
      <TextField label="Location" {...text('location')} />
      <ChoiceField
        label="Kind"
        choices={PANEL_KINDS.map((value) => ({ value, label: KIND_LABELS[value] }))}
        {...field('kind')}
      />
      <ChoiceField
        label="System"
        choices={SYSTEMS.map((value) => ({ value: value as PanelSystem, label: SYSTEM_INFO[value].label }))}
        {...field('system')}
      />
      <FieldRow>
        <TextField label="Bus rating (A)" {...text('busRatingA')} keyboardType="number-pad" mono testID="field-bus" />
        <TextField
          label="Main breaker (A)"
          {...text('mainRatingA')}
          hint="Leave blank for main lugs only"
          keyboardType="number-pad"
          mono
        />
      </FieldRow>
      <ChoiceField
        label="Terminations listed and marked for"
        choices={[
          { value: null, label: 'Not recorded' },
          ...([60, 75, 90] as const).map((t) => ({ value: t as InsulationTempC | null, label: `${t} °C` })),
        ]}
        {...field('terminationTempC')}
        hint="From the panel’s label. Not recorded: NEC 110.14(C)(1) takes 60 °C for circuits of 100 A or less or 14–1 AWG."
      />
      <FieldRow>
        <TextField label="Short-circuit rating (kA)" {...text('shortCircuitKA')} keyboardType="decimal-pad" mono />
        <DateField label="Installed on" {...text('installedOn')} testID="field-installed-on" />
      </FieldRow>
      <PanelCheckFields bind={bindForm(draft, set, errors)} system={draft.system} />
      <FieldRow>
        <TextField label="Maker" {...text('maker')} />
        <TextField label="Model" {...text('model')} />
      </FieldRow>
      <ChoiceField
        label="Equipment condition (NFPA 70B)"
        hint="1 like new · 2 deviations or earlier repairs · 3 missed maintenance or urgent findings"
        choices={[1, 2, 3].map((c) => ({ value: c as EquipmentCondition, label: `Condition ${c}` }))}
        {...field('condition')}
      />
      <FormProblems errors={errors} />
      <Button label="Save panel" onPress={submit} testID="save-panel" />
    </View>
  );
}

const styles = StyleSheet.create({
  form: { gap: space.lg },
});
