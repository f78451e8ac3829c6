import { useMutation, useQueryClient } from '@tanstack/react-query';
import { api } from '@/lib/api';
import type { Circuit, CircuitCreateBody, CircuitPatchBody, PanelResponse } from '@/shared/schemas';
import { keys } from './keys';

function putCircuit(old: PanelResponse | undefined, circuit: Circuit): PanelResponse | undefined {
  if (!old) return old;
  const others = old.circuits.filter((c) => c.id !== circuit.id);
  return { ...old, circuits: [...others, circuit].sort((a, b) => a.position - b.position) };
}

export function useSaveCircuit(panelId: string) {
  const queryClient = useQueryClient();
  return useMutation({
    mutationFn: ({ circuitId, patch }: { circuitId: string; patch: CircuitPatchBody }) =>
      api.patch<{ circuit: Circuit }>(`/circuits/${circuitId}`, patch),
    onSuccess: ({ circuit }) => {
      queryClient.setQueryData<PanelResponse>(keys.panel(panelId), (old) => putCircuit(old, circuit));
    },
  });
}

export function useCreateCircuit(panelId: string) {
  const queryClient = useQueryClient();
  return useMutation({
    mutationFn: (body: CircuitCreateBody) =>
      api.post<{ circuit: Circuit }>(`/panels/${panelId}/circuits`, body),
    onSuccess: ({ circuit }) => {
      queryClient.setQueryData<PanelResponse>(keys.panel(panelId), (old) => putCircuit(old, circuit));
    },
  });
}

export function useDeleteCircuit(panelId: string) {
  const queryClient = useQueryClient();
  return useMutation({
    mutationFn: (circuitId: string) => api.del<{ ok: true }>(`/circuits/${circuitId}`).then(() => circuitId),
    onSuccess: (circuitId) => {
      queryClient.setQueryData<PanelResponse>(
        keys.panel(panelId),
        (old) => old && { ...old, circuits: old.circuits.filter((c) => c.id !== circuitId) },
      );
    },
  });
}
