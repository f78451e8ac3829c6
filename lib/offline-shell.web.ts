/**
 * Register the service worker that keeps the web app's own files (public/sw.js), so a reload with
 * no signal still opens the app. Sets `document.documentElement.dataset.offlineReady` once the
 * files are kept (the browser tests wait for it; a user sees it on the Sync tab).
 */
import { ocrFilesFor } from './ocr-assets';
import { coreFeature } from './ocr-feature';

export function registerOfflineShell(): void {
  if (typeof navigator === 'undefined' || !('serviceWorker' in navigator)) return;
  navigator.serviceWorker.addEventListener('message', (event) => {
    if (event.data?.type === 'cached') document.documentElement.dataset.offlineReady = 'true';
  });
  navigator.serviceWorker
    .register('/sw.js')
    .then(() => navigator.serviceWorker.ready)
    .then(async (registration) => {
      const loaded = performance
        .getEntriesByType('resource')
        .map((entry) => entry.name)
        .filter((url) => !new URL(url).pathname.startsWith('/api/'));
      // the door-card reader's worker, core and model: kept now, so a card is read with no signal
      const ocr = ocrFilesFor(await coreFeature()).map((p) => location.origin + p);
      registration.active?.postMessage({ type: 'cache-urls', urls: [location.origin + '/', ...loaded, ...ocr] });
    })
    .catch(() => undefined);
  // ask the browser not to evict the queue under storage pressure
  navigator.storage?.persist?.().catch(() => undefined);
}
