/** A building's inspections, newest first: kind, date, the panels covered, signed or not. */
import { StyleSheet, View } from 'react-native';
import { PressableCard } from '@/components/ui/card';
import { INSPECTION_KIND_LABELS, type Inspection } from '@/shared/records';
import type { Panel } from '@/shared/schemas';
import { dateText } from './inspection-format';
import { Text } from '@/components/ui/text';
import { colours, MIN_TOUCH, radii, space } from '@/components/ui/theme';

export function InspectionList({
  inspections,
  panels,
  onOpen,
}: {
  inspections: Inspection[];
  panels: Panel[];
  onOpen: (inspection: Inspection) => void;
}) {
  const tagOf = new Map(panels.map((p) => [p.id, p.tag]));
  return (
    <View style={styles.list} testID="inspection-list">
      {inspections.map((inspection) => {
        const tags = inspection.panelIds.map((id) => tagOf.get(id) ?? '?');
        const signed = !!inspection.signedAt;
        const kind = INSPECTION_KIND_LABELS[inspection.kind];
        return (
          <PressableCard
            key={inspection.id}
            accessibilityRole="button"
            accessibilityLabel={`${kind}, ${dateText(inspection.performedOn)}, panels ${tags.join(', ')}, ${signed ? 'signed' : 'not signed'}`}
            onPress={() => onOpen(inspection)}
            style={styles.row}
            testID="inspection-row"
          >
            <View style={styles.text}>
              <Text variant="strong">{kind}</Text>
              <Text variant="small" tone="soft">
                <Text variant="reading">{inspection.performedOn}</Text>
                {'  ·  '}
                {tags.length === 1 ? 'panel ' : 'panels '}
                <Text variant="readingBold">{tags.join(' ')}</Text>
              </Text>
            </View>
            <View style={[styles.badge, signed ? styles.signed : styles.open]}>
              <Text variant="label" tone={signed ? 'paper' : 'ink'}>{signed ? '✓ Signed' : '✎ Open'}</Text>
            </View>
            <Text tone="faint">›</Text>
          </PressableCard>
        );
      })}
    </View>
  );
}

const styles = StyleSheet.create({
  list: { gap: space.sm },
  row: {
    minHeight: MIN_TOUCH + 12,
    flexDirection: 'row',
    alignItems: 'center',
    gap: space.md,
  },
  text: { flex: 1, gap: 2 },
  badge: { borderRadius: radii.sm, paddingHorizontal: space.sm, paddingVertical: 2, borderWidth: 1 },
  signed: { backgroundColor: colours.ink, borderColor: colours.ink },
  open: { backgroundColor: colours.copperSoft, borderColor: colours.copper },
});
