import { Stack, useLocalSearchParams, useRouter } from 'expo-router';
import { DeficiencyForm } from '@/components/deficiencies/deficiency-form';
import { Screen } from '@/components/ui/screen';
import { EmptyState, replicaGate } from '@/components/ui/states';
import { Text } from '@/components/ui/text';
import { useMembership, useRecordWrites } from '@/hooks/use-records';
import { useBuilding } from '@/hooks/use-register';
import { may } from '@/shared/deficiency';

export default function NewDeficiencyScreen() {
  const { buildingId, panelId, circuitId } = useLocalSearchParams<{ buildingId: string; panelId?: string; circuitId?: string }>();
  const router = useRouter();
  const query = useBuilding(buildingId);
  const membership = useMembership(query.data?.building.organisationId);
  const writes = useRecordWrites();
  const gate = replicaGate(query, 'building');
  if (gate || !query.data) return gate;
  const { building, panels } = query.data;
  if (!may(building.role, 'raise')) {
    return (
      <EmptyState
        title="Inspectors raise deficiencies"
        hint={`As ${building.role} you can comment on deficiencies and follow them in Findings; an inspector or an admin raises them.`}
      />
    );
  }
  const knownPanel = panelId && panels.some((p) => p.id === panelId) ? panelId : null;
  const knownCircuit = knownPanel && circuitId ? circuitId : null;
  return (
    <Screen>
      <Stack.Screen options={{ title: 'New deficiency' }} />
      <Text variant="small" tone="soft">{building.name}</Text>
      <DeficiencyForm
        panels={panels}
        initialPanelId={knownPanel}
        initialCircuitId={knownCircuit}
        dueDays={membership?.settings.dueDays}
        onSubmit={(body) => {
          const id = writes.raiseDeficiency(building.id, body);
          router.replace({ pathname: '/deficiencies/[deficiencyId]', params: { deficiencyId: id } });
        }}
      />
    </Screen>
  );
}
