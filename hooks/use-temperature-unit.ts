/**
 * The user's temperature unit for display and typing (°C or °F), chosen on the Me tab. Stored on
 * this device, per user (key `ampwright:<userId>:temperature-unit` in lib/storage), not on the
 * server: it is how this person reads numbers, and it must work offline. Values are stored in °C
 * everywhere else whatever is chosen (shared/units.ts converts).
 */
import { useQuery, useQueryClient } from '@tanstack/react-query';
import { useContext } from 'react';
import { kv } from '@/lib/storage';
import { DEFAULT_TEMPERATURE_UNIT, isTemperatureUnit, type TemperatureUnit } from '@/shared/units';
import { keys } from './keys';
import { AccountContext } from './use-session';

const storageKey = (userId: string) => `ampwright:${userId}:temperature-unit`;

export function useTemperatureUnit(): { unit: TemperatureUnit; setUnit: (unit: TemperatureUnit) => void } {
  const userId = useContext(AccountContext).userId;
  const client = useQueryClient();
  const key = keys.temperatureUnit(userId);
  const query = useQuery({
    queryKey: key,
    queryFn: async (): Promise<TemperatureUnit> => {
      if (!userId) return DEFAULT_TEMPERATURE_UNIT;
      const stored = await kv.getItem(storageKey(userId));
      return isTemperatureUnit(stored) ? stored : DEFAULT_TEMPERATURE_UNIT;
    },
    staleTime: Number.POSITIVE_INFINITY,
    // the device's own storage: no network involved, so it runs offline too
    networkMode: 'always',
  });
  const setUnit = (unit: TemperatureUnit) => {
    client.setQueryData(key, unit);
    if (userId) void kv.setItem(storageKey(userId), unit);
  };
  return { unit: query.data ?? DEFAULT_TEMPERATURE_UNIT, setUnit };
}
