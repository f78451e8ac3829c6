import { REPLICA_KEY, SYNC_LOG_KEY } from '@/lib/sync';

/** The one query-key factory; every hook takes its keys from here. */
export const keys = {
  me: ['me'] as const,
  /** the device's copy of every building the user may see (lib/replica.ts) */
  replica: REPLICA_KEY,
  /** what happened to this device's pushed changes (lib/replica.ts SyncLog) */
  syncLog: SYNC_LOG_KEY,
  /** the organisation's time-current band library (REST, persisted for offline judging) */
  bands: ['bands'] as const,
  /** the user's °C/°F choice, kept on the device (hooks/use-temperature-unit.ts) */
  temperatureUnit: (userId: string | null) => ['temperature-unit', userId] as const,
};
