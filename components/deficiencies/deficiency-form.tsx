/**
 * Raise a deficiency by hand (source 'manual'): what is wrong, where (panel and circuit, both
 * optional), how urgent, and by when — the due date follows the priority and the organisation's
 * due days until the user sets it.
 */
import { useState } from 'react';
import { Pressable, ScrollView, StyleSheet, View } from 'react-native';
import { dueOnFor, todayISO } from '@/shared/deficiency';
import { DEFAULT_DUE_DAYS, deficiencyCreateBody, PRIORITIES, PRIORITY_LABELS, type DeficiencyCreateBody, type Priority } from '@/shared/records';
import { fieldErrors, type Circuit, type Panel } from '@/shared/schemas';
import { usePanel } from '@/hooks/use-register';
import { Button } from '@/components/ui/button';
import { breakerLabel, directoryText } from '@/components/register/circuit-format';
import { dateWords, isRealDate } from './deficiency-format';
import { DateField } from '@/components/ui/date-field';
import { ChoiceField, Field, FormProblems, TextField } from '@/components/ui/fields';
import { Text } from '@/components/ui/text';
import { useFormDraft } from '@/components/ui/use-form-draft';
import { colours, MIN_TOUCH, radii, space } from '@/components/ui/theme';

interface Draft {
  title: string;
  description: string;
  panelId: string | null;
  circuitId: string | null;
  priority: Priority | null;
  dueOn: string;
}

export interface DeficiencyFormProps {
  panels: readonly Panel[];
  initialPanelId: string | null;
  initialCircuitId: string | null;
  dueDays: Record<Priority, number> | undefined;
  onSubmit: (body: DeficiencyCreateBody) => void;
}

const PRIORITY_HINTS: Record<Priority, string> = {
  1: 'a hazard now: make safe at once',
  2: 'repair soon',
  3: 'plan the repair',
  4: 'keep an eye on it',
};

export function DeficiencyForm({ panels, initialPanelId, initialCircuitId, dueDays = DEFAULT_DUE_DAYS, onSubmit }: DeficiencyFormProps) {
  const today = todayISO();
  const { draft, set, errors, setErrors, text, field } = useFormDraft<Draft>(() => ({
    title: '',
    description: '',
    panelId: initialPanelId,
    circuitId: initialPanelId ? initialCircuitId : null,
    priority: null,
    dueOn: '',
  }));
  const [dueTouched, setDueTouched] = useState(false);

  const choosePriority = (p: Priority) => {
    set('priority')(p);
    if (!dueTouched) set('dueOn')(dueOnFor(p, today, dueDays));
  };
  const choosePanel = (id: string | null) => {
    set('panelId')(id);
    set('circuitId')(null);
  };

  const submit = () => {
    const extra: Record<string, string> = {};
    if (draft.priority === null) extra.priority = 'choose how urgent it is';
    const due = draft.dueOn.trim();
    if (!due) extra.dueOn = 'choose a due date (it follows the priority)';
    else if (!isRealDate(due)) extra.dueOn = 'a date as YYYY-MM-DD';
    else if (due < today) extra.dueOn = 'a due date from today on';
    const parsed = deficiencyCreateBody.safeParse({
      source: 'manual',
      title: draft.title,
      description: draft.description,
      panelId: draft.panelId,
      circuitId: draft.circuitId,
      priority: draft.priority ?? undefined,
      dueOn: due || undefined,
    });
    const fields = { ...(parsed.success ? {} : fieldErrors(parsed.error)), ...extra };
    setErrors(fields);
    if (!parsed.success || Object.keys(fields).length > 0) return;
    onSubmit(parsed.data);
  };

  return (
    <View style={styles.form}>
      <TextField
        label="What is wrong"
        {...text('title')}
        placeholder="e.g. Neutral bar overfilled, two neutrals under one screw"
        testID="field-title"
      />
      <TextField
        label="Description (optional)"
        {...text('description')}
        multiline
        hint="What you saw, how to find it, what the repair probably needs."
        testID="field-description"
      />
      <ChoiceField
        label="Panel (optional)"
        choices={[{ value: null as string | null, label: 'Whole building' }, ...panels.map((p) => ({ value: p.id as string | null, label: `Panel ${p.tag}` }))]}
        value={draft.panelId}
        onChange={choosePanel}
        error={errors.panelId}
      />
      {draft.panelId && (
        <CircuitPicker
          key={draft.panelId}
          panelId={draft.panelId}
          {...field('circuitId')}
        />
      )}
      <ChoiceField
        label="Priority"
        choices={PRIORITIES.map((p) => ({ value: p as Priority | null, label: PRIORITY_LABELS[p] }))}
        value={draft.priority}
        onChange={(p) => p !== null && choosePriority(p)}
        error={errors.priority}
        hint={draft.priority ? `${PRIORITY_LABELS[draft.priority]}: ${PRIORITY_HINTS[draft.priority]}; ${dueDays[draft.priority]} days by your organisation's settings.` : 'P1 now · P2 soon · P3 planned · P4 watch'}
      />
      <DateField
        label="Due by"
        value={draft.dueOn}
        onChangeText={(t) => {
          setDueTouched(true);
          set('dueOn')(t);
        }}
        error={errors.dueOn}
        hint={
          draft.dueOn && isRealDate(draft.dueOn)
            ? `${dateWords(draft.dueOn)}${dueTouched ? ' (set by you)' : ' (from the priority)'}`
            : 'Follows the priority; choose a date to set your own.'
        }
        testID="field-due"
      />
      <FormProblems errors={errors} />
      <Button label="Raise the deficiency" onPress={submit} testID="save-deficiency" />
    </View>
  );
}

/** The circuit of the chosen panel: the choice shows; the full list opens on a tap. */
function CircuitPicker({
  panelId,
  value,
  onChange,
  error,
}: {
  panelId: string;
  value: string | null;
  onChange: (id: string | null) => void;
  error?: string;
}) {
  const [open, setOpen] = useState(false);
  const circuits: readonly Circuit[] = usePanel(panelId).data?.circuits ?? [];
  const selected = circuits.find((c) => c.id === value);
  const label = selected ? `${selected.position} · ${directoryText(selected)}` : 'The panel as a whole';
  return (
    <Field label="Circuit (optional)" error={error}>
      <Pressable
        accessibilityRole="button"
        accessibilityLabel={`Circuit: ${label}. ${open ? 'Close the list' : 'Choose a circuit'}`}
        onPress={() => setOpen((o) => !o)}
        style={[styles.pickerButton, !!error && styles.pickerError]}
        testID="circuit-picker"
      >
        <Text style={styles.pickerText}>{label}</Text>
        <Text tone="copper" variant="strong">{open ? 'Close ▲' : 'Choose ▼'}</Text>
      </Pressable>
      {open && (
        <ScrollView style={styles.list} nestedScrollEnabled>
          <PickRow label="The panel as a whole" selected={value === null} onPress={() => { onChange(null); setOpen(false); }} testID="circuit-option-none" />
          {circuits.map((c) => (
            <PickRow
              key={c.id}
              label={`${c.position} · ${directoryText(c)}`}
              detail={breakerLabel(c)}
              selected={c.id === value}
              onPress={() => {
                onChange(c.id);
                setOpen(false);
              }}
              testID={`circuit-option-${c.position}`}
            />
          ))}
        </ScrollView>
      )}
    </Field>
  );
}

function PickRow({ label, detail, selected, onPress, testID }: { label: string; detail?: string; selected: boolean; onPress: () => void; testID: string }) {
  return (
    <Pressable accessibilityRole="radio" aria-checked={selected} accessibilityLabel={label} onPress={onPress} style={[styles.pickRow, selected && styles.pickRowSelected]} testID={testID}>
      <Text style={styles.pickerText} tone={selected ? 'paper' : 'ink'}>
        {selected ? '● ' : ''}
        {label}
      </Text>
      {detail ? <Text variant="reading" tone={selected ? 'paper' : 'soft'}>{detail}</Text> : null}
    </Pressable>
  );
}

const styles = StyleSheet.create({
  form: { gap: space.lg },
  pickerButton: {
    minHeight: MIN_TOUCH,
    borderWidth: 1,
    borderColor: colours.ruleStrong,
    borderRadius: radii.md,
    backgroundColor: colours.card,
    paddingHorizontal: space.md,
    flexDirection: 'row',
    alignItems: 'center',
    gap: space.sm,
  },
  pickerError: { borderColor: colours.danger, borderWidth: 2 },
  pickerText: { flex: 1 },
  list: { maxHeight: 320, borderWidth: 1, borderColor: colours.rule, borderRadius: radii.md, backgroundColor: colours.card },
  pickRow: {
    minHeight: MIN_TOUCH,
    paddingHorizontal: space.md,
    paddingVertical: space.sm,
    flexDirection: 'row',
    alignItems: 'center',
    gap: space.sm,
    borderBottomWidth: StyleSheet.hairlineWidth,
    borderBottomColor: colours.rule,
  },
  pickRowSelected: { backgroundColor: colours.ink },
});
