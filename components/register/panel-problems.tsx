import { Pressable, StyleSheet, View } from 'react-native';
import type { CircuitWarning } from '@/shared/calc';
import type { Circuit } from '@/shared/schemas';
import { directoryText } from './circuit-format';
import { Text } from '@/components/ui/text';
import { colours, MIN_TOUCH, radii, space } from '@/components/ui/theme';

export interface CircuitProblems {
  circuit: Circuit;
  warnings: CircuitWarning[];
}

/** "3 warnings": every circuit with something to check, each a link to its circuit. */
export function PanelProblems({ problems, onOpen }: { problems: CircuitProblems[]; onOpen: (c: Circuit) => void }) {
  const count = problems.reduce((n, p) => n + p.warnings.length, 0);
  if (count === 0) {
    return (
      <View style={[styles.box, styles.clear]} testID="panel-problems">
        <Text variant="small">✓ No warnings on the recorded circuits.</Text>
      </View>
    );
  }
  return (
    <View style={styles.box} testID="panel-problems" accessibilityRole="summary">
      <Text variant="strong" tone="warn" heading={2}>⚠ {count} warning{count === 1 ? '' : 's'}</Text>
      {problems.map(({ circuit, warnings }) => (
        <Pressable
          key={circuit.id}
          accessibilityRole="link"
          // named by what it shows: the words heard are the words seen (WCAG 2.5.3)
          onPress={() => onOpen(circuit)}
          style={({ pressed }) => [styles.item, pressed && styles.pressed]}
        >
          <Text variant="readingBold" style={styles.position}>{circuit.position}</Text>
          <View style={styles.text}>
            <Text variant="strong" numberOfLines={1}>{directoryText(circuit)}</Text>
            {warnings.map((w) => (
              <Text key={w.code} variant="small">• {w.message}</Text>
            ))}
          </View>
          <Text tone="faint" aria-hidden>›</Text>
        </Pressable>
      ))}
    </View>
  );
}

const styles = StyleSheet.create({
  box: {
    gap: space.sm,
    padding: space.md,
    borderRadius: radii.md,
    borderWidth: 1,
    borderColor: colours.warn,
    backgroundColor: colours.warnSoft,
  },
  clear: { borderColor: colours.rule, backgroundColor: colours.card },
  item: { minHeight: MIN_TOUCH, flexDirection: 'row', alignItems: 'center', gap: space.sm, paddingVertical: space.xs },
  pressed: { opacity: 0.7 },
  position: { width: 28, textAlign: 'right' },
  text: { flex: 1, gap: 1 },
});
