/**
 * One tab syncs at a time: every tab of a user writes the whole cache under the same key, so a
 * second tab could write over the first one's queue. A tab waits for the user's Web Lock and keeps
 * it while it is shown. After a reload the old page lets go within moments; a second tab waits
 * until the first one closes (and is told so meanwhile).
 */
const held = new Map<string, Promise<void>>();
let release: () => void = () => undefined;

if (typeof window !== 'undefined' && typeof window.addEventListener === 'function') {
  // a page kept in the back-forward cache would keep the lock from the page the user is on
  window.addEventListener('pagehide', () => release());
  window.addEventListener('pageshow', (event) => {
    if (event.persisted) window.location.reload();
  });
}

export function waitForOutboxLock(userId: string, onAcquired: () => void): void {
  const locks = typeof navigator === 'undefined' ? undefined : navigator.locks;
  if (!locks) {
    onAcquired();
    return;
  }
  // once per page: the layout may mount again (history navigation) while this page holds it
  let acquired = held.get(userId);
  if (!acquired) {
    acquired = new Promise<void>((resolve) => {
      locks
        .request(`ampwright:outbox:${userId}`, () => {
          resolve();
          return new Promise<void>((done) => (release = done));
        })
        .catch(() => resolve());
    });
    held.set(userId, acquired);
  }
  void acquired.then(onAcquired);
}
