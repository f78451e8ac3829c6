import { useLocalSearchParams, useRouter } from 'expo-router';
import { PanelForm } from '@/components/register/panel-form';
import { Screen } from '@/components/ui/screen';
import { EmptyState, replicaGate } from '@/components/ui/states';
import { usePanelSave } from '@/hooks/use-outbox';
import { usePanel } from '@/hooks/use-register';
import { can } from '@/shared/permissions';

export default function EditPanel() {
  const { panelId } = useLocalSearchParams<{ panelId: string }>();
  const router = useRouter();
  const query = usePanel(panelId);
  const save = usePanelSave(panelId);
  const gate = replicaGate(query, 'panel');
  if (gate || !query.data) return gate;
  if (!can(query.data.building.role, 'schedule.edit')) {
    return <EmptyState title="Read only" hint="Only electricians and admins edit panels." />;
  }
  return (
    <Screen>
      <PanelForm
        panel={query.data.panel}
        circuits={query.data.circuits}
        onSubmit={(patch) => {
          if (Object.keys(patch).length > 0) save(patch);
          router.back();
        }}
      />
    </Screen>
  );
}
