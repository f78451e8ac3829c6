/**
 * Pick the circuit a reading is on: the choice as one large button, opening the panel's circuits
 * ("13 · Corridor lights east") with a filter — a 42-space panel does not fit a row of chips.
 */
import { useState } from 'react';
import { Pressable, ScrollView, StyleSheet, TextInput, View } from 'react-native';
import type { Circuit } from '@/shared/schemas';
import { circuitName } from '@/components/inspections/inspection-format';
import { Field } from '@/components/ui/fields';
import { Text } from '@/components/ui/text';
import { colours, fonts, MIN_TOUCH, radii, space } from '@/components/ui/theme';

export function ReadingCircuitPicker({
  label,
  circuits,
  value,
  onChange,
  noneLabel,
  error,
  hint,
  detail,
  testID,
}: {
  label: string;
  circuits: Circuit[];
  value: string | null;
  onChange: (circuitId: string | null) => void;
  /** the choice for "no circuit" (absent: a circuit is required) */
  noneLabel?: string;
  error?: string;
  hint?: string;
  /** extra words for a circuit in the list, e.g. its rating */
  detail?: (circuit: Circuit) => string | null;
  testID?: string;
}) {
  const [open, setOpen] = useState(false);
  const [filter, setFilter] = useState('');
  const chosen = circuits.find((c) => c.id === value) ?? null;
  const words = filter.trim().toLowerCase();
  const shown = words
    ? circuits.filter((c) => String(c.position) === words || circuitName(c).toLowerCase().includes(words))
    : circuits;
  const choose = (id: string | null) => {
    onChange(id);
    setOpen(false);
    setFilter('');
  };
  const current = chosen ? circuitName(chosen) : (noneLabel ?? 'Choose a circuit');
  return (
    <Field label={label} error={error} hint={hint}>
      <Pressable
        accessibilityRole="button"
        accessibilityLabel={`${label}: ${current}. ${open ? 'Close the list' : 'Change'}`}
        aria-expanded={open}
        onPress={() => setOpen(!open)}
        style={[styles.current, !!error && styles.currentError]}
        testID={testID}
      >
        <Text variant={chosen ? 'readingBold' : 'body'} tone={chosen || noneLabel ? 'ink' : 'faint'} style={styles.currentText}>
          {current}
        </Text>
        {chosen && detail?.(chosen) ? <Text variant="small" tone="soft">{detail(chosen)}</Text> : null}
        <Text tone="faint">{open ? '▴' : '▾'}</Text>
      </Pressable>
      {open && (
        <View style={styles.list}>
          <TextInput
            value={filter}
            onChangeText={setFilter}
            placeholder="Filter: position or words"
            placeholderTextColor={colours.inkFaint}
            accessibilityLabel="Filter circuits"
            style={styles.filter}
            autoFocus
            testID={testID ? `${testID}-filter` : undefined}
          />
          <ScrollView style={styles.scroll} nestedScrollEnabled keyboardShouldPersistTaps="handled">
            {noneLabel && (
              <Option label={noneLabel} selected={value === null} onPress={() => choose(null)} testID={testID ? `${testID}-none` : undefined} />
            )}
            {shown.map((c) => (
              <Option
                key={c.id}
                label={circuitName(c)}
                mono
                extra={detail?.(c) ?? null}
                selected={c.id === value}
                onPress={() => choose(c.id)}
                testID={testID ? `${testID}-${c.position}` : undefined}
              />
            ))}
            {shown.length === 0 && <Text tone="soft" style={styles.empty}>No circuit matches “{filter}”.</Text>}
          </ScrollView>
        </View>
      )}
    </Field>
  );
}

function Option({
  label,
  extra,
  selected,
  mono,
  onPress,
  testID,
}: {
  label: string;
  extra?: string | null;
  selected: boolean;
  mono?: boolean;
  onPress: () => void;
  testID?: string;
}) {
  return (
    <Pressable
      accessibilityRole="radio"
      aria-checked={selected}
      accessibilityLabel={label}
      onPress={onPress}
      style={({ pressed }) => [styles.option, selected && styles.optionSelected, pressed && styles.pressed]}
      testID={testID}
    >
      <Text variant={mono ? 'reading' : 'body'} tone={selected ? 'paper' : 'ink'} style={styles.optionText}>
        {selected ? '● ' : ''}
        {label}
      </Text>
      {extra ? <Text variant="small" tone={selected ? 'paper' : 'soft'}>{extra}</Text> : null}
    </Pressable>
  );
}

const styles = StyleSheet.create({
  current: {
    minHeight: MIN_TOUCH,
    flexDirection: 'row',
    alignItems: 'center',
    gap: space.sm,
    borderWidth: 1,
    borderColor: colours.ruleStrong,
    borderRadius: radii.md,
    backgroundColor: colours.card,
    paddingHorizontal: space.md,
  },
  currentError: { borderColor: colours.danger, borderWidth: 2 },
  currentText: { flex: 1 },
  list: { borderWidth: 1, borderColor: colours.ruleStrong, borderRadius: radii.md, backgroundColor: colours.card, overflow: 'hidden' },
  filter: {
    minHeight: MIN_TOUCH,
    paddingHorizontal: space.md,
    borderBottomWidth: 1,
    borderBottomColor: colours.rule,
    fontFamily: fonts.text,
    fontSize: 16,
    color: colours.ink,
  },
  scroll: { maxHeight: 320 },
  option: {
    minHeight: MIN_TOUCH,
    flexDirection: 'row',
    alignItems: 'center',
    gap: space.sm,
    paddingHorizontal: space.md,
    borderBottomWidth: StyleSheet.hairlineWidth,
    borderBottomColor: colours.rule,
  },
  optionSelected: { backgroundColor: colours.ink },
  optionText: { flex: 1 },
  pressed: { opacity: 0.7 },
  empty: { padding: space.md },
});
