/**
 * Register the service worker that keeps the web app's own files (public/sw.js), so a reload with
 * no signal still opens the app. Sets `document.documentElement.dataset.offlineReady` once the
 * files are kept (the browser tests wait for it; a user sees it on the Sync tab).
 */
export function registerOfflineShell(): void {
  if (typeof navigator === 'undefined' || !('serviceWorker' in navigator)) return;
  navigator.serviceWorker.addEventListener('message', (event) => {
    if (event.data?.type === 'cached') document.documentElement.dataset.offlineReady = 'true';
  });
  navigator.serviceWorker
    .register('/sw.js')
    .then(() => navigator.serviceWorker.ready)
    .then((registration) => {
      const loaded = performance
        .getEntriesByType('resource')
        .map((entry) => entry.name)
        .filter((url) => !new URL(url).pathname.startsWith('/api/'));
      registration.active?.postMessage({ type: 'cache-urls', urls: [location.origin + '/', ...loaded] });
    })
    .catch(() => undefined);
  // ask the browser not to evict the queue under storage pressure
  navigator.storage?.persist?.().catch(() => undefined);
}
