import { Stack, useLocalSearchParams, useRouter } from 'expo-router';
import { CircuitDetails, CircuitForm } from '@/components/register/circuit-form';
import { Screen } from '@/components/ui/screen';
import { CircuitRecord, CircuitRecordSummary } from '@/components/trips/trip-record';
import { EmptyState, replicaGate } from '@/components/ui/states';
import { useCircuitWrites } from '@/hooks/use-outbox';
import { usePanel } from '@/hooks/use-register';
import { confirmAction } from '@/lib/confirm';
import { can } from '@/shared/permissions';

export default function CircuitScreen() {
  const { panelId, circuitId } = useLocalSearchParams<{ panelId: string; circuitId: string }>();
  const router = useRouter();
  const query = usePanel(panelId);
  const writes = useCircuitWrites(panelId);
  const gate = replicaGate(query, 'panel');
  if (gate || !query.data) return gate;
  const { panel, building, circuits } = query.data;
  const circuit = circuits.find((c) => c.id === circuitId);
  if (!circuit) return <EmptyState title="Circuit not found" hint="It may have been deleted. Go back to the schedule." />;
  const title = `${panel.tag} · ${circuit.position}`;
  if (!can(building.role, 'schedule.edit')) {
    return (
      <Screen>
        <Stack.Screen options={{ title }} />
        <CircuitDetails circuit={circuit} panel={panel} />
        <CircuitRecord circuitId={circuit.id} panelId={panel.id} />
      </Screen>
    );
  }
  return (
    <Screen>
      <Stack.Screen options={{ title }} />
      <CircuitRecordSummary circuitId={circuit.id} />
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
      <CircuitRecord circuitId={circuit.id} panelId={panel.id} />
    </Screen>
  );
}
