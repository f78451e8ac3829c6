import { Stack, useLocalSearchParams, useRouter } from 'expo-router';
import { StyleSheet, View } from 'react-native';
import { breakerLabel, directoryText } from '@/components/register/circuit-format';
import { SafetyNote } from '@/components/ui/safety-note';
import { Screen } from '@/components/ui/screen';
import { EmptyState, replicaGate } from '@/components/ui/states';
import { Text } from '@/components/ui/text';
import { space } from '@/components/ui/theme';
import { TripForm } from '@/components/trips/trip-form';
import { useRecordWrites } from '@/hooks/use-records';
import { usePanel } from '@/hooks/use-register';
import { can } from '@/shared/permissions';

export default function NewTripScreen() {
  const { circuitId, panelId } = useLocalSearchParams<{ circuitId: string; panelId: string }>();
  const router = useRouter();
  const query = usePanel(panelId);
  const writes = useRecordWrites();
  const gate = replicaGate(query, 'panel');
  if (gate || !query.data) return gate;
  const { panel, building, circuits } = query.data;
  const circuit = circuits.find((c) => c.id === circuitId);
  if (!circuit) return <EmptyState title="Circuit not found" hint="It may have been deleted. Go back to the schedule." />;
  if (!can(building.role, 'inspection.record')) {
    return <EmptyState title="Trips are recorded by the field team" hint="Tell your electrician or inspector when a breaker trips: they record it here with the load at the time." />;
  }
  return (
    <Screen>
      <Stack.Screen options={{ title: 'Record a trip' }} />
      <View style={styles.head}>
        <Text variant="small" tone="soft">
          {building.name} · Panel {panel.tag}
        </Text>
        <Text variant="heading" heading={2}>
          <Text variant="readingBold">{circuit.position}</Text> {directoryText(circuit)}
        </Text>
        <Text variant="reading" tone="soft">{breakerLabel(circuit)}</Text>
      </View>
      <TripForm
        circuit={circuit}
        onSubmit={(body) => {
          writes.recordTrip(building.id, body);
          router.back();
        }}
      />
      <SafetyNote />
    </Screen>
  );
}

const styles = StyleSheet.create({ head: { gap: space.xs } });
