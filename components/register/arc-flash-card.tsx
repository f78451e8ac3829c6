/**
 * The panel's arc-flash label as a small card: the study's figures, when it is due for review
 * (five years after the study, NFPA 70E 130.5(G)) with a warning once it is overdue, and the usual
 * caution. Electricians and admins add or correct it offline (queued like any change); everyone
 * else reads it.
 */
import { useState } from 'react';
import { StyleSheet, View } from 'react-native';
import { Button } from '@/components/ui/button';
import { Card } from '@/components/ui/card';
import { ChoiceField, FieldRow, FormProblems, TextField } from '@/components/ui/fields';
import { changedFields, numberOrNull, textOf } from '@/components/ui/form-values';
import { Text } from '@/components/ui/text';
import { colours, radii, space } from '@/components/ui/theme';
import { useFormDraft } from '@/components/ui/use-form-draft';
import { localToday } from '@/components/inspections/inspection-format';
import { useArcFlashLabel, useArcFlashWrites } from '@/hooks/use-arc-flash';
import {
  arcFlashCreateBody,
  arcFlashOverdue,
  arcFlashProblems,
  arcFlashReviewDue,
  PPE_CATEGORIES,
  type ArcFlashLabel,
} from '@/shared/arc-flash';
import type { Role } from '@/shared/domain';
import { can } from '@/shared/permissions';
import { fieldErrors } from '@/shared/schemas';

const CAUTION =
  'Work near exposed energised parts only as NFPA 70E and your employer’s procedures require, with the PPE the study and its label call for; where the label and the study disagree, or the equipment has changed since, the study governs and must be reviewed before work.';

interface Draft {
  studyDate: string;
  energy: string;
  ppeCategory: number | null;
  boundaryIn: string;
  workingDistanceIn: string;
  nominalV: string;
  studyBy: string;
}

const draftOf = (l: ArcFlashLabel | undefined): Draft => ({
  studyDate: l?.studyDate ?? '',
  energy: textOf(l?.incidentEnergyCalCm2),
  ppeCategory: l?.ppeCategory ?? null,
  boundaryIn: textOf(l?.boundaryIn),
  workingDistanceIn: textOf(l?.workingDistanceIn ?? 18),
  nominalV: textOf(l?.nominalV),
  studyBy: l?.studyBy ?? '',
});

const PPE_CHOICES = [{ value: null, label: 'none (energy given)' }, ...PPE_CATEGORIES.map((c) => ({ value: c, label: `Category ${c}` }))];

export function ArcFlashCard({ buildingId, panelId, role }: { buildingId: string; panelId: string; role: Role }) {
  const label = useArcFlashLabel(buildingId, panelId);
  const [editing, setEditing] = useState(false);
  const canEdit = can(role, 'arc-flash.edit');
  const today = localToday();
  return (
    <Card size="compact" testID="arc-flash-card">
      {label ? (
        <>
          <Text variant="strong" heading={2} testID="arc-flash-summary">
            Arc-flash label: study {label.studyDate}, review due {arcFlashReviewDue(label.studyDate)}
          </Text>
          <Text variant="small" tone="soft">
            {label.incidentEnergyCalCm2 !== null
              ? `${label.incidentEnergyCalCm2} cal/cm² at ${label.workingDistanceIn} in`
              : `PPE category ${label.ppeCategory}`}
            {` · boundary ${label.boundaryIn} in · ${label.nominalV} V · study by ${label.studyBy}`}
          </Text>
          {arcFlashOverdue(label.studyDate, today) && (
            <Text variant="small" tone="danger" testID="arc-flash-overdue">
              ⚠ Review overdue: the study is more than five years old (NFPA 70E asks for a review at least every five years).
            </Text>
          )}
        </>
      ) : (
        <Text variant="small" tone="soft" heading={2} testID="arc-flash-summary">Arc-flash label: none recorded for this panel.</Text>
      )}
      <View style={styles.caution}>
        <Text variant="small">⚠ {CAUTION}</Text>
      </View>
      {canEdit && !editing && (
        <Button
          label={label ? 'Correct the label' : 'Add the arc-flash label'}
          tone="secondary"
          onPress={() => setEditing(true)}
          testID="arc-flash-edit"
        />
      )}
      {canEdit && editing && (
        <ArcFlashForm buildingId={buildingId} panelId={panelId} label={label} today={today} onDone={() => setEditing(false)} />
      )}
    </Card>
  );
}

function ArcFlashForm(props: { buildingId: string; panelId: string; label: ArcFlashLabel | undefined; today: string; onDone: () => void }) {
  const { label, today } = props;
  const writes = useArcFlashWrites(props.buildingId);
  const { draft, errors, setErrors, text, field } = useFormDraft(() => draftOf(label));

  const save = () => {
    const parsed = arcFlashCreateBody.safeParse({
      panelId: props.panelId,
      studyDate: draft.studyDate.trim(),
      incidentEnergyCalCm2: numberOrNull(draft.energy),
      ppeCategory: draft.ppeCategory,
      boundaryIn: numberOrNull(draft.boundaryIn),
      workingDistanceIn: numberOrNull(draft.workingDistanceIn),
      nominalV: numberOrNull(draft.nominalV),
      studyBy: draft.studyBy,
    });
    if (!parsed.success) return setErrors(renamed(fieldErrors(parsed.error)));
    // the device's own calendar day: the contract allows for the time zone furthest ahead
    const local = arcFlashProblems(parsed.data, today);
    if (Object.keys(local).length > 0) return setErrors(renamed(local));
    if (label) {
      const { panelId: _same, ...fields } = parsed.data;
      const patch = changedFields(label, fields);
      if (Object.keys(patch).length > 0) writes.patch(label.id, patch);
    } else {
      writes.create(parsed.data);
    }
    props.onDone();
  };

  return (
    <View style={styles.form} testID="arc-flash-form">
      <FieldRow wrap>
        <TextField label="Study date" placeholder="YYYY-MM-DD" {...text('studyDate')} testID="arc-flash-study-date" />
        <TextField label="Study by" {...text('studyBy')} testID="arc-flash-study-by" />
      </FieldRow>
      <FieldRow wrap>
        <TextField label="Incident energy (cal/cm²)" keyboardType="decimal-pad" {...text('energy')} testID="arc-flash-energy" />
        <TextField label="Working distance (in)" keyboardType="decimal-pad" {...text('workingDistanceIn')} testID="arc-flash-distance" />
      </FieldRow>
      <ChoiceField label="PPE category (instead of the energy)" choices={PPE_CHOICES} {...field('ppeCategory')} />
      <FieldRow wrap>
        <TextField label="Arc-flash boundary (in)" keyboardType="decimal-pad" {...text('boundaryIn')} testID="arc-flash-boundary" />
        <TextField label="Nominal voltage (V)" keyboardType="decimal-pad" {...text('nominalV')} testID="arc-flash-voltage" />
      </FieldRow>
      <FormProblems errors={errors} />
      <FieldRow>
        <Button label="Save label" onPress={save} testID="arc-flash-save" />
        <Button label="Cancel" tone="quiet" onPress={props.onDone} />
      </FieldRow>
    </View>
  );
}

/** The contract's field names to the form's (the energy's box is `energy`). */
function renamed(errors: Record<string, string>): Record<string, string> {
  const { incidentEnergyCalCm2, ...rest } = errors;
  return incidentEnergyCalCm2 ? { ...rest, energy: incidentEnergyCalCm2 } : rest;
}

const styles = StyleSheet.create({
  caution: { borderLeftWidth: 4, borderLeftColor: colours.warn, backgroundColor: colours.warnSoft, padding: space.sm, borderRadius: radii.sm },
  form: { gap: space.sm },
});
