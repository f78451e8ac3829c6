/** "just now", "4 min ago", "3 h ago", then the date: how old a queued change or a sync is. */
export function timeAgo(at: number | string | null | undefined, now = Date.now()): string {
  if (at === null || at === undefined) return 'never';
  const ms = typeof at === 'number' ? at : Date.parse(at);
  if (!Number.isFinite(ms)) return 'unknown';
  const s = Math.max(0, Math.round((now - ms) / 1000));
  if (s < 45) return 'just now';
  if (s < 3600) return `${Math.round(s / 60)} min ago`;
  if (s < 86_400) return `${Math.round(s / 3600)} h ago`;
  return new Date(ms).toISOString().slice(0, 10);
}

/** The wall-clock part of an HLC stamp, for people. */
export function stampTime(hlc: string): string {
  return timeAgo(hlc.slice(0, 24));
}
