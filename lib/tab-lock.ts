/** A native app has one window: it holds the outbox at once. The web build uses tab-lock.web.ts. */
export function waitForOutboxLock(_userId: string, onAcquired: () => void): void {
  onAcquired();
}
