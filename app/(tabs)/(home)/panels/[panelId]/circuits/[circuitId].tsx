import { Stack, useLocalSearchParams, useRouter } from 'expo-router';
import { useState } from 'react';
import { StyleSheet } from 'react-native';
import { BreakerIdentity } from '@/components/register/breaker-identity';
import { CircuitForm } from '@/components/register/circuit-form';
import { CircuitHead } from '@/components/register/circuit-head';
import { Button } from '@/components/ui/button';
import { Screen } from '@/components/ui/screen';
import { CircuitRecord } from '@/components/trips/trip-record';
import { EmptyState, replicaGate } from '@/components/ui/states';
import { useCircuitWrites } from '@/hooks/use-outbox';
import { usePanel } from '@/hooks/use-register';
import { confirmAction } from '@/lib/confirm';
import { can } from '@/shared/permissions';

/**
 * A circuit opens on its record (what the door says, breaker, conductor, warnings, then the trips
 * and readings as one timeline); the form is behind "Edit circuit". `?edit=1` opens the form
 * straight away (a link to the form itself).
 */
export default function CircuitScreen() {
  const { panelId, circuitId, edit } = useLocalSearchParams<{ panelId: string; circuitId: string; edit?: string }>();
  const router = useRouter();
  const [editing, setEditing] = useState(edit === '1');
  const query = usePanel(panelId);
  const writes = useCircuitWrites(panelId);
  const gate = replicaGate(query, 'panel');
  if (gate || !query.data) return gate;
  const { panel, building, circuits } = query.data;
  const circuit = circuits.find((c) => c.id === circuitId);
  if (!circuit) return <EmptyState title="Circuit not found" hint="It may have been deleted. Go back to the schedule." />;
  const title = `${panel.tag} · ${circuit.position}`;
  const canEdit = can(building.role, 'schedule.edit');

  if (canEdit && editing) {
    return (
      <Screen>
        <Stack.Screen options={{ title: `Edit ${title}` }} />
        <Button label="Cancel: back to the record" tone="quiet" onPress={() => setEditing(false)} testID="cancel-edit" style={styles.start} />
        <CircuitForm
          key={circuit.id}
          panel={panel}
          others={circuits}
          initial={circuit}
          isNew={false}
          onSubmit={(patch) => {
            if (Object.keys(patch).length > 0) writes.save(circuitId, patch);
            router.back();
          }}
          onDelete={async () => {
            const ok = await confirmAction(
              'Delete this circuit?',
              `Position ${circuit.position} “${circuit.description || circuit.status}” will be removed from the schedule.`,
              'Delete',
            );
            if (!ok) return;
            writes.remove(circuitId);
            router.back();
          }}
        />
      </Screen>
    );
  }
  return (
    <Screen>
      <Stack.Screen options={{ title }} />
      <CircuitHead circuit={circuit} panel={panel} />
      {canEdit && <Button label="Edit circuit" onPress={() => setEditing(true)} testID="edit-circuit" style={styles.start} />}
      {/* cards about this circuit (its breaker, fault current …) sit here, one line each */}
      <BreakerIdentity circuit={circuit} panel={panel} building={building} />
      <CircuitRecord circuitId={circuit.id} panelId={panel.id} />
    </Screen>
  );
}

const styles = StyleSheet.create({
  start: { alignSelf: 'flex-start' },
});
