/** Whether the last save of the device's cache failed (storage full, private mode…). */
type Listener = () => void;
let problem: string | null = null;
const listeners = new Set<Listener>();

export function reportPersistFailure(error: Error): void {
  problem =
    error.name === 'QuotaExceededError'
      ? 'This device is out of storage: the building copy could not be saved. Your unsent changes are kept; free some space.'
      : `Saving on this device failed (${error.message}). Your unsent changes are kept in memory; do not close the app.`;
  listeners.forEach((l) => l());
}

export function reportPersistOk(): void {
  if (problem === null) return;
  problem = null;
  listeners.forEach((l) => l());
}

export function subscribePersistProblem(listener: Listener): () => void {
  listeners.add(listener);
  return () => listeners.delete(listener);
}

export const getPersistProblem = (): string | null => problem;
