/** The platform-free parts of preparing a photo (lib/image-resize.web.ts, lib/image-resize.ts). */
import type { PhotoType } from '@/shared/records';
import type { PhotoSource } from './photo-queue';

/** A photo ready to queue: its final bytes and what its row records. */
export interface PreparedPhoto {
  source: PhotoSource;
  bytes: number;
  sha256: string;
  contentType: PhotoType;
  width: number | null;
  height: number | null;
  /** ISO date-time */
  takenAt: string;
}

/** The size with the long edge at most `longEdge` px, proportions kept. */
export function scaleToLongEdge(width: number, height: number, longEdge: number): { width: number; height: number; scaled: boolean } {
  const long = Math.max(width, height);
  if (long <= longEdge) return { width, height, scaled: false };
  const f = longEdge / long;
  return { width: Math.max(1, Math.round(width * f)), height: Math.max(1, Math.round(height * f)), scaled: true };
}

const TWENTY_YEARS_MS = 20 * 365.25 * 86_400_000;

/**
 * When the photo was taken, as far as the device can tell: the file's time when it is plausible
 * (not in the future, not decades old), else now.
 */
export function takenAtOf(fileTimeMs: number | null | undefined, nowMs: number): string {
  const plausible = typeof fileTimeMs === 'number' && fileTimeMs > nowMs - TWENTY_YEARS_MS && fileTimeMs <= nowMs + 5 * 60_000;
  return new Date(plausible ? Math.min(fileTimeMs, nowMs) : nowMs).toISOString();
}

/** EXIF's "YYYY:MM:DD HH:MM:SS" (local time of the camera) as epoch ms, or null. */
export function exifTimeMs(value: unknown): number | null {
  if (typeof value !== 'string') return null;
  const m = /^(\d{4}):(\d{2}):(\d{2})[ T](\d{2}):(\d{2}):(\d{2})/.exec(value);
  if (!m) return null;
  const t = new Date(+m[1], +m[2] - 1, +m[3], +m[4], +m[5], +m[6]).getTime();
  return Number.isFinite(t) ? t : null;
}
