/**
 * The maintenance due list, read from the device's replica (works offline): every panel's next
 * thermal survey and maintenance (shared/maintenance-due.ts), for one building or all of them.
 */
import { useQuery } from '@tanstack/react-query';
import { useCallback } from 'react';
import { recordsOf, type Replica } from '@/lib/replica';
import { todayISO } from '@/shared/deficiency';
import { byDue, maintenanceDue, type DueItem } from '@/shared/maintenance-due';
import { keys } from './keys';

export interface DueRow extends DueItem {
  buildingName: string;
}

/** Most urgent first; `buildingId` null = every building on the device. */
export function useMaintenanceDue(buildingId: string | null) {
  return useQuery({
    queryKey: keys.replica,
    select: useCallback(
      (r: Replica): DueRow[] => {
        const today = todayISO();
        const copies = Object.values(r.buildings).filter((c) => buildingId === null || c.building.id === buildingId);
        return copies
          .flatMap((copy) =>
            maintenanceDue(Object.values(copy.panels), Object.values(recordsOf(copy, 'inspections')), today).map((item) => ({
              ...item,
              buildingName: copy.building.name,
            })),
          )
          .sort((a, b) => byDue(a, b) || a.buildingName.localeCompare(b.buildingName));
      },
      [buildingId],
    ),
  });
}
