import { useLocalSearchParams, useRouter } from 'expo-router';
import { CircuitForm, NEW_CIRCUIT } from '@/components/circuit-form';
import { Screen } from '@/components/screen';
import { EmptyState, ErrorState, LoadingState } from '@/components/states';
import { useCreateCircuit } from '@/hooks/use-circuits';
import { usePanel } from '@/hooks/use-panel';
import { canEditSchedules } from '@/hooks/use-session';
import { ApiError, describeError } from '@/lib/api';
import type { CircuitCreateBody } from '@/shared/schemas';

export default function NewCircuit() {
  const { panelId, position } = useLocalSearchParams<{ panelId: string; position?: string }>();
  const router = useRouter();
  const query = usePanel(panelId);
  const create = useCreateCircuit(panelId);
  if (query.data === undefined) {
    if (query.isError) return <ErrorState error={query.error} onRetry={() => query.refetch()} />;
    return <LoadingState what="the panel" />;
  }
  if (!canEditSchedules(query.data.building.role)) {
    return <EmptyState title="Read only" hint="Only electricians and admins add circuits." />;
  }
  const error = create.error;
  return (
    <Screen>
      <CircuitForm
        panel={query.data.panel}
        initial={{ ...NEW_CIRCUIT, position: Number(position) || 1 }}
        isNew
        busy={create.isPending}
        serverFields={error instanceof ApiError ? error.fields : undefined}
        formError={error && !(error instanceof ApiError && error.fields) ? describeError(error) : undefined}
        onSubmit={(fields) => create.mutate(fields as CircuitCreateBody, { onSuccess: () => router.back() })}
      />
    </Screen>
  );
}
