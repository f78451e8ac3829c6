import { Stack, useLocalSearchParams, useRouter } from 'expo-router';
import { InspectionForm } from '@/components/inspections/inspection-form';
import { localToday } from '@/components/inspections/inspection-format';
import { SafetyNote } from '@/components/ui/safety-note';
import { Screen } from '@/components/ui/screen';
import { EmptyState, replicaGate } from '@/components/ui/states';
import { Text } from '@/components/ui/text';
import { useRecordWrites } from '@/hooks/use-records';
import { useBuilding, usePanel } from '@/hooks/use-register';
import type { InspectionCreateBody } from '@/shared/records';
import { can } from '@/shared/permissions';

export default function NewInspectionScreen() {
  const params = useLocalSearchParams<{ buildingId?: string; panelId?: string }>();
  const router = useRouter();
  const fromPanel = usePanel(params.panelId ?? '');
  const buildingId = params.buildingId || fromPanel.data?.building.id || '';
  const query = useBuilding(buildingId);
  const writes = useRecordWrites();
  const gate = replicaGate(query, 'building');
  if (gate || !query.data) return gate;
  const { building, panels } = query.data;
  if (!can(building.role, 'inspection.record')) {
    return (
      <EmptyState
        title="Inspections are recorded by the field team"
        hint={`As ${building.role} you can read this building's inspections and their findings, but not record one.`}
      />
    );
  }
  if (panels.length === 0) {
    return <EmptyState title="No panels to inspect" hint="Record this building's panels first; an inspection covers one or more of them." />;
  }
  const preselected = panels.some((p) => p.id === params.panelId) ? [params.panelId as string] : panels.length === 1 ? [panels[0].id] : [];
  return (
    <>
      <Stack.Screen options={{ title: 'New inspection' }} />
      <Screen>
        <Text variant="small" tone="soft">{building.name}</Text>
        <InspectionForm
          panels={panels}
          isNew
          initial={{ kind: 'thermal-survey', panelIds: preselected, performedOn: localToday(), ambientC: null, loadPct: null, notes: '' }}
          onSubmit={(fields) => {
            // a new inspection's form hands over the whole parsed body
            const id = writes.createInspection(building.id, fields as InspectionCreateBody);
            router.replace({ pathname: '/inspections/[inspectionId]', params: { inspectionId: id } });
          }}
        />
        <SafetyNote />
      </Screen>
    </>
  );
}
