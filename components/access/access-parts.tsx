/** Small pieces shared by the users-and-access screens. */
import { Pressable, StyleSheet, View } from 'react-native';
import { Card, type CardProps } from '@/components/ui/card';
import { Text } from '@/components/ui/text';
import { colours, MIN_TOUCH, radii, space } from '@/components/ui/theme';

/** Buildings as large check chips: a ✓ and the word "granted" carry the state, not the colour. */
export function BuildingChecklist({
  buildings,
  granted,
  onToggle,
  disabled,
  testIDPrefix,
}: {
  buildings: { id: string; name: string }[];
  granted: ReadonlySet<string>;
  onToggle: (buildingId: string, grant: boolean) => void;
  disabled?: boolean;
  testIDPrefix: string;
}) {
  return (
    <View style={styles.list}>
      {buildings.map((b) => {
        const on = granted.has(b.id);
        return (
          <Pressable
            key={b.id}
            accessibilityRole="checkbox"
            accessibilityState={{ checked: on, disabled }}
            aria-checked={on}
            accessibilityLabel={`${b.name}: ${on ? 'granted' : 'not granted'}`}
            disabled={disabled}
            onPress={() => onToggle(b.id, !on)}
            style={[styles.chip, on && styles.chipOn, disabled && styles.disabled]}
            testID={`${testIDPrefix}-${b.id}`}
          >
            <Text variant="strong" tone={on ? 'paper' : 'ink'}>{on ? '✓ ' : '○ '}{b.name}</Text>
            <Text variant="small" tone={on ? 'paper' : 'soft'}>{on ? 'granted' : 'not granted'}</Text>
          </Pressable>
        );
      })}
    </View>
  );
}

export function Notice({ text, tone = 'ok', testID }: { text: string; tone?: 'ok' | 'danger'; testID?: string }) {
  return (
    <View style={[styles.notice, tone === 'danger' && styles.noticeDanger]} accessibilityRole="alert" testID={testID}>
      <Text tone={tone === 'danger' ? 'danger' : 'ink'}>{text}</Text>
    </View>
  );
}

/** The card every access screen sits in: a little more air between its parts than most. */
export function AccessCard({ style, ...rest }: CardProps) {
  return <Card style={[styles.accessCard, style]} {...rest} />;
}

const styles = StyleSheet.create({
  accessCard: { gap: space.md },
  list: { flexDirection: 'row', flexWrap: 'wrap', gap: space.sm },
  chip: {
    minHeight: MIN_TOUCH,
    paddingHorizontal: space.md,
    paddingVertical: space.xs,
    borderRadius: radii.md,
    borderWidth: 1,
    borderColor: colours.ruleStrong,
    backgroundColor: colours.card,
    justifyContent: 'center',
  },
  chipOn: { backgroundColor: colours.ink, borderColor: colours.ink },
  disabled: { opacity: 0.5 },
  notice: { padding: space.md, borderRadius: radii.md, backgroundColor: colours.copperSoft },
  noticeDanger: { backgroundColor: colours.dangerSoft },
});
