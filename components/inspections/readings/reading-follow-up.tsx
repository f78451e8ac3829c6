/**
 * After a reading is saved: raise a deficiency from what it found (inspectors and admins, one tap,
 * prefilled), or follow the link to the one already raised; and the reading's photos.
 */
import { StyleSheet, View } from 'react-native';
import { PressableCard } from '@/components/ui/card';
import type { AssessedReading } from '@/hooks/use-records';
import type { Deficiency, Reading } from '@/shared/records';
import { Button } from '@/components/ui/button';
import { PriorityChip } from '@/components/deficiencies/priority-chip';
import { ReadingPhotos } from './reading-photos';
import { Text } from '@/components/ui/text';
import { colours, MIN_TOUCH, radii, space } from '@/components/ui/theme';

export function ReadingFollowUp({
  kind,
  saved,
  dirty,
  deficiency,
  canRaise,
  canAddPhotos,
  buildingId,
  onRaise,
  onOpenDeficiency,
}: {
  kind: Reading['kind'];
  /** the reading as the device holds it (null until the first save) */
  saved: AssessedReading | null;
  /** the form has changes not saved yet */
  dirty: boolean;
  /** the deficiency already raised from this reading */
  deficiency: Deficiency | null;
  canRaise: boolean;
  canAddPhotos: boolean;
  buildingId: string;
  onRaise: () => void;
  onOpenDeficiency: (deficiency: Deficiency) => void;
}) {
  if (!saved) {
    const then = [
      canRaise ? 'raise a deficiency from it if it found a problem' : null,
      kind === 'thermal' && canAddPhotos ? 'add its thermal and visible images' : null,
    ].filter(Boolean);
    if (then.length === 0) return null;
    return (
      <Text variant="small" tone="faint">
        After the first save you can {then.join(' and ')} here.
      </Text>
    );
  }
  const { reading, assessment } = saved;
  const priority = assessment.priority;
  return (
    <View style={styles.box}>
      {deficiency ? (
        <PressableCard
          accessibilityRole="link"
          accessibilityLabel={`Deficiency raised: ${deficiency.title}. Open it`}
          onPress={() => onOpenDeficiency(deficiency)}
          style={styles.link}
          testID="raised-deficiency"
        >
          <PriorityChip priority={deficiency.priority} />
          <View style={styles.linkText}>
            <Text variant="small" tone="soft">Deficiency raised</Text>
            <Text variant="strong">{deficiency.title}</Text>
          </View>
          <Text tone="faint">›</Text>
        </PressableCard>
      ) : priority !== null && canRaise ? (
        <View style={styles.raise}>
          <Text variant="small">
            This reading is {priority === 1 ? 'a P1: repair now' : `a P${priority}`}. Raise it as a deficiency, prefilled from the reading.
          </Text>
          <Button label="Raise deficiency" onPress={onRaise} disabled={dirty} testID="raise-reading-deficiency" />
          {dirty && <Text variant="small" tone="faint">Save the changes first, so the deficiency says what the reading says.</Text>}
        </View>
      ) : priority !== null ? (
        <Text variant="small" tone="soft">An inspector raises the deficiency from this reading.</Text>
      ) : null}
      {reading.kind === 'thermal' && <ReadingPhotos buildingId={buildingId} readingId={reading.id} canAdd={canAddPhotos} />}
    </View>
  );
}

const styles = StyleSheet.create({
  box: { gap: space.lg },
  raise: {
    gap: space.sm,
    padding: space.md,
    borderRadius: radii.md,
    borderWidth: 1,
    borderColor: colours.copper,
    backgroundColor: colours.copperSoft,
  },
  link: {
    minHeight: MIN_TOUCH,
    flexDirection: 'row',
    alignItems: 'center',
    gap: space.sm,
  },
  linkText: { flex: 1 },
});
