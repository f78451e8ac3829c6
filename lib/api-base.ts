/**
 * Where the API is: the one place that reads `EXPO_PUBLIC_API_URL`. Unset (the web build, served
 * by the API itself) the app and the API share an origin, so paths stay relative.
 */
export const API_BASE = process.env.EXPO_PUBLIC_API_URL ?? '';

/** The address of an API path (`/health` → `/api/health`), relative when the origin is shared. */
export function apiUrl(path: string, base: string = API_BASE): string {
  return `${base}/api${path}`;
}

/**
 * The absolute address of an API path, for what leaves the page (a PDF opened in a new tab or the
 * system viewer, which has no page origin to resolve a relative path against).
 */
export function absoluteApiUrl(path: string, base: string = API_BASE, origin: string = pageOrigin()): string {
  return apiUrl(path, base || origin);
}

function pageOrigin(): string {
  return typeof window !== 'undefined' && window.location ? window.location.origin : '';
}
