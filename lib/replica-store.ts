/**
 * How the device's copy is laid out in storage: one entry per building (its row, panels, record
 * lists, conflicts and cursor) and one per panel (its circuits), plus a small index. A boot then
 * reads what the first screen needs instead of parsing every building, and a save writes only the
 * entries whose rows changed. Pure: lib/device-copy.ts does the reading and writing.
 */
import { z } from 'zod';
import { arcFlashLabelSchema } from '@/shared/arc-flash';
import { deficiencyEntrySchema, deficiencySchema, inspectionSchema, photoSchema, readingSchema, tripEventSchema } from '@/shared/records';
import { buildingSchema, circuitSchema, panelSchema, type Circuit } from '@/shared/schemas';
import { conflictSchema, RECORD_LISTS } from '@/shared/sync';
import type { BuildingCopy, Replica } from './replica';

/** Storage keys of one user's copy; every key starts with `prefix`. */
export function copyKeys(userId: string) {
  const prefix = `ampwright:${userId}:copy:`;
  return {
    prefix,
    index: `${prefix}index`,
    building: (buildingId: string) => `${prefix}building:${buildingId}`,
    panel: (buildingId: string, panelId: string) => `${prefix}building:${buildingId}:panel:${panelId}`,
  };
}

/** A building's entry: the copy without its circuits, which are stored per panel. */
export type StoredHead = Omit<BuildingCopy, 'circuits'>;

export interface StoredIndex {
  buildingIds: string[];
  lastSyncAt: string | null;
}

export function headOf(copy: BuildingCopy): StoredHead {
  const { circuits: _stored_per_panel, ...head } = copy;
  return head;
}

/** A building's circuits by panel, every panel of the building listed (an empty panel too). */
export function circuitsByPanel(copy: BuildingCopy): Map<string, Circuit[]> {
  const groups = new Map<string, Circuit[]>(Object.keys(copy.panels).map((id) => [id, []]));
  for (const circuit of Object.values(copy.circuits)) groups.get(circuit.panelId)?.push(circuit);
  return groups;
}

/** Same rows, same objects: nothing to write. */
export function sameRows(a: readonly object[] | undefined, b: readonly object[]): boolean {
  return !!a && a.length === b.length && a.every((row, i) => row === b[i]);
}

// Every field a row has must have its type; a field may be missing: a change still queued is
// shown before the server fills in the rest, and a copy saved by an older version lacks fields
// added since (the next pull brings them). A missing id is damage.
const rowOf = <T extends z.ZodObject>(schema: T) => schema.partial().required({ id: true }).loose();
const rows = <T extends z.ZodObject>(schema: T) => z.record(z.string(), rowOf(schema));

const RECORD_SCHEMAS = {
  inspections: inspectionSchema,
  readings: readingSchema,
  deficiencies: deficiencySchema,
  entries: deficiencyEntrySchema,
  trips: tripEventSchema,
  photos: photoSchema,
  arcFlashLabels: arcFlashLabelSchema,
} as const;

const headSchema = z
  .object({
    building: rowOf(buildingSchema),
    panels: rows(panelSchema),
    conflicts: z.record(z.string(), conflictSchema),
    cursor: z.number().int().min(0),
    ...Object.fromEntries(RECORD_LISTS.map((list) => [list, rows(RECORD_SCHEMAS[list]).optional()])),
  })
  .loose();

const indexSchema = z.object({ buildingIds: z.array(z.string()), lastSyncAt: z.string().nullable() });
const panelCircuitsSchema = z.array(rowOf(circuitSchema));

export type Parsed<T> = { ok: true; value: T } | { ok: false; problem: string };

function parseWith<T>(schema: z.ZodType, raw: string | null, what: string): Parsed<T> {
  if (raw === null) return { ok: false, problem: `${what} is missing` };
  let json: unknown;
  try {
    json = JSON.parse(raw);
  } catch {
    return { ok: false, problem: `${what} is not readable (cut short or damaged)` };
  }
  const checked = schema.safeParse(json);
  if (!checked.success) {
    const issue = checked.error.issues[0];
    return { ok: false, problem: `${what} does not have the expected shape (${issue.path.join('.') || 'top'}: ${issue.message})` };
  }
  // the stored value itself, not zod's output: nothing is stripped or defaulted on the way in
  return { ok: true, value: json as T };
}

export const parseIndex = (raw: string | null) => parseWith<StoredIndex>(indexSchema, raw, 'the list of buildings');
export const parseHead = (raw: string | null) => parseWith<StoredHead>(headSchema, raw, 'a building');
/** A panel with no entry has no circuits (an empty panel is not written). */
export const parsePanelCircuits = (raw: string | null): Parsed<Circuit[]> =>
  raw === null ? { ok: true, value: [] } : parseWith<Circuit[]>(panelCircuitsSchema, raw, 'a panel schedule');

/** Put a building back together from its entry and the circuits loaded so far. */
export function joinCopy(head: StoredHead, circuits: Circuit[]): BuildingCopy {
  return { ...head, circuits: Object.fromEntries(circuits.map((c) => [c.id, c])) };
}

/** Add circuits of more panels to a copy (rows already in memory win: they may be newer). */
export function addCircuits(copy: BuildingCopy, circuits: Circuit[]): BuildingCopy {
  const loaded = Object.fromEntries(circuits.filter((c) => copy.panels[c.panelId]).map((c) => [c.id, c]));
  return { ...copy, circuits: { ...loaded, ...copy.circuits } };
}

/** The panel a URL opens (`/panels/<id>…`), so a reload on a schedule loads that schedule first. */
export function panelOfPath(path: string): string | null {
  return /^\/panels\/([^/?#]+)/.exec(path)?.[1] ?? null;
}

/** Which building holds a panel, among the loaded entries. */
export function buildingOfPanel(heads: Record<string, StoredHead>, panelId: string): string | null {
  return Object.entries(heads).find(([, head]) => head.panels[panelId])?.[0] ?? null;
}

export const isEmptyReplica = (r: Replica) => Object.keys(r.buildings).length === 0;
