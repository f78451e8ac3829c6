/**
 * The visual checklist of one panel: each ticked item is a visual reading (and, for inspectors
 * and admins, the deficiency it raised). Read-only once the inspection is signed.
 */
import { useState } from 'react';
import { StyleSheet, View } from 'react-native';
import { Card, PressableCard } from '@/components/ui/card';
import { PRIORITY_LABELS, VISUAL_CHECKS, VISUAL_CHECK_KEYS, type Reading, type VisualCheck } from '@/shared/records';
import { Button } from '@/components/ui/button';
import { PriorityMark } from '@/components/deficiencies/priority-chip';
import { Text } from '@/components/ui/text';
import { colours, MIN_TOUCH, space } from '@/components/ui/theme';

export function InspectionChecklist({
  panelTag,
  visualReadings,
  raisedFor,
  editable,
  raises,
  onTick,
  onUntick,
  startOpen,
}: {
  panelTag: string;
  /** the visual readings of this panel in this inspection */
  visualReadings: Reading[];
  /** reading id → a deficiency was raised from it */
  raisedFor: ReadonlySet<string>;
  editable: boolean;
  /** ticking raises a deficiency too (inspector, admin) */
  raises: boolean;
  onTick: (check: VisualCheck) => void;
  onUntick: (reading: Reading) => void;
  /** show every item at first (a visual inspection); else only what is ticked, one tap from the rest */
  startOpen: boolean;
}) {
  const [open, setOpen] = useState(startOpen);
  const byCheck = new Map(visualReadings.filter((r) => r.check).map((r) => [r.check as VisualCheck, r]));
  const showAll = editable && open;
  const keys = showAll ? VISUAL_CHECK_KEYS : VISUAL_CHECK_KEYS.filter((k) => byCheck.has(k));
  return (
    <View style={styles.box} testID={`checklist-${panelTag}`}>
      <Text variant="label" tone="soft" heading={2} caps>
        Visual checklist · {panelTag}
      </Text>
      {showAll && (
        <Text variant="small" tone="faint">
          {raises
            ? 'Tick what you find: each tick records it and raises a deficiency at the priority shown.'
            : 'Tick what you find: each tick records it; an inspector raises the deficiency from it.'}
        </Text>
      )}
      {keys.length === 0 && <Text tone="soft">Nothing ticked{editable ? ' yet' : ''}.</Text>}
      {keys.map((check) => {
        const reading = byCheck.get(check);
        const ticked = !!reading;
        const { label, priority } = VISUAL_CHECKS[check];
        const content = (
          <>
            <Text variant="heading" style={styles.tickMark} accessibilityElementsHidden>
              {ticked ? '☑' : '☐'}
            </Text>
            <View style={styles.text}>
              <Text variant={ticked ? 'strong' : 'body'}>{label}</Text>
              <View style={styles.meta}>
                <PriorityMark priority={priority} />
                <Text variant="small" tone="soft">
                  {PRIORITY_LABELS[priority]}
                  {ticked && reading && raisedFor.has(reading.id) ? ' · deficiency raised' : ''}
                </Text>
              </View>
            </View>
          </>
        );
        if (!editable) {
          return (
            <Card size="compact" key={check} style={styles.item} testID={`check-${check}`}>
              {content}
            </Card>
          );
        }
        return (
          <PressableCard
            size="compact"
            key={check}
            accessibilityRole="checkbox"
            aria-checked={ticked}
            accessibilityLabel={`${label} (${PRIORITY_LABELS[priority]})`}
            onPress={() => (reading ? onUntick(reading) : onTick(check))}
            style={[styles.item, ticked && styles.itemTicked]}
            testID={`check-${check}`}
          >
            {content}
          </PressableCard>
        );
      })}
      {editable && (
        <Button
          label={open ? 'Show only the ticked items' : `Open the checklist (${VISUAL_CHECK_KEYS.length} items)`}
          tone={open ? 'quiet' : 'secondary'}
          onPress={() => setOpen(!open)}
          testID={`checklist-toggle-${panelTag}`}
        />
      )}
    </View>
  );
}

const styles = StyleSheet.create({
  box: { gap: space.sm },
  tickMark: { width: 28, textAlign: 'center' },
  item: {
    minHeight: MIN_TOUCH,
    flexDirection: 'row',
    alignItems: 'center',
    gap: space.sm,
    paddingVertical: space.xs,
    paddingHorizontal: space.sm,
  },
  itemTicked: { borderColor: colours.copper, backgroundColor: colours.copperSoft },
  text: { flex: 1, gap: 2 },
  meta: { flexDirection: 'row', alignItems: 'center', gap: space.xs },
});
