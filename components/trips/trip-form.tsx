/**
 * Record an unexpected trip of a breaker: when (defaults to now), the load at the time if known,
 * and what was happening. The load against the rating is what tells an overload from a nuisance
 * trip (shared/calc/nuisance.ts), so the form says it as it is typed.
 */
import { StyleSheet, View } from 'react-native';
import { NUISANCE_TRIP_LOAD_FRACTION } from '@/shared/calc';
import { tripCreateBody, type TripCreateBody } from '@/shared/records';
import { fieldErrors, type Circuit } from '@/shared/schemas';
import { Button } from '@/components/ui/button';
import { isRealDate } from '@/components/deficiencies/deficiency-format';
import { DateField } from '@/components/ui/date-field';
import { FieldRow, FormProblems, TextField } from '@/components/ui/fields';
import { numberOrNull } from '@/components/ui/form-values';
import { useFormDraft } from '@/components/ui/use-form-draft';
import { space } from '@/components/ui/theme';

interface Draft {
  date: string;
  time: string;
  loadA: string;
  circumstances: string;
}

const pad = (n: number) => String(n).padStart(2, '0');
function localNow(now = new Date()): { date: string; time: string } {
  return { date: `${now.getFullYear()}-${pad(now.getMonth() + 1)}-${pad(now.getDate())}`, time: `${pad(now.getHours())}:${pad(now.getMinutes())}` };
}

/** "5 A is 25 % of the 20 A rating: …" while the load is typed. */
export function loadAgainstRating(loadA: number | null, ratingA: number | null): string | null {
  if (loadA === null || !Number.isFinite(loadA) || !ratingA) return null;
  const pct = Math.round((loadA / ratingA) * 100);
  const low = loadA < NUISANCE_TRIP_LOAD_FRACTION * ratingA;
  return `${loadA} A is ${pct} % of the ${ratingA} A rating${low ? ': well below it — a breaker this lightly loaded should not trip' : ''}.`;
}

export function TripForm({ circuit, onSubmit }: { circuit: Circuit; onSubmit: (body: TripCreateBody) => void }) {
  const { draft, errors, setErrors, text } = useFormDraft<Draft>(() => ({ ...localNow(), loadA: '', circumstances: '' }));

  const submit = () => {
    const extra: Record<string, string> = {};
    const date = draft.date.trim();
    const time = draft.time.trim();
    if (!isRealDate(date)) extra.date = 'a date as YYYY-MM-DD';
    const hm = /^(\d{1,2}):(\d{2})$/.exec(time);
    if (!hm || Number(hm[1]) > 23 || Number(hm[2]) > 59) extra.time = 'a time as HH:MM (24-hour)';
    let occurredAt = '';
    if (!extra.date && !extra.time) {
      const at = new Date(`${date}T${pad(Number(hm![1]))}:${hm![2]}:00`);
      if (at.getTime() > Date.now() + 5 * 60_000) extra.date = 'the trip cannot be in the future';
      occurredAt = at.toISOString();
    }
    const parsed = tripCreateBody.safeParse({
      panelId: circuit.panelId,
      circuitId: circuit.id,
      occurredAt,
      loadA: numberOrNull(draft.loadA),
      circumstances: draft.circumstances,
    });
    const fields = parsed.success ? {} : fieldErrors(parsed.error);
    if (fields.occurredAt) {
      if (!extra.date && !extra.time) extra.date = fields.occurredAt;
      delete fields.occurredAt;
    }
    const all = { ...fields, ...extra };
    setErrors(all);
    if (!parsed.success || Object.keys(all).length > 0) return;
    onSubmit(parsed.data);
  };

  const loadHint = loadAgainstRating(numberOrNull(draft.loadA), circuit.ratingA);
  return (
    <View style={styles.form}>
      <FieldRow>
        <DateField label="Date" required {...text('date')} testID="field-trip-date" />
        <TextField label="Time" {...text('time')} placeholder="HH:MM" mono testID="field-trip-time" />
      </FieldRow>
      <TextField
        label="Load at the time (A, optional)"
        {...text('loadA')}
        keyboardType="decimal-pad"
        mono
        hint={loadHint ?? 'From a clamp meter or the building system, if anyone knows: it tells an overload from a nuisance trip.'}
        testID="field-trip-load"
      />
      <TextField
        label="What was happening"
        {...text('circumstances')}
        multiline
        placeholder="e.g. Tripped twice this morning with only the exam lights on"
        testID="field-trip-circumstances"
      />
      <FormProblems errors={errors} />
      <Button label="Record the trip" onPress={submit} testID="save-trip" />
    </View>
  );
}

const styles = StyleSheet.create({
  form: { gap: space.lg },
});
