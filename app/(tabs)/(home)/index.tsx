import { useRouter } from 'expo-router';
import { Pressable, StyleSheet, View } from 'react-native';
import { Screen } from '@/components/ui/screen';
import { EmptyState, ErrorState, LoadingState } from '@/components/ui/states';
import { Text } from '@/components/ui/text';
import { colours, MIN_TOUCH, radii, space } from '@/components/ui/theme';
import { useBuildings } from '@/hooks/use-register';

const ROLE_LABEL = { admin: 'admin', electrician: 'electrician', inspector: 'inspector', owner: 'owner' } as const;

export default function Buildings() {
  const router = useRouter();
  const buildings = useBuildings();
  if (buildings.data === undefined) {
    if (buildings.isError) return <ErrorState error={buildings.error} onRetry={() => buildings.refetch()} />;
    return <LoadingState what="your buildings" />;
  }
  const list = buildings.data.buildings;
  if (list.length === 0) {
    return (
      <EmptyState
        title="No buildings yet"
        hint="Buildings your organisation looks after appear here. Ask your admin to add one, or to grant you access."
      />
    );
  }
  return (
    <>
      <Screen>
        {list.map((b) => (
          <Pressable
            key={b.id}
            accessibilityRole="button"
            accessibilityLabel={`Building ${b.name}`}
            onPress={() => router.push({ pathname: '/buildings/[buildingId]', params: { buildingId: b.id } })}
            style={({ pressed }) => [styles.card, pressed && styles.pressed]}
          >
            <View style={styles.text}>
              <Text variant="heading">{b.name}</Text>
              {b.address ? <Text tone="soft">{b.address}</Text> : null}
              <Text variant="small" tone="faint">
                {b.panelCount} panel{b.panelCount === 1 ? '' : 's'} · you are {ROLE_LABEL[b.role]}
              </Text>
            </View>
            <Text tone="faint" variant="heading">›</Text>
          </Pressable>
        ))}
      </Screen>
    </>
  );
}

const styles = StyleSheet.create({
  card: {
    minHeight: MIN_TOUCH + 24,
    flexDirection: 'row',
    alignItems: 'center',
    padding: space.lg,
    backgroundColor: colours.card,
    borderRadius: radii.lg,
    borderWidth: 1,
    borderColor: colours.rule,
    borderLeftWidth: 6,
    borderLeftColor: colours.copper,
  },
  pressed: { opacity: 0.7 },
  text: { flex: 1, gap: 2 },
});
