/**
 * A deficiency's priority: a mark of four bars, as many filled as the priority is urgent (P1 all
 * four, P4 one), beside its words ("P1 now"). Shape and count, not hue, tell them apart, so the mark
 * survives colour blindness, a dim room and a black-and-white printout (the report draws the same
 * bars, server/services/pdf/report.ts). `null`: no priority (a reading that found nothing to raise).
 */
import { StyleSheet, View } from 'react-native';
import { PRIORITY_BARS, PRIORITY_LABELS, type Priority } from '@/shared/records';
import { Text } from '@/components/ui/text';
import { colours, radii, space } from '@/components/ui/theme';

const BAR_HEIGHTS = [6, 9, 12, 15] as const;

/** The four bars alone (the words sit beside it wherever it is used). */
export function PriorityMark({ priority }: { priority: Priority }) {
  const filled = PRIORITY_BARS[priority];
  return (
    <View style={styles.bars} aria-hidden testID={`priority-mark-${priority}`}>
      {BAR_HEIGHTS.map((h, i) => (
        <View key={h} style={[styles.bar, { height: h }, i < filled ? styles.barFilled : styles.barEmpty]} />
      ))}
    </View>
  );
}

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
  return (
    <View
      style={[styles.chip, priority === 1 && styles.urgent]}
      accessibilityLabel={`Priority ${PRIORITY_LABELS[priority]}`}
      testID={`priority-chip-${priority}`}
    >
      <PriorityMark priority={priority} />
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
    borderWidth: 1,
    borderColor: colours.ruleStrong,
    backgroundColor: colours.card,
    borderRadius: radii.sm,
    paddingHorizontal: space.sm,
    paddingVertical: 2,
  },
  // "now" gets a heavier edge as well as its four bars
  urgent: { borderWidth: 2, borderColor: colours.ink },
  none: { borderColor: colours.rule, backgroundColor: colours.card },
  bars: { flexDirection: 'row', alignItems: 'flex-end', gap: 2, height: 15 },
  bar: { width: 4, borderRadius: 1, borderWidth: 1, borderColor: colours.ink },
  barFilled: { backgroundColor: colours.ink },
  barEmpty: { backgroundColor: 'transparent' },
  smallText: { fontSize: 12, lineHeight: 16 },
});
