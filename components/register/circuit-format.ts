import { conductorSizeLabel } from '@/shared/domain';
import type { Circuit } from '@/shared/schemas';

/** "2P 30 A", "SPACE" — how the breaker reads on the schedule. */
export function breakerLabel(c: Pick<Circuit, 'status' | 'poles' | 'ratingA'>): string {
  if (c.status === 'space') return 'SPACE';
  return `${c.poles}P ${c.ratingA ?? '?'} A`;
}

export function conductorLabel(c: Pick<Circuit, 'conductorSize' | 'conductorMaterial'>): string | null {
  if (!c.conductorSize) return null;
  return `${conductorSizeLabel(c.conductorSize)}${c.conductorMaterial ? ` ${c.conductorMaterial}` : ''}`;
}

export function vaLabel(va: number | null): string | null {
  if (va === null) return null;
  return `${Math.round(va).toLocaleString('en-US')} VA`;
}

export function directoryText(c: Pick<Circuit, 'status' | 'description'>): string {
  if (c.status === 'space') return 'Space — no breaker';
  if (c.description.trim()) return c.description;
  return c.status === 'spare' ? 'Spare' : '(no description)';
}
