/**
 * Register the service worker that keeps the web app's own files (public/sw.js), so a reload with
 * no signal still opens the app. Sets `document.documentElement.dataset.offlineReady` once the
 * files are kept (the browser tests wait for it; a user sees it on the Sync tab).
 */
import { ocrFilesFor } from './ocr-assets';
import { coreFeature } from './ocr-feature';

async function missingFromCache(urls: string[]): Promise<string[]> {
  if (typeof caches === 'undefined') return urls;
  const kept = await Promise.all(urls.map((u) => caches.match(u).then(Boolean, () => false)));
  return urls.filter((_u, i) => !kept[i]);
}

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
      // the door-card reader's worker, core and model (≈ 7 MB): kept now, so a card is read with no
      // signal; their paths carry their versions, so one kept is never fetched again
      const ocr = await missingFromCache(ocrFilesFor(await coreFeature()).map((p) => location.origin + p));
      registration.active?.postMessage({ type: 'cache-urls', urls: [location.origin + '/', ...loaded, ...ocr] });
    })
    .catch(() => undefined);
  // ask the browser not to evict the queue under storage pressure
  navigator.storage?.persist?.().catch(() => undefined);
}
