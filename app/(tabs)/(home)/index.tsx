import { useRouter } from 'expo-router';
import { StyleSheet, View } from 'react-native';
import { PressableCard } from '@/components/ui/card';
import { Screen } from '@/components/ui/screen';
import { EmptyState, ErrorState, LoadingState } from '@/components/ui/states';
import { Text } from '@/components/ui/text';
import { colours, MIN_TOUCH } from '@/components/ui/theme';
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
          <PressableCard
            size="section"
            key={b.id}
            accessibilityRole="button"
            // named by what it shows, so the name read out is the words on the card (WCAG 2.5.3
            // Label in Name); the kicker makes it "Building <name> …"
            onPress={() => router.push({ pathname: '/buildings/[buildingId]', params: { buildingId: b.id } })}
            style={styles.card}
          >
            <View style={styles.text}>
              <Text variant="small" tone="faint">
                Building
              </Text>
              <Text variant="heading">{b.name}</Text>
              {b.address ? <Text tone="soft">{b.address}</Text> : null}
              <Text variant="small" tone="faint">
                {b.panelCount} panel{b.panelCount === 1 ? '' : 's'} · you are {ROLE_LABEL[b.role]}
              </Text>
            </View>
            <Text tone="faint" variant="heading" aria-hidden>
              ›
            </Text>
          </PressableCard>
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
    borderLeftWidth: 6,
    borderLeftColor: colours.copper,
  },
  text: { flex: 1, gap: 2 },
});
