/**
 * Conductor size on a phone app: a stepper through the standard sizes (smaller ◂ size ▸ larger),
 * one control instead of a wall of chips. The web build uses the browser's select
 * (conductor-size-picker.web.tsx).
 */
import { StyleSheet, View } from 'react-native';
import { CONDUCTOR_SIZES, conductorSizeLabel, type ConductorSize } from '@/shared/domain';
import { Button } from '@/components/ui/button';
import { Field } from '@/components/ui/fields';
import { Text } from '@/components/ui/text';
import { space } from '@/components/ui/theme';

export interface ConductorSizePickerProps {
  value: ConductorSize | null;
  onChange: (value: ConductorSize | null) => void;
  error?: string;
  hint?: string;
  /** the field's label, "Conductor size" unless a form says more (optional, what it checks) */
  label?: string;
}

export function ConductorSizePicker({ value, onChange, error, hint, label = 'Conductor size' }: ConductorSizePickerProps) {
  // index -1 is "not recorded", one step below the smallest size
  const at = value === null ? -1 : CONDUCTOR_SIZES.indexOf(value);
  const step = (by: number) => {
    const next = Math.min(CONDUCTOR_SIZES.length - 1, Math.max(-1, at + by));
    onChange(next < 0 ? null : CONDUCTOR_SIZES[next]);
  };
  const words = value === null ? 'Not recorded' : conductorSizeLabel(value);
  return (
    <Field label={label} error={error} hint={hint}>
      <View
        style={styles.row}
        accessibilityRole="adjustable"
        accessibilityLabel={label}
        accessibilityValue={{ text: words }}
        accessibilityActions={[{ name: 'increment' }, { name: 'decrement' }]}
        onAccessibilityAction={(e) => step(e.nativeEvent.actionName === 'increment' ? 1 : -1)}
        testID="field-conductor-size"
      >
        <Button label="Smaller" tone="secondary" onPress={() => step(-1)} disabled={at < 0} />
        <Text variant="readingBold" style={styles.value}>
          {words}
        </Text>
        <Button label="Larger" tone="secondary" onPress={() => step(1)} disabled={at >= CONDUCTOR_SIZES.length - 1} />
      </View>
    </Field>
  );
}

const styles = StyleSheet.create({
  row: { flexDirection: 'row', alignItems: 'center', gap: space.sm },
  value: { minWidth: 110, textAlign: 'center' },
});
