/**
 * A deficiency's priority as a chip: always the word ("P1 now") with the priority's colour as a
 * mark and an edge — never the colour alone (DESIGN.md §6). `null`: no priority (e.g. a reading
 * that found nothing to raise).
 */
import { StyleSheet, View } from 'react-native';
import { PRIORITY_LABELS, type Priority } from '@/shared/records';
import { Text } from '@/components/ui/text';
import { colours, radii, space } from '@/components/ui/theme';

export const PRIORITY_COLOURS: Record<Priority, string> = {
  1: colours.p1,
  2: colours.p2,
  3: colours.p3,
  4: colours.p4,
};

/** Light tints of the priority colours, for the chip's ground (text stays ink for contrast). */
const PRIORITY_TINTS: Record<Priority, string> = {
  1: colours.p1Soft,
  2: colours.p2Soft,
  3: colours.p3Soft,
  4: colours.p4Soft,
};

export function PriorityChip({ priority, size = 'normal' }: { priority: Priority | null; size?: 'normal' | 'small' }) {
  if (priority === null) {
    return (
      <View style={[styles.chip, styles.none]} accessibilityLabel="No priority" testID="priority-chip-none">
        <Text variant={size === 'small' ? 'small' : 'label'} tone="soft">
          No priority
        </Text>
      </View>
    );
  }
  const colour = PRIORITY_COLOURS[priority];
  return (
    <View
      style={[styles.chip, { borderColor: colour, backgroundColor: PRIORITY_TINTS[priority] }]}
      accessibilityLabel={`Priority ${PRIORITY_LABELS[priority]}`}
      testID={`priority-chip-${priority}`}
    >
      <View style={[styles.mark, { backgroundColor: colour }]} />
      <Text variant="label" style={size === 'small' ? styles.smallText : undefined}>
        {PRIORITY_LABELS[priority]}
      </Text>
    </View>
  );
}

const styles = StyleSheet.create({
  chip: {
    flexDirection: 'row',
    alignItems: 'center',
    alignSelf: 'flex-start',
    gap: space.xs + 2,
    borderWidth: 1.5,
    borderRadius: radii.sm,
    paddingHorizontal: space.sm,
    paddingVertical: 2,
  },
  none: { borderColor: colours.rule, backgroundColor: colours.card },
  mark: { width: 8, height: 8, borderRadius: 4 },
  smallText: { fontSize: 12, lineHeight: 16 },
});
