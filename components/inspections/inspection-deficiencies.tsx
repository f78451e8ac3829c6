/** The deficiencies raised in one inspection, each a link to its own screen. */
import { StyleSheet, View } from 'react-native';
import { PressableCard } from '@/components/ui/card';
import type { BuildingView } from '@/hooks/building-view';
import { STATUS_LABELS, type Deficiency } from '@/shared/records';
import { dateText } from './inspection-format';
import { PriorityChip } from '@/components/deficiencies/priority-chip';
import { Text } from '@/components/ui/text';
import { MIN_TOUCH, space } from '@/components/ui/theme';

export function InspectionDeficiencies({
  deficiencies,
  view,
  onOpen,
  canRaise,
  signed,
}: {
  deficiencies: Deficiency[];
  view: BuildingView;
  onOpen: (deficiency: Deficiency) => void;
  canRaise: boolean;
  /** a signed inspection is frozen: nothing more is raised in it, so nothing to invite */
  signed: boolean;
}) {
  const sorted = [...deficiencies].sort((a, b) => a.priority - b.priority || a.id.localeCompare(b.id));
  return (
    <View style={styles.box} testID="inspection-deficiencies">
      <Text variant="label" tone="soft" heading={2} caps>
        Deficiencies raised in this inspection ({deficiencies.length})
      </Text>
      {sorted.length === 0 && (
        <Text tone="soft">
          {signed
            ? 'None raised: the inspection is signed.'
            : canRaise
            ? 'None yet. Tick a checklist item, or raise one from a reading that found a problem.'
            : 'None yet. Inspectors raise deficiencies from the readings and the checklist.'}
        </Text>
      )}
      {sorted.map((d) => {
        const tag = d.panelId ? view.panel(d.panelId)?.tag : null;
        return (
          <PressableCard
            key={d.id}
            accessibilityRole="link"
            accessibilityLabel={`${d.title}, ${STATUS_LABELS[d.status]}, priority ${d.priority}`}
            onPress={() => onOpen(d)}
            style={styles.row}
            testID="inspection-deficiency"
          >
            <PriorityChip priority={d.priority} />
            <View style={styles.text}>
              <Text variant="strong">{d.title}</Text>
              <Text variant="small" tone="soft">
                {[tag ? `panel ${tag}` : null, STATUS_LABELS[d.status], d.dueOn ? `due ${dateText(d.dueOn)}` : null]
                  .filter(Boolean)
                  .join(' · ')}
              </Text>
            </View>
            <Text tone="faint">›</Text>
          </PressableCard>
        );
      })}
    </View>
  );
}

const styles = StyleSheet.create({
  box: { gap: space.sm },
  row: {
    minHeight: MIN_TOUCH,
    flexDirection: 'row',
    alignItems: 'center',
    gap: space.sm,
    flexWrap: 'wrap',
  },
  text: { flex: 1, minWidth: 160, gap: 2 },
});
