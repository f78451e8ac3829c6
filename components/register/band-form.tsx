/**
 * A time-current band entered from the maker's published curve: label, rating, where it was read
 * from, the band's points (multiple of rating → minimum and maximum time) and the instantaneous
 * pickup. Bands are the organisation's library, kept in the office: saving needs a connection,
 * and the draft stays on screen when it fails.
 */
import { StyleSheet, TextInput, View } from 'react-native';
import { bandCreateBody, type BandCreateBody } from '@/shared/records';
import { fieldErrors } from '@/shared/schemas';
import { Button } from '@/components/ui/button';
import { FieldRow, FormProblems, TextField } from '@/components/ui/fields';
import { numberOrNull } from '@/components/ui/form-values';
import { Text } from '@/components/ui/text';
import { useFormDraft } from '@/components/ui/use-form-draft';
import { colours, fonts, MIN_TOUCH, radii, space } from '@/components/ui/theme';

interface PointDraft {
  multiple: string;
  minS: string;
  maxS: string;
}

interface Draft {
  label: string;
  ratingA: string;
  source: string;
  points: PointDraft[];
  instantaneousMultiple: string;
  instantaneousTolerancePct: string;
}

const EMPTY_POINT: PointDraft = { multiple: '', minS: '', maxS: '' };

export const NEW_BAND_DRAFT: Draft = {
  label: '',
  ratingA: '',
  source: '',
  // the usual places to read a thermal-magnetic curve [CP]: 1.35×, 3×, 5× of rating
  points: [
    { multiple: '1.35', minS: '', maxS: '' },
    { multiple: '3', minS: '', maxS: '' },
    { multiple: '5', minS: '', maxS: '' },
  ],
  instantaneousMultiple: '',
  instantaneousTolerancePct: '',
};

function fromDraft(d: Draft) {
  return {
    label: d.label,
    ratingA: numberOrNull(d.ratingA),
    source: d.source,
    points: d.points.map((p) => ({ multiple: numberOrNull(p.multiple), minS: numberOrNull(p.minS), maxS: numberOrNull(p.maxS) })),
    instantaneousMultiple: numberOrNull(d.instantaneousMultiple),
    instantaneousTolerancePct: numberOrNull(d.instantaneousTolerancePct),
  };
}

/**
 * The band is read on log–log paper: a time of 0 s has no place on it, and the interpolation
 * (shared/calc/trip.ts tripBand) refuses it, so the form asks for a minimum above 0 here.
 */
function logScaleErrors(points: { minS: number | null }[]): Record<string, string> {
  const out: Record<string, string> = {};
  points.forEach((p, i) => {
    if (p.minS !== null && p.minS <= 0) out[`points.${i}.minS`] = 'more than 0 s (the curve is on a log scale)';
  });
  return out;
}

export function BandForm({
  saving,
  failure,
  offline,
  onSave,
}: {
  saving: boolean;
  /** why the last save failed, in words; the draft stays */
  failure: string | null;
  offline: boolean;
  /** resolves with the server's field errors, or null when saved */
  onSave: (body: BandCreateBody) => Promise<Record<string, string> | null>;
}) {
  const { draft, set, errors, setErrors, text } = useFormDraft<Draft>(() => NEW_BAND_DRAFT);
  const setPoint = (index: number, key: keyof PointDraft) => (text: string) => {
    set('points')(draft.points.map((p, i) => (i === index ? { ...p, [key]: text } : p)));
    setErrors(({ [`points.${index}.${key}`]: _gone, points: _order, ...rest }) => rest);
  };
  const addPoint = () => set('points')([...draft.points, EMPTY_POINT]);
  const removePoint = (index: number) => set('points')(draft.points.filter((_, i) => i !== index));

  const submit = async () => {
    const candidate = fromDraft(draft);
    const parsed = bandCreateBody.safeParse(candidate);
    // the log-scale rule is named together with the schema's, not one round later
    const scale = logScaleErrors(candidate.points);
    if (!parsed.success || Object.keys(scale).length > 0) {
      setErrors({ ...scale, ...(parsed.success ? {} : fieldErrors(parsed.error)) });
      return;
    }
    setErrors({});
    const serverErrors = await onSave(parsed.data);
    if (serverErrors) setErrors(serverErrors);
  };

  return (
    <View style={styles.form}>
      <View style={styles.columns}>
        <View style={styles.column}>
          <TextField
            label="Label"
            {...text('label')}
            placeholder="e.g. Bolt-on 1P 20 A thermal-magnetic"
            testID="band-label"
          />
          <TextField
            label="Rating (A)"
            {...text('ratingA')}
            keyboardType="number-pad"
            mono
            testID="band-rating"
          />
          <TextField
            label="Source"
            {...text('source')}
            hint="The maker’s curve number and edition, so anyone can check the points against it."
            testID="band-source"
          />
          <FieldRow alignEnd>
            <TextField
              label="Instantaneous pickup (× rating)"
              {...text('instantaneousMultiple')}
              keyboardType="decimal-pad"
              mono
              testID="band-instantaneous"
            />
            <TextField
              label="Tolerance (± %)"
              {...text('instantaneousTolerancePct')}
              keyboardType="decimal-pad"
              mono
              testID="band-tolerance"
            />
          </FieldRow>
        </View>
        <View style={styles.column}>
          <Text variant="label" tone="soft">POINTS OF THE BAND (READ OFF THE CURVE)</Text>
          <View style={styles.tableHead}>
            <Text variant="label" tone="soft" style={styles.colMultiple}>× rating</Text>
            <Text variant="label" tone="soft" style={styles.colTime}>min s</Text>
            <Text variant="label" tone="soft" style={styles.colTime}>max s</Text>
            <View style={styles.colRemove} />
          </View>
          {draft.points.map((point, index) => {
            const rowErrors = (['multiple', 'minS', 'maxS'] as const)
              .map((k) => errors[`points.${index}.${k}`] && `${k === 'multiple' ? 'multiple' : k === 'minS' ? 'min' : 'max'}: ${errors[`points.${index}.${k}`]}`)
              .filter(Boolean);
            return (
              <View key={index} style={styles.point} testID={`band-point-${index}`}>
                <View style={styles.pointRow}>
                  {(['multiple', 'minS', 'maxS'] as const).map((key) => (
                    <TextInput
                      key={key}
                      value={point[key]}
                      onChangeText={setPoint(index, key)}
                      keyboardType="decimal-pad"
                      accessibilityLabel={`Point ${index + 1}: ${key === 'multiple' ? 'multiple of rating' : key === 'minS' ? 'minimum seconds' : 'maximum seconds'}`}
                      aria-invalid={!!errors[`points.${index}.${key}`]}
                      style={[
                        styles.cellInput,
                        key === 'multiple' ? styles.colMultiple : styles.colTime,
                        !!errors[`points.${index}.${key}`] && styles.inputError,
                      ]}
                      testID={`band-point-${index}-${key}`}
                    />
                  ))}
                  <View style={styles.colRemove}>
                    <Button
                      label="✕"
                      tone="quiet"
                      accessibilityLabel={`Remove point ${index + 1}`}
                      onPress={() => removePoint(index)}
                      disabled={draft.points.length <= 2}
                    />
                  </View>
                </View>
                {rowErrors.length > 0 && (
                  <Text variant="small" tone="danger" accessibilityRole="alert">✕ {rowErrors.join('; ')}</Text>
                )}
              </View>
            );
          })}
          {errors.points && (
            <Text variant="small" tone="danger" accessibilityRole="alert">✕ {errors.points}</Text>
          )}
          <Text variant="small" tone="faint">
            At least two points, going up in multiple of rating. Between points the band is interpolated on the log–log scale of the curve.
          </Text>
          <Button label="+ Add point" tone="secondary" onPress={addPoint} disabled={draft.points.length >= 40} testID="band-add-point" />
        </View>
      </View>
      <View style={styles.note}>
        <Text variant="small">
          Bands are kept in the office library and shared with everyone in your organisation: saving one needs a connection.
        </Text>
        {offline && <Text variant="small" tone="warn">⚠ No connection right now: your draft stays here until it can be saved.</Text>}
      </View>
      <FormProblems errors={errors} />
      {failure && (
        <Text tone="danger" accessibilityRole="alert" testID="band-save-error">
          Not saved: {failure} Your draft is kept.
        </Text>
      )}
      <Button label="Save band" onPress={() => void submit()} busy={saving} testID="save-band" />
    </View>
  );
}

const styles = StyleSheet.create({
  form: { gap: space.lg },
  columns: { flexDirection: 'row', flexWrap: 'wrap', gap: space.xl },
  column: { flexGrow: 1, flexBasis: 340, gap: space.lg },
  // inputs line up at the bottom even when one label wraps
  tableHead: { flexDirection: 'row', gap: space.sm, marginBottom: -space.sm },
  point: { gap: space.xs },
  pointRow: { flexDirection: 'row', gap: space.sm, alignItems: 'center' },
  colMultiple: { flex: 1 },
  colTime: { flex: 1 },
  colRemove: { width: MIN_TOUCH },
  cellInput: {
    minHeight: MIN_TOUCH,
    minWidth: 0,
    borderWidth: 1,
    borderColor: colours.ruleStrong,
    borderRadius: radii.md,
    backgroundColor: colours.card,
    paddingHorizontal: space.sm,
    fontFamily: fonts.mono,
    fontSize: 16,
    color: colours.ink,
  },
  inputError: { borderColor: colours.danger, borderWidth: 2 },
  note: { gap: space.xs, padding: space.md, borderRadius: radii.md, backgroundColor: colours.copperSoft },
});
