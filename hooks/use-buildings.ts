import { useQuery } from '@tanstack/react-query';
import { api } from '@/lib/api';
import type { BuildingResponse, BuildingsResponse } from '@/shared/schemas';
import { keys } from './keys';

export function useBuildings() {
  return useQuery({
    queryKey: keys.buildings,
    queryFn: () => api.get<BuildingsResponse>('/buildings'),
  });
}

export function useBuilding(buildingId: string) {
  return useQuery({
    queryKey: keys.building(buildingId),
    queryFn: () => api.get<BuildingResponse>(`/buildings/${buildingId}`),
  });
}
