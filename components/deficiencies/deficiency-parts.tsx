/** Small pieces the deficiency screens share: the status word, a card, a titled section. */
import { StyleSheet, View } from 'react-native';
import { PressableCard } from '@/components/ui/card';
import { STATUS_LABELS, type DeficiencyStatus } from '@/shared/records';
import { Text, type HeadingLevel } from '@/components/ui/text';
import { colours, MIN_TOUCH, radii, space } from '@/components/ui/theme';

/** A mark for each status, beside its word (never the mark alone). */
const STATUS_MARKS: Record<DeficiencyStatus, string> = {
  open: '○',
  scheduled: '◷',
  repaired: '◐',
  verified: '●',
  deferred: '‖',
};

export function StatusWord({ status }: { status: DeficiencyStatus }) {
  return (
    <View style={[styles.status, status === 'verified' && styles.statusDone]} testID={`status-${status}`}>
      <Text variant="label">
        {STATUS_MARKS[status]} {STATUS_LABELS[status]}
      </Text>
    </View>
  );
}

interface SectionProps {
  title: string;
  children: React.ReactNode;
  testID?: string;
  aside?: React.ReactNode;
  /** 2 on a screen of its own; 3 where the section sits inside a titled block (the circuit's record) */
  level?: HeadingLevel;
}

export function Section({ title, children, testID, aside, level = 2 }: SectionProps) {
  return (
    <View style={styles.section} testID={testID}>
      <View style={styles.sectionHead}>
        <Text variant="label" tone="soft" heading={level} caps>
          {title}
        </Text>
        {aside}
      </View>
      {children}
    </View>
  );
}

/** A row that opens something: at least 44 px tall, the whole row is the target. */
export function RowLink({ onPress, label, children, testID }: { onPress: () => void; label: string; children: React.ReactNode; testID?: string }) {
  return (
    <PressableCard
      accessibilityRole="link"
      // named by the words it shows (WCAG 2.5.3); what it does is the hint
      accessibilityHint={label}
      onPress={onPress}
      testID={testID}
      style={styles.rowLink}
    >
      {children}
    </PressableCard>
  );
}

const styles = StyleSheet.create({
  status: {
    alignSelf: 'flex-start',
    borderWidth: 1,
    borderColor: colours.ruleStrong,
    borderRadius: radii.sm,
    paddingHorizontal: space.sm,
    paddingVertical: 2,
    backgroundColor: colours.card,
  },
  statusDone: { backgroundColor: colours.paper },
  section: { gap: space.sm },
  sectionHead: { flexDirection: 'row', alignItems: 'center', justifyContent: 'space-between', gap: space.sm, flexWrap: 'wrap' },
  rowLink: {
    minHeight: MIN_TOUCH,
    gap: space.xs,
  },
});
