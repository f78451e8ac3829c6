/**
 * The reading form: the fields of its kind, what the reading means as it is typed (the same
 * shared/assess.ts the server and the report use), per-field errors, save and delete. A new
 * reading stays on screen after its first save, so photos can be added and a deficiency raised.
 */
import { useState } from 'react';
import { StyleSheet, View } from 'react-native';
import { Card } from '@/components/ui/card';
import type { AssessContext } from '@/shared/assess';
import type { Band, ReadingCreateBody, ReadingFields, ReadingPatchBody } from '@/shared/records';
import type { Circuit, Panel } from '@/shared/schemas';
import { Button } from '@/components/ui/button';
import { FormProblems, TextField } from '@/components/ui/fields';
import { changedFields } from '@/components/ui/form-values';
import { READING_KIND_LABELS } from '@/components/inspections/inspection-format';
import { ReadingAssessment } from './reading-assessment';
import { checkReading, fromReadingDraft, liveAssessment, toReadingDraft, type ReadingDraft } from './reading-draft';
import { ThermalFields, TorqueFields, TripFields } from './reading-fields';
import { Text } from '@/components/ui/text';
import { bindForm, useFormDraft } from '@/components/ui/use-form-draft';
import { space } from '@/components/ui/theme';
import { useTemperatureUnit } from '@/hooks/use-temperature-unit';
import { TripReadingPlot } from '@/components/trips/trip-reading-plot';

/** The fields a patch may carry: the inspection, panel and kind of a reading never change. */
function patchOf(before: ReadingFields, after: ReadingCreateBody): ReadingPatchBody {
  const { inspectionId: _i, panelId: _p, kind: _k, ...changed } = changedFields(before, after);
  return changed;
}

export interface ReadingFormProps {
  initial: ReadingFields;
  /** null for a new reading */
  readingId: string | null;
  panel: Panel;
  circuits: Circuit[];
  bands: Band[] | undefined;
  /** the inspection's ambient temperature, to fill a reference over ambient air */
  ambientC: number | null;
  /** what the live judgement needs besides the reading (its circuit, panel, band) */
  contextFor: (reading: ReadingFields) => AssessContext;
  /** queue the new reading; returns its id */
  onCreate: (body: ReadingCreateBody) => string;
  onPatch: (readingId: string, patch: ReadingPatchBody) => void;
  onDelete?: (readingId: string) => void;
  onDone: () => void;
  /** rendered beside the form on a wide screen, under it on a phone: photos, raising a deficiency */
  followUp: (state: { readingId: string | null; dirty: boolean }) => React.ReactNode;
  wide: boolean;
}

export function ReadingForm(props: ReadingFormProps) {
  const { initial, panel, circuits, bands, ambientC, contextFor, wide } = props;
  const { unit } = useTemperatureUnit();
  const { draft, set, errors, setErrors } = useFormDraft<ReadingDraft>(() => toReadingDraft(initial, unit));
  const [readingId, setReadingId] = useState(props.readingId);
  const [baseline, setBaseline] = useState<ReadingFields>(initial);
  const [justSaved, setJustSaved] = useState(false);

  const candidate = fromReadingDraft(draft, baseline);
  const dirty = readingId === null || Object.keys(changedFields(baseline, candidate)).length > 0;
  const live = liveAssessment(candidate, { ...contextFor(candidate), temperatureUnit: draft.temperatureUnit });
  const kind = initial.kind;

  const edit: typeof set = (key) => (value) => {
    setJustSaved(false);
    set(key)(value);
  };

  const save = () => {
    const checked = checkReading(candidate);
    if (!checked.ok) {
      setErrors(checked.errors);
      return;
    }
    setErrors({});
    if (readingId === null) {
      setReadingId(props.onCreate(checked.body));
    } else {
      const patch = patchOf(baseline, checked.body);
      if (Object.keys(patch).length > 0) props.onPatch(readingId, patch);
    }
    setBaseline(checked.body);
    setJustSaved(true);
  };

  const { text, field } = bindForm(draft, edit, errors);
  const fieldProps = { draft, set: edit, errors, text, field, panel, circuits };
  const fields = (
    <View style={styles.fields}>
      {kind === 'thermal' && <ThermalFields {...fieldProps} ambientC={ambientC} />}
      {kind === 'torque' && <TorqueFields {...fieldProps} />}
      {kind === 'trip' && <TripFields {...fieldProps} bands={bands} />}
      <TextField label="Notes" {...text('notes')} multiline testID="field-reading-notes" />
    </View>
  );

  const judgement = (
    <Card size="row" strong testID="live-assessment" accessibilityLiveRegion="polite">
      <Text variant="label" tone="soft" heading={2} caps>
        What it means
      </Text>
      {live.assessment ? (
        <ReadingAssessment assessment={live.assessment} />
      ) : (
        <>
          <Text tone="soft">To see the judgement:</Text>
          {live.missing.map((m) => (
            <Text key={m} variant="small" tone="soft">• {m}</Text>
          ))}
        </>
      )}
      <TripReadingPlot reading={candidate} assessment={live.assessment} circuits={circuits} bands={bands} />
    </Card>
  );

  const saveBlock = (
    <View style={styles.actions}>
      <FormProblems errors={errors} />
      {justSaved && !dirty && (
        <Text variant="strong" testID="reading-saved">
          ✓ Saved on this device{kind === 'thermal' ? ': add the thermal and visible images now, or go back.' : '.'}
        </Text>
      )}
      <Button
        label={readingId === null ? `Save ${READING_KIND_LABELS[kind].toLowerCase()}` : dirty ? 'Save changes' : 'Saved'}
        onPress={save}
        disabled={readingId !== null && !dirty}
        testID="save-reading"
      />
    </View>
  );
  const exitBlock =
    readingId === null ? null : (
      <View style={styles.actions}>
        <Button label="Back to the inspection" tone="secondary" onPress={props.onDone} testID="reading-done" />
        {props.onDelete && (
          <Button label="Delete reading…" tone="quiet" onPress={() => props.onDelete?.(readingId)} testID="delete-reading" />
        )}
      </View>
    );

  const followUp = props.followUp({ readingId, dirty });
  if (wide) {
    return (
      <View style={styles.columns}>
        <View style={styles.main}>
          {fields}
          {saveBlock}
          {exitBlock}
        </View>
        <View style={styles.aside}>
          {judgement}
          {followUp}
        </View>
      </View>
    );
  }
  return (
    <View style={styles.stack}>
      {fields}
      {judgement}
      {saveBlock}
      {followUp}
      {exitBlock}
    </View>
  );
}

const styles = StyleSheet.create({
  stack: { gap: space.lg },
  columns: { flexDirection: 'row', gap: space.xl, alignItems: 'flex-start' },
  main: { flex: 3, gap: space.lg },
  aside: { flex: 2, gap: space.lg },
  fields: { gap: space.lg },
  actions: { gap: space.sm },
});
