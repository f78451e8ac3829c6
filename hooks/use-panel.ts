import { useMutation, useQuery, useQueryClient } from '@tanstack/react-query';
import { api } from '@/lib/api';
import type { Panel, PanelPatchBody, PanelResponse } from '@/shared/schemas';
import { keys } from './keys';

export function usePanel(panelId: string) {
  return useQuery({
    queryKey: keys.panel(panelId),
    queryFn: () => api.get<PanelResponse>(`/panels/${panelId}`),
  });
}

export function useSavePanel(panelId: string) {
  const queryClient = useQueryClient();
  return useMutation({
    mutationFn: (patch: PanelPatchBody) => api.patch<{ panel: Panel }>(`/panels/${panelId}`, patch),
    onSuccess: ({ panel }) => {
      queryClient.setQueryData<PanelResponse>(keys.panel(panelId), (old) => old && { ...old, panel });
      queryClient.invalidateQueries({ queryKey: keys.building(panel.buildingId) });
    },
  });
}
