import { Stack, useLocalSearchParams, useRouter } from 'expo-router';
import { CircuitDetails, CircuitForm } from '@/components/circuit-form';
import { Screen } from '@/components/screen';
import { EmptyState, ErrorState, LoadingState } from '@/components/states';
import { useDeleteCircuit, useSaveCircuit } from '@/hooks/use-circuits';
import { usePanel } from '@/hooks/use-panel';
import { canEditSchedules } from '@/hooks/use-session';
import { ApiError, describeError } from '@/lib/api';
import { confirmAction } from '@/lib/confirm';

export default function CircuitScreen() {
  const { panelId, circuitId } = useLocalSearchParams<{ panelId: string; circuitId: string }>();
  const router = useRouter();
  const query = usePanel(panelId);
  const save = useSaveCircuit(panelId);
  const remove = useDeleteCircuit(panelId);
  if (query.data === undefined) {
    if (query.isError) return <ErrorState error={query.error} onRetry={() => query.refetch()} />;
    return <LoadingState what="the circuit" />;
  }
  const { panel, building, circuits } = query.data;
  const circuit = circuits.find((c) => c.id === circuitId);
  if (!circuit) return <EmptyState title="Circuit not found" hint="It may have been deleted. Go back to the schedule." />;
  const title = `${panel.tag} · ${circuit.position}`;
  if (!canEditSchedules(building.role)) {
    return (
      <Screen>
        <Stack.Screen options={{ title }} />
        <CircuitDetails circuit={circuit} panel={panel} />
      </Screen>
    );
  }
  const error = save.error ?? remove.error;
  return (
    <Screen>
      <Stack.Screen options={{ title }} />
      <CircuitForm
        key={circuit.id}
        panel={panel}
        initial={circuit}
        isNew={false}
        busy={save.isPending || remove.isPending}
        serverFields={error instanceof ApiError ? error.fields : undefined}
        formError={error && !(error instanceof ApiError && error.fields) ? describeError(error) : undefined}
        onSubmit={(patch) => {
          if (Object.keys(patch).length === 0) return router.back();
          save.mutate({ circuitId, patch }, { onSuccess: () => router.back() });
        }}
        onDelete={async () => {
          const ok = await confirmAction(
            'Delete this circuit?',
            `Position ${circuit.position} “${circuit.description || circuit.status}” will be removed from the schedule.`,
            'Delete',
          );
          if (ok) remove.mutate(circuitId, { onSuccess: () => router.back() });
        }}
      />
    </Screen>
  );
}
