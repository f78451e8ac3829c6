/**
 * Online detection that survives basements: the browser's online flag is only a hint. A failed
 * request marks the app offline; while offline it probes /api/health and comes back online only
 * when the API itself answers. "Online but the API unreachable" therefore stays offline, and the
 * outbox keeps its changes queued.
 */
import { onlineManager } from '@tanstack/react-query';
import { apiUrl } from './api-base';

const PROBE_EVERY_MS = 4000;
let probeTimer: ReturnType<typeof setTimeout> | null = null;

async function probe(): Promise<void> {
  probeTimer = null;
  try {
    const res = await fetch(apiUrl('/health'), { cache: 'no-store' });
    if (res.ok) {
      onlineManager.setOnline(true);
      return;
    }
  } catch {
    // still unreachable
  }
  scheduleProbe();
}

function scheduleProbe() {
  if (probeTimer === null) probeTimer = setTimeout(probe, PROBE_EVERY_MS);
}

/** Called by the API client when a request got no answer at all. */
export function markUnreachable(): void {
  onlineManager.setOnline(false);
  scheduleProbe();
}

/** Try the API now (the "sync now" button, the browser's online event). */
export function probeNow(): void {
  if (probeTimer) clearTimeout(probeTimer);
  void probe();
}

let installed = false;
export function installOnlineDetection(): void {
  if (installed || typeof window === 'undefined' || typeof window.addEventListener !== 'function') return;
  installed = true;
  onlineManager.setEventListener((setOnline) => {
    const offline = () => {
      setOnline(false);
      scheduleProbe();
    };
    // "online" from the browser only means a network interface is up: ask the API first
    const online = () => probeNow();
    window.addEventListener('offline', offline);
    window.addEventListener('online', online);
    if (typeof navigator !== 'undefined' && navigator.onLine === false) offline();
    return () => {
      window.removeEventListener('offline', offline);
      window.removeEventListener('online', online);
    };
  });
}
