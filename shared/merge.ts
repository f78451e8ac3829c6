/**
 * The merge rule of offline sync (SYNC.md "Last writer wins, per field"): pure functions, shared by
 * the server (which applies every write through them) and the client (which can predict the
 * outcome of its optimistic updates).
 *
 * Every synced row keeps `field_meta { field: { hlc, version, device } }`. An incoming write of a
 * field applies only when its hybrid logical clock stamp sorts after the stored one; stamps are
 * fixed-width text (shared/hlc.ts) whose last part is the device id, so plain string comparison
 * orders them by time, then counter, then device — ties between devices need no extra rule.
 */

/** What field_meta keeps per field: the winning write's stamp and the server version it got. */
export interface FieldStamp {
  /** HLC stamp of the write that set the field */
  hlc: string;
  /** building version the write was stored with */
  version: number;
  /** device that made the write ('server' for REST writes, 'seed' for the demo data) */
  device: string;
  /** user who made the write, kept so a conflict can name who lost or won */
  user?: string | null;
}

export type FieldMeta = Record<string, FieldStamp>;

/**
 * Fields that must change together are one group with one stamp: a breaker's starting position and
 * its pole count only make sense as a pair (a 2-pole at 5 is not a 1-pole at 5 plus a 2-pole
 * somewhere). A write to a group is decided once for the whole group and stamps every member.
 */
export const FIELD_GROUPS: readonly (readonly string[])[] = [
  ['position', 'poles'],
  // a panel's clamp readings are one set taken on one day: mixing two sets would show a neutral
  // that no one measured against phases of another day
  ['measuredA', 'measuredB', 'measuredC', 'measuredN', 'measuredOn'],
  // who verified a breaker at the panel and when
  ['verifiedOn', 'verifiedBy'],
];

/** A field write as it reaches the merge: one mutation's stamp, device and field values. */
export interface FieldWrite {
  hlc: string;
  device: string;
  fields: Record<string, unknown>;
  /**
   * Version the writer's copy of the row was at (0 for a create); absent for writes that cannot
   * be concurrent (REST calls, which read and write in one transaction).
   */
  baseVersion?: number;
}

/** apply: the write wins; lose: a later stamp is stored; same: this very stamp is stored (a replay). */
export type MergeOutcome = 'apply' | 'lose' | 'same';

/** The decision for one field, or one group of fields decided together. */
export interface UnitDecision {
  /** field names of the unit: one field, or every member of a group */
  fields: string[];
  outcome: MergeOutcome;
  /** the stamp the write was compared against (undefined for a field not stamped yet) */
  stored: FieldStamp | undefined;
  /** the stored write happened after the writer's base version, on another device */
  concurrent: boolean;
  /**
   * A value is being dropped that its writer did not see dropped: a concurrent write either way,
   * or a write that lost to another device's later stamp; and the two values differ.
   */
  conflict: boolean;
}

/** The group a field belongs to, or the field alone. */
export function unitOf(field: string, groups: readonly (readonly string[])[] = FIELD_GROUPS): string[] {
  const group = groups.find((g) => g.includes(field));
  return group ? [...group] : [field];
}

/**
 * Partition written field names into decision units, keeping first-seen order. A group is one unit
 * with every member listed, even members the write does not carry.
 */
export function unitsOf(fields: string[], groups: readonly (readonly string[])[] = FIELD_GROUPS): string[][] {
  const units: string[][] = [];
  const seen = new Set<string>();
  for (const field of fields) {
    if (seen.has(field)) continue;
    const unit = unitOf(field, groups);
    for (const f of unit) seen.add(f);
    units.push(unit);
  }
  return units;
}

/**
 * Fill the members of a touched group that a write left out with the row's current values, so a
 * group write always carries the whole group (REST callers may patch `position` alone). Clients
 * should send the whole group themselves: filling from the server's row is only right when the
 * writer had seen that row.
 */
export function completeGroups<F extends Record<string, unknown>>(
  fields: F,
  row: object,
  groups: readonly (readonly string[])[] = FIELD_GROUPS,
): F {
  const out: Record<string, unknown> = { ...fields };
  const stored = new Map(Object.entries(row));
  for (const group of groups) {
    if (!group.some((f) => f in fields)) continue;
    for (const f of group) if (!(f in out) && stored.has(f)) out[f] = stored.get(f);
  }
  return out as F;
}

/** The latest stamp stored for any member of a unit (members of a group share one normally). */
export function storedStamp(meta: FieldMeta, unit: readonly string[]): FieldStamp | undefined {
  let best: FieldStamp | undefined;
  for (const f of unit) {
    const s = meta[f];
    if (s && (!best || s.hlc > best.hlc)) best = s;
  }
  return best;
}

/** A write is concurrent with a stored field when the writer had not seen it and it came from elsewhere. */
export function isConcurrent(
  stored: FieldStamp | undefined,
  write: Pick<FieldWrite, 'device' | 'baseVersion'>,
): boolean {
  return (
    write.baseVersion !== undefined &&
    stored !== undefined &&
    stored.version > write.baseVersion &&
    stored.device !== write.device
  );
}

/** Value equality for field values (JSON data: numbers, strings, booleans, null, plain objects). */
export function sameValue(a: unknown, b: unknown): boolean {
  if (a === b) return true;
  if (a === null || b === null || typeof a !== 'object' || typeof b !== 'object') return false;
  return JSON.stringify(a) === JSON.stringify(b);
}

/**
 * Decide, per field (groups together), whether an incoming write applies to a row.
 * `row` gives the current values, used only to tell a real conflict from two equal values.
 */
export function decideWrite(
  meta: FieldMeta,
  write: FieldWrite,
  row: object = {},
  groups: readonly (readonly string[])[] = FIELD_GROUPS,
): UnitDecision[] {
  const written = Object.keys(write.fields).filter((f) => write.fields[f] !== undefined);
  return unitsOf(written, groups).map((fields) => {
    const stored = storedStamp(meta, fields);
    // stamps compare as plain text: time, then counter, then device id (shared/hlc.ts)
    const outcome: MergeOutcome =
      !stored || write.hlc > stored.hlc ? 'apply' : write.hlc === stored.hlc ? 'same' : 'lose';
    const concurrent = isConcurrent(stored, write);
    const differs = fields.some((f) => f in write.fields && !sameValue(write.fields[f], Reflect.get(row, f)));
    const droppedUnseen =
      (outcome === 'apply' && concurrent) ||
      (outcome === 'lose' && stored !== undefined && stored.device !== write.device);
    return { fields, outcome, stored, concurrent, conflict: droppedUnseen && differs };
  });
}

/** What a write does to a row's stamps: the decisions, the new field_meta and the fields that won. */
export interface StampResult {
  meta: FieldMeta;
  decisions: UnitDecision[];
  /** fields whose value or stamp changed */
  applied: string[];
}

/** The result of merging one write into a row. */
export interface MergeResult<R> extends StampResult {
  row: R;
}

/**
 * The stamps half of mergeWrite, without copying the row (the server merges thousands of rows a
 * push and writes the winning values itself): a new field_meta, inputs unchanged. `row` gives the
 * current values, used only to tell a real conflict from two equal values.
 */
export function mergeStamps(
  row: object,
  meta: FieldMeta,
  write: FieldWrite,
  stamp: { version: number; user?: string | null },
  groups: readonly (readonly string[])[] = FIELD_GROUPS,
): StampResult {
  const nextMeta: FieldMeta = { ...meta };
  const decisions = decideWrite(meta, write, row, groups);
  const applied: string[] = [];
  for (const d of decisions) {
    if (d.outcome !== 'apply') continue;
    for (const f of d.fields) {
      const entry: FieldStamp = { hlc: write.hlc, version: stamp.version, device: write.device };
      if (stamp.user !== undefined) entry.user = stamp.user;
      nextMeta[f] = entry;
      applied.push(f);
    }
  }
  return { meta: nextMeta, decisions, applied };
}

/**
 * Merge one write into a row and its field_meta, returning new objects (inputs are not changed).
 * `stamp` is what the server adds to the stored meta: the version the write is stored with and who
 * made it. Applying the same set of writes in any order, any number of times, gives the same row
 * and meta as long as each group write carries its whole group (completeGroups).
 */
export function mergeWrite<R extends Record<string, unknown>>(
  row: R,
  meta: FieldMeta,
  write: FieldWrite,
  stamp: { version: number; user?: string | null },
  groups: readonly (readonly string[])[] = FIELD_GROUPS,
): MergeResult<R> {
  const result = mergeStamps(row, meta, write, stamp, groups);
  const nextRow: Record<string, unknown> = { ...row };
  for (const f of result.applied) {
    if (f in write.fields && write.fields[f] !== undefined) nextRow[f] = write.fields[f];
  }
  return { ...result, row: nextRow as R };
}
