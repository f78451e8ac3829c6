import { StyleSheet, View } from 'react-native';
import { SAFETY_CAUTION } from '@/shared/calc';
import { Text } from './text';
import { colours, radii, space } from './theme';

/** The usual caution wherever the work leads to energised equipment. */
export function SafetyNote() {
  return (
    <View style={styles.box} accessibilityRole="text" accessibilityLabel={`Caution. ${SAFETY_CAUTION}`}>
      <Text variant="label" tone="warn">⚠ CAUTION</Text>
      <Text variant="small">{SAFETY_CAUTION}</Text>
    </View>
  );
}

const styles = StyleSheet.create({
  box: {
    borderLeftWidth: 4,
    borderLeftColor: colours.warn,
    backgroundColor: colours.warnSoft,
    padding: space.md,
    borderRadius: radii.sm,
    gap: space.xs,
  },
});
