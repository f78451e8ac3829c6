/**
 * An inspection's details: what kind, which panels, when, the ambient temperature and the load at
 * the time (with the NFPA 70B light-load warning as soon as it applies), notes.
 */
import { Pressable, StyleSheet, View } from 'react-native';
import {
  INSPECTION_KINDS,
  INSPECTION_KIND_LABELS,
  inspectionCreateBody,
  type InspectionCreateBody,
  type InspectionKind,
} from '@/shared/records';
import { fieldErrors, type Panel } from '@/shared/schemas';
import { Button } from '@/components/ui/button';
import { DateField } from '@/components/ui/date-field';
import { chipStyles, ChoiceField, Field, FieldRow, FormProblems, TextField } from '@/components/ui/fields';
import { changedFields, numberOrNull, textOf } from '@/components/ui/form-values';
import { lightLoadWarning, needsLoad } from './inspection-format';
import { Text } from '@/components/ui/text';
import { useFormDraft } from '@/components/ui/use-form-draft';
import { useTemperatureUnit } from '@/hooks/use-temperature-unit';
import { parseTempInput, tempInputText, unitSymbol, type TemperatureUnit } from '@/shared/units';
import { colours, radii, space } from '@/components/ui/theme';

interface Draft {
  kind: InspectionKind;
  panelIds: string[];
  performedOn: string;
  /** the ambient is typed in this unit (the user's choice when the form opened); stored in °C */
  temperatureUnit: TemperatureUnit;
  ambientC: string;
  loadPct: string;
  notes: string;
}

const toDraft = (i: InspectionCreateBody, unit: TemperatureUnit): Draft => ({
  temperatureUnit: unit,
  kind: i.kind,
  panelIds: i.panelIds,
  performedOn: i.performedOn,
  ambientC: tempInputText(i.ambientC, unit, 'absolute'),
  loadPct: textOf(i.loadPct),
  notes: i.notes,
});

const fromDraft = (d: Draft, previousAmbientC: number | null) => ({
  kind: d.kind,
  panelIds: d.panelIds,
  performedOn: d.performedOn.trim(),
  ambientC: parseTempInput(d.ambientC, d.temperatureUnit, 'absolute', previousAmbientC),
  loadPct: numberOrNull(d.loadPct),
  notes: d.notes,
});

/** The NFPA 70B light-load warning, where the load at the time is under 40 % of normal. */
export function InspectionLoadWarning({ kind, loadPct }: { kind: InspectionKind; loadPct: number | null }) {
  const warning = lightLoadWarning(kind, loadPct);
  if (!warning) return null;
  return (
    <View style={styles.warning} accessibilityRole="alert" testID="light-load-warning">
      <Text variant="label" tone="warn">⚠ LIGHT LOAD</Text>
      <Text variant="small">{warning}</Text>
    </View>
  );
}

/** Several panels may be chosen: one for a panel inspection, many for a building round. */
function PanelPicker({
  panels,
  value,
  onChange,
  error,
  locked,
}: {
  panels: Panel[];
  value: string[];
  onChange: (ids: string[]) => void;
  error?: string;
  locked: readonly string[];
}) {
  const toggle = (id: string) => onChange(value.includes(id) ? value.filter((v) => v !== id) : [...value, id]);
  const all = panels.length > 1 && value.length === panels.length;
  const clearTo = panels.filter((p) => locked.includes(p.id)).map((p) => p.id);
  return (
    <Field
      label="Panels covered"
      error={error}
      hint={locked.length > 0 ? 'Panels that already have readings stay in the inspection.' : 'One panel for a panel inspection; several for a round of the building.'}
    >
      <View style={[chipStyles.chips, styles.centred]} accessibilityRole="list" accessibilityLabel="Panels covered">
        {panels.map((panel) => {
          const selected = value.includes(panel.id);
          const fixed = selected && locked.includes(panel.id);
          return (
            <Pressable
              key={panel.id}
              accessibilityRole="checkbox"
              aria-checked={selected}
              aria-disabled={fixed}
              disabled={fixed}
              accessibilityLabel={`Panel ${panel.tag}${panel.location ? `, ${panel.location}` : ''}`}
              onPress={() => toggle(panel.id)}
              style={[chipStyles.chip, selected && chipStyles.chipSelected]}
              testID={`cover-panel-${panel.tag}`}
            >
              <Text variant="readingBold" tone={selected ? 'paper' : 'ink'}>
                {selected ? '☑ ' : '☐ '}
                {panel.tag}
              </Text>
            </Pressable>
          );
        })}
        {panels.length > 1 && (
          <Button
            label={all ? 'Clear' : 'All panels'}
            tone="quiet"
            onPress={() => onChange(all ? clearTo : panels.map((p) => p.id))}
          />
        )}
      </View>
    </Field>
  );
}

export interface InspectionFormProps {
  panels: Panel[];
  initial: InspectionCreateBody;
  isNew: boolean;
  /** the whole inspection for a new one, only the changed fields for an edit */
  onSubmit: (fields: Partial<InspectionCreateBody>) => void;
  onCancel?: () => void;
  /** panels with readings already: they cannot be taken out of the inspection */
  lockedPanelIds?: readonly string[];
}

const samePanels = (a: readonly string[], b: readonly string[]) => a.length === b.length && a.every((id) => b.includes(id));

export function InspectionForm({ panels, initial, isNew, onSubmit, onCancel, lockedPanelIds = [] }: InspectionFormProps) {
  const { unit } = useTemperatureUnit();
  const { draft, errors, setErrors, text, field } = useFormDraft<Draft>(() => toDraft(initial, unit));
  const preview = fromDraft(draft, initial.ambientC);
  const submit = () => {
    const parsed = inspectionCreateBody.safeParse(preview);
    if (!parsed.success) {
      setErrors(fieldErrors(parsed.error));
      return;
    }
    setErrors({});
    if (isNew) {
      onSubmit(parsed.data);
      return;
    }
    const { panelIds, ...rest } = changedFields(initial, parsed.data);
    onSubmit(panelIds && !samePanels(panelIds, initial.panelIds) ? { ...rest, panelIds } : rest);
  };
  return (
    <View style={styles.form}>
      <ChoiceField
        label="Kind of inspection"
        choices={INSPECTION_KINDS.map((value) => ({ value, label: INSPECTION_KIND_LABELS[value] }))}
        {...field('kind')}
      />
      <PanelPicker
        panels={panels}
        {...field('panelIds')}
        locked={lockedPanelIds}
      />
      <FieldRow>
        <DateField label="Date" required {...text('performedOn')} testID="field-performed-on" />
        <TextField
          label={`Ambient (${unitSymbol(draft.temperatureUnit)})`}
          {...text('ambientC')}
          keyboardType="numbers-and-punctuation"
          mono
          testID="field-ambient"
        />
      </FieldRow>
      <TextField
        label="Load at the time (% of normal)"
        {...text('loadPct')}
        keyboardType="decimal-pad"
        mono
        hint={needsLoad(draft.kind) ? 'NFPA 70B: a thermal survey wants at least 40 % of normal load.' : undefined}
        testID="field-load-pct"
      />
      <InspectionLoadWarning kind={draft.kind} loadPct={typeof preview.loadPct === 'number' ? preview.loadPct : null} />
      <TextField label="Notes" {...text('notes')} multiline testID="field-notes" />
      <FormProblems errors={errors} />
      <Button label={isNew ? 'Start inspection' : 'Save details'} onPress={submit} testID="save-inspection" />
      {onCancel && <Button label="Cancel" tone="secondary" onPress={onCancel} />}
    </View>
  );
}

const styles = StyleSheet.create({
  centred: { alignItems: 'center' },
  form: { gap: space.lg },
  warning: {
    gap: space.xs,
    padding: space.md,
    borderRadius: radii.md,
    borderWidth: 1,
    borderColor: colours.warn,
    backgroundColor: colours.warnSoft,
  },
});
