import { useLocalSearchParams, useRouter } from 'expo-router';
import { PanelForm } from '@/components/panel-form';
import { Screen } from '@/components/screen';
import { EmptyState, ErrorState, LoadingState } from '@/components/states';
import { usePanel, useSavePanel } from '@/hooks/use-panel';
import { canEditSchedules } from '@/hooks/use-session';
import { ApiError, describeError } from '@/lib/api';

export default function EditPanel() {
  const { panelId } = useLocalSearchParams<{ panelId: string }>();
  const router = useRouter();
  const query = usePanel(panelId);
  const save = useSavePanel(panelId);
  if (query.data === undefined) {
    if (query.isError) return <ErrorState error={query.error} onRetry={() => query.refetch()} />;
    return <LoadingState what="the panel" />;
  }
  if (!canEditSchedules(query.data.building.role)) {
    return <EmptyState title="Read only" hint="Only electricians and admins edit panels." />;
  }
  const error = save.error;
  return (
    <Screen>
      <PanelForm
        panel={query.data.panel}
        busy={save.isPending}
        serverFields={error instanceof ApiError ? error.fields : undefined}
        formError={error && !(error instanceof ApiError && error.fields) ? describeError(error) : undefined}
        onSubmit={(patch) => save.mutate(patch, { onSuccess: () => router.back() })}
      />
    </Screen>
  );
}
