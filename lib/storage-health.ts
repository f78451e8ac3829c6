/**
 * What went wrong with the device's storage, for the banner every screen shows: the last save
 * failed (storage full, private mode…), or something saved could not be read back after a reload.
 */
type Listener = () => void;
let saveProblem: string | null = null;
let readProblem: string | null = null;
const listeners = new Set<Listener>();
const tell = () => listeners.forEach((l) => l());

export function reportPersistFailure(error: Error): void {
  saveProblem =
    error.name === 'QuotaExceededError'
      ? 'This device is out of storage: the building copy could not be saved. Your unsent changes are kept; free some space.'
      : `Saving on this device failed (${error.message}). Your unsent changes are kept in memory; do not close the app.`;
  tell();
}

export function reportPersistOk(): void {
  if (saveProblem === null) return;
  saveProblem = null;
  tell();
}

/** Something stored could not be read back (cut short, damaged, another shape). */
export function reportCopyProblem(message: string): void {
  readProblem = message;
  tell();
}

/** A pull brought the buildings back: what could not be read is replaced. */
export function clearCopyProblem(): void {
  if (readProblem === null) return;
  readProblem = null;
  tell();
}

export function subscribePersistProblem(listener: Listener): () => void {
  listeners.add(listener);
  return () => listeners.delete(listener);
}

export const getPersistProblem = (): string | null => saveProblem ?? readProblem;
