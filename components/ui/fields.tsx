import { Children, isValidElement } from 'react';
import { Pressable, StyleSheet, TextInput, View, type TextInputProps } from 'react-native';
import { Text } from './text';
import { colours, fonts, MIN_TOUCH, radii, space } from './theme';

/**
 * One field of a form: its label, the control, then the ✕ error (read out as an alert) or a hint.
 * TextField and ChoiceField are built on it; a form's own control (a picker, a checklist) sits in
 * it so every field reads the same.
 */
export function Field({
  label,
  error,
  hint,
  required,
  children,
}: {
  label: string;
  error?: string;
  hint?: string;
  /** said in the label before anything is sent, in words (not a colour or a lone asterisk) */
  required?: boolean;
  children: React.ReactNode;
}) {
  return (
    <View style={styles.field}>
      <Text variant="label" tone="soft">
        {fieldLabel(label, required)}
      </Text>
      {children}
      {error ? (
        <Text variant="small" tone="danger" accessibilityRole="alert">
          ✕ {error}
        </Text>
      ) : hint ? (
        <Text variant="small" tone="faint">{hint}</Text>
      ) : null}
    </View>
  );
}

/** "Look at it again on (required)" */
export const fieldLabel = (label: string, required?: boolean) => (required ? `${label} (required)` : label);

/**
 * Fields side by side, sharing the width (two short numbers on one line of a phone). `wrap`: the
 * cells keep a readable width and go under each other on a narrow screen; `alignEnd`: fields whose
 * labels differ in height line up on their boxes.
 */
export function FieldRow({ children, wrap, alignEnd }: { children: React.ReactNode; wrap?: boolean; alignEnd?: boolean }) {
  return (
    <View style={[styles.fieldRow, wrap && styles.fieldRowWrap, alignEnd && styles.fieldRowEnd]}>
      {Children.toArray(children).map((child, i) => (
        // toArray's keys follow the place in the source, so a field that appears before another
        // (a conditional one) does not remount it
        <View key={isValidElement(child) && child.key !== null ? child.key : i} style={[styles.fieldCell, wrap && styles.fieldCellWrap]}>
          {child}
        </View>
      ))}
    </View>
  );
}

/** Under a form whose check failed: the ✕ marks are above, this says to look for them. */
export function FormProblems({ errors }: { errors: Record<string, string> }) {
  if (Object.keys(errors).length === 0) return null;
  return (
    <Text tone="danger" accessibilityRole="alert">
      Some fields need attention (marked ✕ above).
    </Text>
  );
}

export interface TextFieldProps extends Omit<TextInputProps, 'style'> {
  label: string;
  error?: string;
  hint?: string;
  mono?: boolean;
  required?: boolean;
}

export function TextField({ label, error, hint, mono, multiline, required, ...input }: TextFieldProps) {
  return (
    <Field label={label} error={error} hint={hint} required={required}>
      <TextInput
        accessibilityLabel={label}
        aria-invalid={!!error}
        aria-required={required}
        placeholderTextColor={colours.inkFaint}
        multiline={multiline}
        style={[styles.input, mono && styles.mono, multiline && styles.multiline, !!error && styles.inputError]}
        {...input}
      />
    </Field>
  );
}

export interface Choice<T> {
  value: T;
  label: string;
}

/** A row of large chips: faster than a dropdown with a gloved thumb. */
export function ChoiceField<T extends string | number | boolean | null>({
  label,
  choices,
  value,
  onChange,
  error,
  hint,
  disabled,
}: {
  label: string;
  choices: readonly Choice<T>[];
  value: T;
  onChange: (value: T) => void;
  error?: string;
  hint?: string;
  disabled?: boolean;
}) {
  return (
    <Field label={label} error={error} hint={hint}>
      <View style={chipStyles.chips} accessibilityRole="radiogroup" accessibilityLabel={label}>
        {choices.map((choice) => {
          const selected = choice.value === value;
          return (
            <Pressable
              key={String(choice.value)}
              accessibilityRole="radio"
              accessibilityState={{ checked: selected, disabled }}
              // React Native Web reads aria-* (not accessibilityState): a screen reader hears "checked"
              aria-checked={selected}
              aria-disabled={disabled}
              accessibilityLabel={`${label}: ${choice.label}`}
              disabled={disabled}
              onPress={() => onChange(choice.value)}
              style={[chipStyles.chip, selected && chipStyles.chipSelected]}
            >
              <Text variant="strong" tone={selected ? 'paper' : 'ink'}>
                {selected ? '● ' : ''}
                {choice.label}
              </Text>
            </Pressable>
          );
        })}
      </View>
    </Field>
  );
}

export function ToggleField({ label, value, onChange, hint }: { label: string; value: boolean; onChange: (v: boolean) => void; hint?: string }) {
  return (
    <ChoiceField
      label={label}
      hint={hint}
      value={value}
      onChange={onChange}
      choices={[
        { value: false, label: 'No' },
        { value: true, label: 'Yes' },
      ]}
    />
  );
}

/** A read-only label/value pair for people who may look but not edit. */
export function ReadOnlyField({ label, value }: { label: string; value: string }) {
  return (
    <View style={styles.readOnly}>
      <Text variant="label" tone="soft" style={styles.readOnlyLabel}>{label}</Text>
      <Text style={styles.readOnlyValue}>{value || '—'}</Text>
    </View>
  );
}

/** The chip look of ChoiceField, for pickers that need their own behaviour (several at once). */
export const chipStyles = StyleSheet.create({
  chips: { flexDirection: 'row', flexWrap: 'wrap', gap: space.sm },
  chip: {
    minHeight: MIN_TOUCH,
    minWidth: MIN_TOUCH,
    paddingHorizontal: space.md,
    borderRadius: radii.md,
    borderWidth: 1,
    borderColor: colours.ruleStrong,
    backgroundColor: colours.card,
    alignItems: 'center',
    justifyContent: 'center',
  },
  chipSelected: { backgroundColor: colours.ink, borderColor: colours.ink },
});

const styles = StyleSheet.create({
  field: { gap: space.xs },
  fieldRow: { flexDirection: 'row', gap: space.md },
  fieldRowWrap: { flexWrap: 'wrap' },
  fieldRowEnd: { alignItems: 'flex-end' },
  fieldCell: { flex: 1 },
  fieldCellWrap: { minWidth: 140 },
  input: {
    minHeight: MIN_TOUCH,
    borderWidth: 1,
    borderColor: colours.ruleStrong,
    borderRadius: radii.md,
    backgroundColor: colours.card,
    paddingHorizontal: space.md,
    fontFamily: fonts.text,
    fontSize: 17,
    color: colours.ink,
  },
  mono: { fontFamily: fonts.mono },
  multiline: { minHeight: 88, paddingTop: space.sm, textAlignVertical: 'top' },
  inputError: { borderColor: colours.danger, borderWidth: 2 },
  readOnly: {
    flexDirection: 'row',
    gap: space.md,
    paddingVertical: space.sm,
    borderBottomWidth: StyleSheet.hairlineWidth,
    borderBottomColor: colours.rule,
  },
  readOnlyLabel: { width: 150 },
  readOnlyValue: { flex: 1 },
});
