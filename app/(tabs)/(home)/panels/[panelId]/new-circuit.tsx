import { useLocalSearchParams, useRouter } from 'expo-router';
import { CircuitForm, NEW_CIRCUIT } from '@/components/register/circuit-form';
import { Screen } from '@/components/ui/screen';
import { EmptyState, replicaGate } from '@/components/ui/states';
import { useCircuitWrites } from '@/hooks/use-outbox';
import { usePanel } from '@/hooks/use-register';
import type { CircuitCreateBody } from '@/shared/schemas';
import { can } from '@/shared/permissions';

export default function NewCircuit() {
  const { panelId, position } = useLocalSearchParams<{ panelId: string; position?: string }>();
  const router = useRouter();
  const query = usePanel(panelId);
  const writes = useCircuitWrites(panelId);
  const gate = replicaGate(query, 'panel');
  if (gate || !query.data) return gate;
  if (!can(query.data.building.role, 'schedule.edit')) {
    return <EmptyState title="Read only" hint="Only electricians and admins add circuits." />;
  }
  return (
    <Screen>
      <CircuitForm
        panel={query.data.panel}
        others={query.data.circuits}
        initial={{ ...NEW_CIRCUIT, position: Number(position) || 1 }}
        isNew
        onSubmit={(fields) => {
          writes.create(fields as CircuitCreateBody);
          router.back();
        }}
      />
    </Screen>
  );
}
