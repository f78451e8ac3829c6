/**
 * How inspections and readings read on screen. Pure functions, shared by the inspection screen,
 * the reading form and the building's list of inspections. Who may record or sign is
 * shared/permissions.ts `can`, the table the server's guards read.
 */
import { THERMOGRAPHY_LOAD_MIN_FRACTION, type TripVerdict } from '@/shared/calc';
import {
  THERMAL_COMPONENT_LABELS,
  type Inspection,
  type InspectionKind,
  type Reading,
  type ReadingKind,
} from '@/shared/records';
import type { Circuit, Panel } from '@/shared/schemas';

/** The reading kinds an inspection of this kind is made of (the rest stay one tap further away). */
export const READING_KINDS_FOR: Record<InspectionKind, readonly Exclude<ReadingKind, 'visual'>[]> = {
  'thermal-survey': ['thermal'],
  'torque-audit': ['torque'],
  'trip-test': ['trip'],
  visual: [],
  'full-maintenance': ['thermal', 'torque', 'trip'],
};

export const READING_KIND_LABELS: Record<ReadingKind, string> = {
  thermal: 'Thermal reading',
  torque: 'Torque check',
  trip: 'Trip test',
  visual: 'Visual finding',
};

/** Inspections whose readings depend on the load at the time (NFPA 70B: thermography at ≥ 40 %). */
export function needsLoad(kind: InspectionKind): boolean {
  return kind === 'thermal-survey' || kind === 'full-maintenance';
}

/**
 * The light-load warning of a thermal survey (NFPA 70B 2023: at least 40 % of normal load), or
 * null when the load is enough, not recorded, or the kind has no thermography.
 */
export function lightLoadWarning(kind: InspectionKind, loadPct: number | null): string | null {
  if (!needsLoad(kind) || loadPct === null || !Number.isFinite(loadPct)) return null;
  const minPct = THERMOGRAPHY_LOAD_MIN_FRACTION * 100;
  if (loadPct >= minPct) return null;
  return (
    `Load is ${loadPct} % of normal, under the ${minPct} % NFPA 70B asks for a thermal survey. ` +
    'A rise read now understates the rise at full load: scan again at a busier time if you can, ' +
    'or give each reading its measured and reference load so the rise is corrected.'
  );
}

const MONTHS = ['Jan', 'Feb', 'Mar', 'Apr', 'May', 'Jun', 'Jul', 'Aug', 'Sep', 'Oct', 'Nov', 'Dec'];

/** "12 Mar 2026" for a YYYY-MM-DD date or an ISO date-time (the date as written, no time zone shift). */
export function dateText(iso: string): string {
  const [y, m, d] = iso.slice(0, 10).split('-').map(Number);
  if (!y || !m || !d) return iso;
  return `${d} ${MONTHS[m - 1]} ${y}`;
}

/** Today on this device as YYYY-MM-DD (the inspector's local date, not UTC). */
export function localToday(now = new Date()): string {
  const pad = (n: number) => String(n).padStart(2, '0');
  return `${now.getFullYear()}-${pad(now.getMonth() + 1)}-${pad(now.getDate())}`;
}

/** A row made on this device has no name until the server answers: it is "you" meanwhile. */
export function personName(name: string | null, id: string | null, myId: string | null | undefined): string {
  if (name) return name;
  if (id && myId && id === myId) return 'you';
  return id ? 'you' : '—';
}

export function signedLine(inspection: Inspection, myId: string | null | undefined): string | null {
  if (!inspection.signedAt) return null;
  return `Signed by ${personName(inspection.signedByName, inspection.signedBy, myId)} on ${dateText(inspection.signedAt)}`;
}

/** "13 · Corridor lights east" — how a circuit is named in a picker or on a reading. */
export function circuitName(c: Pick<Circuit, 'position' | 'poles' | 'description' | 'status'>): string {
  const where = c.poles > 1 ? `${c.position} (${c.poles}P)` : String(c.position);
  const what = c.description.trim() || (c.status === 'spare' ? 'Spare' : c.status === 'space' ? 'Space' : '(no description)');
  return `${where} · ${what}`;
}

/** "LA 13", "LA" — where on the panel a reading was taken. */
export function readingPlace(panel: Pick<Panel, 'tag'> | undefined, circuit: Pick<Circuit, 'position'> | null | undefined): string {
  const tag = panel?.tag ?? 'panel';
  return circuit ? `${tag} ${circuit.position}` : tag;
}

const TRIP_WORDS: Record<TripVerdict, string> = {
  pass: 'Breaker tripped in the expected time',
  slow: 'Breaker slow to trip',
  fast: 'Breaker tripped early',
  'no-trip': 'Breaker did not trip',
  'unexpected-trip': 'Breaker tripped at or below its rating',
};

export function tripVerdictWords(verdict: TripVerdict | null): string {
  return verdict ? TRIP_WORDS[verdict] : 'No judgement';
}

/** The title a deficiency raised from a reading starts with: "Hot lug, LA 13 phase B". */
export function deficiencyTitleFor(
  reading: Reading,
  panel: Pick<Panel, 'tag'> | undefined,
  circuit: Pick<Circuit, 'position'> | null | undefined,
  tripVerdict: TripVerdict | null = null,
): string {
  const place = readingPlace(panel, circuit);
  switch (reading.kind) {
    case 'thermal': {
      const what = reading.component
        ? reading.component === 'other'
          ? 'spot'
          : THERMAL_COMPONENT_LABELS[reading.component].toLowerCase()
        : 'spot';
      const phase = reading.phase ? (reading.phase === 'N' ? ' neutral' : ` phase ${reading.phase}`) : '';
      return `Hot ${what}, ${place}${phase}`;
    }
    case 'torque':
      return `Termination torque out of limits, ${reading.circuitId ? place : `${place} main lugs / main breaker`}`;
    case 'trip':
      return `${tripVerdictWords(tripVerdict)}, ${place}`;
    case 'visual':
      return `Visual finding, ${place}`;
  }
}

/** "main" is how a torque reading on the main lugs or main breaker names its fastener. */
export function fastenerText(reading: Pick<Reading, 'fastener' | 'circuitId'>): string {
  if (reading.fastener === 'main' || (!reading.fastener && !reading.circuitId)) return 'Main lugs / main breaker';
  return reading.fastener;
}
