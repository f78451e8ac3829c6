import { StyleSheet, View } from 'react-native';
import { circuitWarnings, occupiedPositions, panelLayout, phaseOf, positionClash, type CircuitWarning } from '@/shared/calc';
import {
  BREAKER_TYPES,
  LOAD_KINDS,
  SYSTEM_INFO,
  type BreakerType,
  type CircuitStatus,
  type ConductorMaterial,
  type ConductorSize,
  type InsulationTempC,
  type LoadKind,
} from '@/shared/domain';
import { circuitCreateBody, fieldErrors, type Circuit, type CircuitFields, type Panel } from '@/shared/schemas';
import { BandPicker } from './band-picker';
import { ConductorSizePicker } from './conductor-size-picker';
import { Button } from '@/components/ui/button';
import { ChoiceField, FieldRow, FormProblems, TextField, ToggleField } from '@/components/ui/fields';
import { changedFields, numberOrNull, textOf } from '@/components/ui/form-values';
import { Text } from '@/components/ui/text';
import { bindForm, useFormDraft } from '@/components/ui/use-form-draft';
import { BreakerFields, breakerDraft, breakerValues, type BreakerDraft } from './breaker-fields';
import { colours, radii, space } from '@/components/ui/theme';

export const BREAKER_TYPE_LABELS: Record<BreakerType, string> = {
  standard: 'Standard',
  gfci: 'GFCI',
  afci: 'AFCI',
  'dual-function': 'Dual function',
  'shunt-trip': 'Shunt trip',
  surge: 'Surge device',
  other: 'Other',
};
export const LOAD_KIND_LABELS: Record<LoadKind, string> = {
  lighting: 'Lighting',
  receptacles: 'Receptacles',
  motor: 'Motor',
  hvac: 'HVAC',
  appliance: 'Appliance',
  feeder: 'Feeder',
  other: 'Other',
};
export const STATUS_LABELS: Record<CircuitStatus, string> = {
  'in-use': 'In use',
  spare: 'Spare breaker',
  space: 'Space (no breaker)',
};

export const NEW_CIRCUIT: CircuitFields = {
  position: 1,
  poles: 1,
  ratingA: 20,
  breakerType: 'standard',
  description: '',
  loadKind: 'other',
  loadVA: null,
  continuous: false,
  conductorSize: null,
  conductorMaterial: 'Cu',
  insulationTempC: 75,
  terminationTempC: null,
  lengthFt: null,
  status: 'in-use',
  feedsPanelId: null,
  handleLock: false,
  notes: '',
  bandId: null,
  interruptingKA: null,
  breakerMake: '',
  catalogueNumber: '',
  ambientC: null,
  currentCarrying: null,
  verifiedOn: null,
  verifiedBy: null,
};

interface Draft extends BreakerDraft {
  position: string;
  poles: 1 | 2 | 3;
  ratingA: string;
  breakerType: BreakerType;
  description: string;
  loadKind: LoadKind;
  loadVA: string;
  continuous: boolean;
  conductorSize: ConductorSize | null;
  conductorMaterial: ConductorMaterial | null;
  insulationTempC: InsulationTempC | null;
  terminationTempC: InsulationTempC | null;
  lengthFt: string;
  status: CircuitStatus;
  handleLock: boolean;
  notes: string;
  bandId: string | null;
}

function toDraft(c: CircuitFields): Draft {
  return {
    ...breakerDraft(c),
    position: textOf(c.position),
    poles: c.poles,
    ratingA: textOf(c.ratingA),
    breakerType: c.breakerType,
    description: c.description,
    loadKind: c.loadKind,
    loadVA: textOf(c.loadVA),
    continuous: c.continuous,
    conductorSize: c.conductorSize,
    conductorMaterial: c.conductorMaterial,
    insulationTempC: c.insulationTempC,
    // a copy persisted before the field existed has none
    terminationTempC: c.terminationTempC ?? null,
    lengthFt: textOf(c.lengthFt),
    status: c.status,
    handleLock: c.handleLock,
    notes: c.notes,
    bandId: c.bandId,
  };
}

function fromDraft(d: Draft, base: CircuitFields): CircuitFields {
  return {
    ...base,
    position: numberOrNull(d.position) as number,
    poles: d.poles,
    ratingA: d.status === 'space' ? null : numberOrNull(d.ratingA),
    breakerType: d.breakerType,
    description: d.description,
    loadKind: d.loadKind,
    loadVA: numberOrNull(d.loadVA),
    continuous: d.continuous,
    conductorSize: d.conductorSize,
    conductorMaterial: d.conductorMaterial,
    insulationTempC: d.insulationTempC,
    terminationTempC: d.terminationTempC,
    lengthFt: numberOrNull(d.lengthFt),
    status: d.status,
    handleLock: d.handleLock,
    notes: d.notes,
    // a band belongs to a breaker: a space has none
    bandId: d.status === 'space' ? null : d.bandId,
    ...breakerValues(d),
  };
}

/** Where the breaker would sit, checked against the panel as the device knows it. */
function layoutProblems(panel: Panel, others: Circuit[], c: { id: string; position: number; poles: number }) {
  const fields: Record<string, string> = {};
  const { problems } = panelLayout(panel, [c]);
  for (const p of problems) fields[p.code === 'bad-poles' || p.code === 'same-phase' ? 'poles' : 'position'] ??= p.message;
  const clash = positionClash(c, others);
  if (clash) {
    const what = clash.circuit.description ? ` (${clash.circuit.description})` : '';
    fields.position ??= `position ${clash.position} is taken by the breaker at ${clash.circuit.position}${what}`;
  }
  return fields;
}

export interface CircuitFormProps {
  panel: Panel;
  /** the panel's circuits, to refuse a position that is taken before the change is queued */
  others: Circuit[];
  initial: CircuitFields & { id?: string };
  /** creating a new circuit rather than editing one */
  isNew: boolean;
  /** gets the whole circuit for a new one, only the changed fields for an edit */
  onSubmit: (fields: Partial<CircuitFields>) => void;
  onDelete?: () => void;
}

export function CircuitForm({ panel, others, initial, isNew, onSubmit, onDelete }: CircuitFormProps) {
  const { draft, set, errors, setErrors, text, field } = useFormDraft<Draft>(() => toDraft(initial));
  const threePhase = SYSTEM_INFO[panel.system].phases === 3;
  const isSpace = draft.status === 'space';

  const submit = () => {
    const candidate = fromDraft(draft, initial);
    const parsed = circuitCreateBody.safeParse(candidate);
    if (!parsed.success) {
      setErrors(fieldErrors(parsed.error));
      return;
    }
    const layoutErrors = layoutProblems(panel, others, { id: initial.id ?? '', ...parsed.data });
    if (Object.keys(layoutErrors).length > 0) {
      setErrors(layoutErrors);
      return;
    }
    setErrors({});
    onSubmit(isNew ? parsed.data : changedFields(initial, parsed.data));
  };

  const preview = fromDraft(draft, initial);
  const warnings = Number.isFinite(preview.position) ? previewWarnings(preview, panel) : [];
  const positionNumber = numberOrNull(draft.position);
  const phases =
    positionNumber && Number.isInteger(positionNumber)
      ? occupiedPositions(positionNumber, draft.poles).map((p) => phaseOf(panel.system, p)).join('-')
      : '';

  return (
    <View style={styles.form}>
      <CircuitWarningsBox warnings={warnings} />
      <TextField
        label="Directory description"
        {...text('description')}
        hint="Specific purpose, as it should read on the door: “Exam 2 receptacles”, “RTU-1”."
        testID="field-description"
        editable={!isSpace}
      />
      <ChoiceField
        label="Status"
        choices={(['in-use', 'spare', 'space'] as const).map((value) => ({ value, label: STATUS_LABELS[value] }))}
        {...field('status')}
      />
      <FieldRow>
        <TextField
          label="Position"
          {...text('position')}
          keyboardType="number-pad"
          mono
          hint={phases ? `phase ${phases}` : undefined}
          testID="field-position"
        />
        <TextField
          label="Trip rating (A)"
          value={isSpace ? '' : draft.ratingA}
          onChangeText={set('ratingA')}
          keyboardType="number-pad"
          mono
          editable={!isSpace}
          error={errors.ratingA}
          testID="field-rating"
        />
      </FieldRow>
      <ChoiceField
        label="Poles"
        choices={[1, 2, 3].filter((p) => threePhase || p < 3).map((p) => ({ value: p as 1 | 2 | 3, label: `${p}P` }))}
        {...field('poles')}
      />
      {!isSpace && (
        <>
          <ChoiceField
            label="Breaker type"
            choices={BREAKER_TYPES.map((value) => ({ value, label: BREAKER_TYPE_LABELS[value] }))}
            {...field('breakerType')}
          />
          <ChoiceField
            label="Load kind"
            choices={LOAD_KINDS.map((value) => ({ value, label: LOAD_KIND_LABELS[value] }))}
            {...field('loadKind')}
          />
          <FieldRow>
            <TextField
              label="Connected load (VA)"
              {...text('loadVA')}
              keyboardType="number-pad"
              mono
              testID="field-load"
            />
            <TextField
              label="One-way length (ft)"
              {...text('lengthFt')}
              keyboardType="decimal-pad"
              mono
              testID="field-length"
            />
          </FieldRow>
          <ToggleField label="Continuous load (3 h or more)" {...field('continuous')} />
          <ConductorSizePicker {...field('conductorSize')} />
          <ChoiceField
            label="Conductor material"
            choices={[
              { value: 'Cu' as const, label: 'Copper (Cu)' },
              { value: 'Al' as const, label: 'Aluminium (Al)' },
            ]}
            {...field('conductorMaterial')}
          />
          <ChoiceField
            label="Insulation rating"
            choices={[60, 75, 90].map((t) => ({ value: t as InsulationTempC, label: `${t} °C` }))}
            {...field('insulationTempC')}
          />
          <ChoiceField
            label="Termination rating"
            choices={[
              { value: null, label: `As the panel (${panelTermination(panel)})` },
              ...[60, 75, 90].map((t) => ({ value: t as InsulationTempC | null, label: `${t} °C` })),
            ]}
            {...field('terminationTempC')}
            hint="What this breaker’s terminals are listed and marked for, where it differs from the panel (NEC 110.14(C))."
          />
          <BreakerFields bind={bindForm(draft, set, errors)} />
          <ToggleField label="Handle lock fitted" {...field('handleLock')} />
          {numberOrNull(draft.ratingA) ? (
            <BandPicker
              ratingA={numberOrNull(draft.ratingA) as number}
              {...field('bandId')}
            />
          ) : null}
        </>
      )}
      <TextField label="Notes" {...text('notes')} multiline />

      <FormProblems errors={errors} />
      <Button label={isNew ? 'Add circuit' : 'Save circuit'} onPress={submit} testID="save-circuit" />
      {onDelete && <Button label="Delete circuit…" tone="secondary" onPress={onDelete} />}
    </View>
  );
}

export function CircuitWarningsBox({ warnings }: { warnings: CircuitWarning[] }) {
  if (warnings.length === 0) return null;
  return (
    <View style={styles.warnings} accessibilityRole="alert" testID="circuit-warnings">
      <Text variant="label" tone="warn">⚠ {warnings.length} to check</Text>
      {warnings.map((w) => (
        <Text key={w.code} variant="small">• {w.message}</Text>
      ))}
    </View>
  );
}

/** The panel's termination rating in words. */
export function panelTermination(panel: Panel): string {
  return panel.terminationTempC ? `${panel.terminationTempC} °C` : 'not recorded: 60 °C up to 100 A';
}

/**
 * Warnings for the circuit as typed: a number the checks refuse (a negative load while typing) shows
 * no warnings here; the field itself is named at the save.
 */
function previewWarnings(circuit: CircuitFields, panel: Panel): CircuitWarning[] {
  try {
    return circuitWarnings(circuit, panel);
  } catch (error) {
    if (error instanceof RangeError) return [];
    throw error;
  }
}

const styles = StyleSheet.create({
  form: { gap: space.lg },
  warnings: {
    gap: space.xs,
    padding: space.md,
    borderRadius: radii.md,
    borderWidth: 1,
    borderColor: colours.warn,
    backgroundColor: colours.warnSoft,
  },
});
