import { In, IsNull, type EntityManager, type EntityTarget, type FindOptionsWhere } from 'typeorm';
import { uuidv7 } from 'uuidv7';
import { occupiedPositions, panelLayout } from '../../shared/calc';
import { SYSTEM_INFO, type Role } from '../../shared/domain';
import {
  completeGroups,
  decideWrite,
  isConcurrent,
  mergeWrite,
  type FieldStamp,
  type MergeResult,
  type UnitDecision,
} from '../../shared/merge';
import {
  circuitRuleErrors,
  type BuildingCreateBody,
  type BuildingPatchBody,
  type CircuitCreateBody,
  type CircuitPatchBody,
  type PanelCreateBody,
  type PanelPatchBody,
} from '../../shared/schemas';
import type { Resolution } from '../../shared/sync';
import { requireAdmin, requireScheduleEditor, roleForBuilding, type Actor } from '../auth/access';
import { Building, Circuit, ConflictLog, CurveBand, Panel } from '../entities';
import type { SyncColumns } from '../entities/sync-columns';
import { AppError, NotFoundError, ValidationError } from '../http/errors';
import { selectRows, updateChanged, updateRows } from './bulk';
import { buildingDto, circuitDto, panelDto } from './serialise';

/**
 * The register's one service layer. REST routes call it with a fresh server stamp per request;
 * the sync push calls the same functions inside its own transaction (one savepoint per mutation,
 * or one batch for a run of circuit patches), so both paths obey the same rules. Every field write
 * goes through the per-field last-writer-wins merge of shared/merge.ts: a REST write carries a new
 * server stamp, which sorts after every stamp the server has accepted, so it wins as a plain
 * update would.
 */

/** What a sync mutation adds to a write. REST writes have none: they cannot be concurrent. */
export interface SyncWrite {
  mutationId: string;
  /** version the device's copy was at (shared/sync.ts mutationSchema) */
  baseVersion: number;
  /** the building the mutation names; an entity elsewhere answers not found */
  buildingId: string;
}

/** Conflicts a write logged (ids of conflict_log rows). */
export interface WriteReport {
  conflictIds: string[];
}

export interface WriteContext {
  em: EntityManager;
  actor: Actor;
  /** HLC stamp of this write */
  hlc: string;
  /** device that made the write ('server' for REST calls) */
  device: string;
  /** the building versions this write stamps rows with; shared by all mutations of one push */
  versions: VersionBook;
  report: WriteReport;
  sync?: SyncWrite;
}

/** A write context; give it the push's VersionBook so a push bumps each building once. */
export function writeContext(
  em: EntityManager,
  actor: Actor,
  hlc: string,
  device: string,
  options: { versions?: VersionBook; sync?: SyncWrite } = {},
): WriteContext {
  return {
    em,
    actor,
    hlc,
    device,
    versions: options.versions ?? new VersionBook(em),
    report: { conflictIds: [] },
    sync: options.sync,
  };
}

// ---------- building versions ----------

/**
 * The version each touched building gets in one REST call or one push: bumped once, on first
 * use, with `UPDATE building SET version = version + 1 … RETURNING`. The row lock this takes
 * lasts until commit and orders concurrent writers of one building, so a pull (which reads the
 * building's version and its rows from one snapshot) can never pass a row that commits later with
 * a lower version.
 */
export class VersionBook {
  private versions = new Map<string, number>();
  private readonly homes = new Map<string, { id: string; organisationId: string }>();

  constructor(private readonly em: EntityManager) {}

  /** True when this book already holds the building's lock, so rows read since are current. */
  holds(buildingId: string): boolean {
    return this.versions.has(buildingId);
  }

  /** The version rows of the building are stamped with; the first call bumps it and locks the row. */
  async of(buildingId: string): Promise<number> {
    const known = this.versions.get(buildingId);
    if (known !== undefined) return known;
    // TypeORM answers an UPDATE … RETURNING on PostgreSQL as [rows, affectedCount]
    const [rows]: [{ version: string }[], number] = await this.em.query(
      'UPDATE building SET version = version + 1 WHERE id = $1 RETURNING version',
      [buildingId],
    );
    if (rows.length === 0) throw new NotFoundError('Building');
    const version = Number(rows[0].version);
    this.versions.set(buildingId, version);
    return version;
  }

  /** The version already assigned to the building, if any. */
  peek(buildingId: string): number | undefined {
    return this.versions.get(buildingId);
  }

  /** A building inserted by this write starts at version 1; nobody else can see it before commit. */
  created(buildingId: string): number {
    this.versions.set(buildingId, 1);
    return 1;
  }

  /**
   * Lock buildings in id order, then bump each once. A push calls this before applying anything,
   * so two pushes over the same buildings queue up instead of deadlocking, and no bump happens
   * inside a savepoint that a rejected mutation rolls back.
   */
  async lockAll(buildingIds: readonly string[], organisationIds: readonly string[]): Promise<void> {
    const todo = [...new Set(buildingIds)].filter((id) => !this.versions.has(id));
    if (todo.length === 0 || organisationIds.length === 0) return;
    // one statement: the subquery takes the row locks in id order, the update bumps what it locked;
    // only buildings of the given organisations, so nobody can hold another's buildings
    const [rows]: [{ id: string; organisation_id: string; version: string }[], number] = await this.em.query(
      `UPDATE building SET version = version + 1
        WHERE id IN (SELECT id FROM building WHERE id = ANY($1::uuid[]) AND organisation_id = ANY($2::uuid[])
                      ORDER BY id FOR UPDATE)
        RETURNING id, organisation_id, version`,
      [todo, organisationIds],
    );
    for (const row of rows) {
      this.versions.set(row.id, Number(row.version));
      this.homes.set(row.id, { id: row.id, organisationId: row.organisation_id });
    }
  }

  /** Organisation of a building this book locked with lockAll (it never changes). */
  home(buildingId: string): { id: string; organisationId: string } | undefined {
    return this.homes.get(buildingId);
  }

  /** Bumped versions so far, by building. */
  entries(): Map<string, number> {
    return new Map(this.versions);
  }

  /** Forget versions learned inside a savepoint that was rolled back. */
  restore(saved: Map<string, number>): void {
    this.versions = new Map(saved);
  }
}

// ---------- conflicts ----------

type ConflictEntity = ConflictLog['entity'];
export interface Target {
  entity: ConflictEntity;
  buildingId: string;
}
interface Side {
  value: Record<string, unknown>;
  hlc: string;
  user: string | null;
  device: string;
}
export interface ConflictDraft extends Target {
  /** assigned when the conflict is reported to its write (reportConflicts) */
  id?: string;
  w: WriteContext;
  entityId: string;
  field: string;
  kind: ConflictLog['kind'];
  winner: Side;
  loser: Side;
}

/** Field values as JSON (dates as ISO text), only the named fields. */
export function jsonValues(source: Record<string, unknown>, fields: readonly string[]): Record<string, unknown> {
  const out: Record<string, unknown> = {};
  for (const f of fields) {
    if (!(f in source)) continue;
    const v = source[f];
    out[f] = v instanceof Date ? v.toISOString() : v;
  }
  return out;
}

/** Give each conflict its id and tell its write, before anything is stored (a push records results first). */
export function reportConflicts(drafts: readonly ConflictDraft[]): void {
  for (const d of drafts) {
    if (d.id) continue;
    d.id = uuidv7();
    d.w.report.conflictIds.push(d.id);
  }
}

/** Write conflict_log rows (one statement), reporting any not reported yet. */
export async function insertConflicts(em: EntityManager, drafts: readonly ConflictDraft[]): Promise<void> {
  if (drafts.length === 0) return;
  reportConflicts(drafts);
  const rows: ConflictLog[] = [];
  for (const d of drafts) {
    const version = await d.w.versions.of(d.buildingId);
    rows.push(
      em.create(ConflictLog, {
        id: d.id,
        buildingId: d.buildingId,
        entity: d.entity,
        entityId: d.entityId,
        field: d.field,
        winnerValue: d.winner.value,
        loserValue: d.loser.value,
        winnerHlc: d.winner.hlc,
        loserHlc: d.loser.hlc,
        winnerUser: d.winner.user,
        loserUser: d.loser.user,
        loserDevice: d.loser.device,
        mutationId: d.w.sync?.mutationId ?? null,
        kind: d.kind,
        resolution: null,
        updatedAt: d.w.hlc,
        updatedBy: d.w.actor.userId,
        deletedAt: null,
        version: String(version),
        fieldMeta: {},
      }),
    );
  }
  // jsonb columns defeat TypeORM's deep-partial typing of insert; the rows are whole entities
  await em.insert(ConflictLog, rows as never);
}

/** One field (or group) where a concurrent write lost, whichever side it was. */
function concurrentDraft(
  d: UnitDecision,
  before: Record<string, unknown>,
  fields: Record<string, unknown>,
  w: WriteContext,
  target: Target,
  entityId: string,
): ConflictDraft {
  const stored = d.stored as FieldStamp;
  const storedSide: Side = {
    value: jsonValues(before, d.fields),
    hlc: stored.hlc,
    user: stored.user ?? null,
    device: stored.device,
  };
  const incoming: Side = { value: jsonValues(fields, d.fields), hlc: w.hlc, user: w.actor.userId, device: w.device };
  const [winner, loser] = d.outcome === 'apply' ? [incoming, storedSide] : [storedSide, incoming];
  return { ...target, w, entityId, field: d.fields.join('+'), kind: 'concurrent', winner, loser };
}

/** An edit that reached a tombstoned row: kept only in the log, the tombstone stands. */
export function editedAfterDelete(
  row: SyncColumns,
  fields: Record<string, unknown>,
  w: WriteContext,
  target: Target,
): ConflictDraft {
  const deletion = row.fieldMeta?.deletedAt;
  return {
    ...target,
    w,
    entityId: row.id,
    field: Object.keys(fields).join(','),
    kind: 'edited_after_delete',
    winner: {
      value: { deletedAt: row.deletedAt?.toISOString() ?? null },
      hlc: deletion?.hlc ?? row.updatedAt,
      user: deletion?.user ?? row.updatedBy,
      device: deletion?.device ?? 'server',
    },
    loser: { value: jsonValues(fields, Object.keys(fields)), hlc: w.hlc, user: w.actor.userId, device: w.device },
  };
}

/**
 * Edits of a row the deleting device had not seen (stored after its base version, by another
 * device): the tombstone hides them, so they go to the log like an edit that came after the delete.
 */
function editsLostToDelete(row: SyncColumns, w: WriteContext, target: Target, deletedAt: Date): ConflictDraft | null {
  if (!w.sync) return null;
  const write = { device: w.device, baseVersion: w.sync.baseVersion };
  const unseen = Object.entries(row.fieldMeta ?? {}).filter(
    ([field, stamp]) => field !== 'deletedAt' && isConcurrent(stamp, write),
  );
  if (unseen.length === 0) return null;
  const latest = unseen.reduce((a, b) => (b[1].hlc > a[1].hlc ? b : a))[1];
  const fields = unseen.map(([field]) => field);
  return {
    ...target,
    w,
    entityId: row.id,
    field: fields.join(','),
    kind: 'edited_after_delete',
    winner: { value: { deletedAt: deletedAt.toISOString() }, hlc: w.hlc, user: w.actor.userId, device: w.device },
    loser: {
      value: jsonValues(row as unknown as Record<string, unknown>, fields),
      hlc: latest.hlc,
      user: latest.user ?? null,
      device: latest.device,
    },
  };
}

// ---------- the merge of a write into a row ----------

interface MergePlan<T> {
  fields: Record<string, unknown>;
  result: MergeResult<Record<string, unknown>>;
  /** the row as it would be stored, for validation before anything changes */
  candidate: T;
  applied: string[];
}

/** Decide a write against a row without changing it (validate `candidate`, then commitMerge). */
export function planMerge<T extends SyncColumns>(
  row: T,
  fields: Record<string, unknown>,
  w: WriteContext,
  version: number,
): MergePlan<T> {
  const values = row as unknown as Record<string, unknown>;
  const result = mergeWrite(
    values,
    row.fieldMeta ?? {},
    { hlc: w.hlc, device: w.device, fields, baseVersion: w.sync?.baseVersion },
    { version, user: w.actor.userId },
  );
  const candidate = { ...row } as T;
  for (const f of result.applied) if (f in fields) (candidate as Record<string, unknown>)[f] = fields[f];
  return { fields, result, candidate, applied: result.applied };
}

/**
 * Apply a planned merge: winning fields and their stamps, the row's version (always, so the next
 * pull re-sends the truth to a device whose optimistic value lost), and the conflicts to log.
 */
export function commitMerge<T extends SyncColumns>(
  row: T,
  plan: MergePlan<T>,
  w: WriteContext,
  version: number,
  target: Target | null,
): ConflictDraft[] {
  const values = row as unknown as Record<string, unknown>;
  const before = { ...values };
  for (const f of plan.applied) if (f in plan.fields) values[f] = plan.fields[f];
  row.fieldMeta = plan.result.meta;
  row.version = String(version);
  if (plan.applied.length > 0) {
    if (!row.updatedAt || w.hlc > row.updatedAt) row.updatedAt = w.hlc;
    row.updatedBy = w.actor.userId;
  }
  if (!target) return [];
  return plan.result.decisions
    .filter((d) => d.conflict)
    .map((d) => concurrentDraft(d, before, plan.fields, w, target, row.id));
}

/** Fields of a new row: everything applies; the stamps go to field_meta. */
function stampNew<T extends SyncColumns>(row: T, fields: Record<string, unknown>, w: WriteContext, version: number): T {
  commitMerge(row, planMerge(row, fields, w, version), w, version, null);
  return row;
}

// ---------- visibility ----------

const live = { deletedAt: IsNull() };
const EDITORS: readonly Role[] = ['admin', 'electrician'];

async function visibleBuilding(em: EntityManager, actor: Actor, id: string) {
  const building = await em.findOne(Building, { where: { id, ...live } });
  const role = building && roleForBuilding(actor, building);
  if (!building || !role) throw new NotFoundError('Building');
  return { building, role };
}

async function visiblePanel(em: EntityManager, actor: Actor, id: string) {
  const panel = await em.findOne(Panel, { where: { id, ...live } });
  if (!panel) throw new NotFoundError('Panel');
  try {
    return { panel, ...(await visibleBuilding(em, actor, panel.buildingId)) };
  } catch {
    throw new NotFoundError('Panel');
  }
}

/**
 * A building for a write, tombstoned or not (a sync edit of a deleted row is a conflict, not an
 * error). Not visible, or not the building the mutation names: not found.
 */
export async function writableBuilding(w: WriteContext, id: string, what: string) {
  const building = await w.em.findOne(Building, { where: { id } });
  const role = building && roleForBuilding(w.actor, building);
  if (!building || !role || (w.sync && w.sync.buildingId !== building.id)) throw new NotFoundError(what);
  return { building, role };
}

/**
 * Take the building's lock (bumping its version) and return a row read under it: rows read before
 * the lock may have changed meanwhile, rows read after cannot, since every writer takes it first.
 */
export async function lockAndReload<T extends SyncColumns>(
  w: WriteContext,
  buildingId: string,
  row: T,
  reload: () => Promise<T>,
): Promise<{ version: number; row: T }> {
  const fresh = w.versions.holds(buildingId);
  const version = await w.versions.of(buildingId);
  return { version, row: fresh ? row : await reload() };
}

function parentDeleted(what: string): AppError {
  return new AppError(409, 'parent_deleted', `The ${what} was deleted; restore it first`);
}

// ---------- reads ----------

export async function listBuildings(em: EntityManager, actor: Actor) {
  const orgIds = [...actor.roles.keys()];
  if (orgIds.length === 0) return { buildings: [] };
  const rows = await em.find(Building, {
    where: { organisationId: In(orgIds), ...live },
    order: { name: 'ASC' },
  });
  const visible = rows
    .map((b) => ({ b, role: roleForBuilding(actor, b) }))
    .filter((x): x is { b: Building; role: Role } => x.role !== null);
  const counts = await panelCounts(em, visible.map((x) => x.b.id));
  return { buildings: visible.map(({ b, role }) => buildingDto(b, role, counts.get(b.id) ?? 0)) };
}

/** Live panels per building. */
export async function panelCounts(em: EntityManager, buildingIds: string[]) {
  if (buildingIds.length === 0) return new Map<string, number>();
  const rows: { building_id: string; n: string }[] = await em.query(
    `SELECT building_id, count(*) AS n FROM panel
      WHERE building_id = ANY($1) AND deleted_at IS NULL GROUP BY building_id`,
    [buildingIds],
  );
  return new Map(rows.map((r) => [r.building_id, Number(r.n)]));
}

export async function getBuilding(em: EntityManager, actor: Actor, id: string) {
  const { building, role } = await visibleBuilding(em, actor, id);
  const panels = await em.find(Panel, { where: { buildingId: id, ...live }, order: { tag: 'ASC' } });
  return { building: buildingDto(building, role, panels.length), panels: panels.map(panelDto) };
}

// ---------- shared write steps ----------

export async function refuseDuplicateId(em: EntityManager, entity: EntityTarget<SyncColumns>, id: string) {
  if (await em.exists(entity, { where: { id } })) {
    throw new AppError(409, 'exists', 'A row with this id already exists');
  }
}

/**
 * Tombstone one row (deletedAt is a field under last-writer-wins like any other, so a later
 * restore beats an older delete), logging the edits the deleting device had not seen.
 * Returns whether the row is now deleted by this write.
 */
export function tombstone<T extends SyncColumns>(
  row: T,
  w: WriteContext,
  version: number,
  target: Target,
  drafts: ConflictDraft[],
): boolean {
  const deletedAt = new Date();
  const lost = editsLostToDelete(row, w, target, deletedAt);
  const plan = planMerge(row, { deletedAt }, w, version);
  drafts.push(...commitMerge(row, plan, w, version, target));
  const deleted = plan.applied.includes('deletedAt');
  if (deleted && lost) drafts.push(lost);
  return deleted;
}

/** Tombstone the live children of a deleted row with the parent's stamp, so a restore finds them. */
async function cascadeTombstone<T extends Circuit | Panel>(
  w: WriteContext,
  entity: typeof Circuit | typeof Panel,
  where: FindOptionsWhere<T>,
  version: number,
  target: Target,
  drafts: ConflictDraft[],
): Promise<void> {
  const children = (await w.em.find(entity, { where: { ...where, ...live } as never })) as T[];
  const stamp: FieldStamp = { hlc: w.hlc, version, device: w.device, user: w.actor.userId };
  const deletedAt = new Date();
  for (const child of children) {
    const lost = editsLostToDelete(child, w, target, deletedAt);
    if (lost) drafts.push(lost);
    child.deletedAt = deletedAt;
    child.fieldMeta = { ...child.fieldMeta, deletedAt: stamp };
    child.version = String(version);
    if (w.hlc > child.updatedAt) child.updatedAt = w.hlc;
    child.updatedBy = w.actor.userId;
  }
  await updateRows<SyncColumns>(w.em, entity, children);
}

/** Bring back the children a parent's delete tombstoned (same deletion stamp), nothing else. */
async function cascadeRestore(
  w: WriteContext,
  table: 'panel' | 'circuit',
  parentColumn: 'building_id' | 'panel_id',
  parentId: string,
  deletionHlc: string | undefined,
  version: number,
): Promise<void> {
  if (!deletionHlc) return;
  const stamp: FieldStamp = { hlc: w.hlc, version, device: w.device, user: w.actor.userId };
  // table and column names are fixed by the callers above, never from input
  await w.em.query(
    `UPDATE ${table}
        SET deleted_at = NULL, version = $2, updated_by = $4,
            updated_at = GREATEST(updated_at COLLATE "C", $3::text),
            field_meta = field_meta || jsonb_build_object('deletedAt', $5::jsonb)
      WHERE ${parentColumn} = $1 AND deleted_at IS NOT NULL AND field_meta -> 'deletedAt' ->> 'hlc' = $6`,
    [parentId, version, w.hlc, w.actor.userId, JSON.stringify(stamp), deletionHlc],
  );
}

/** Restore one row under last-writer-wins; returns the deletion stamp it undid, if it did. */
export function untombstone<T extends SyncColumns>(
  row: T,
  w: WriteContext,
  version: number,
  target: Target,
  drafts: ConflictDraft[],
): { restored: boolean; undone?: string } {
  if (!row.deletedAt) return { restored: false };
  const undone = row.fieldMeta?.deletedAt?.hlc;
  const plan = planMerge(row, { deletedAt: null }, w, version);
  drafts.push(...commitMerge(row, plan, w, version, target));
  return { restored: plan.applied.includes('deletedAt'), undone };
}

// ---------- buildings ----------

function organisationFor(actor: Actor, requested: string | undefined): string {
  const editable = [...actor.roles].filter(([, role]) => role === 'admin' || role === 'electrician');
  if (requested) {
    // another organisation is not disclosed, as everywhere: 404 (tests/api/security-matrix.test.ts)
    if (!actor.roles.has(requested)) throw new NotFoundError('Organisation');
    return requested;
  }
  if (editable.length === 1) return editable[0][0];
  if (editable.length === 0) {
    const role = [...actor.roles.values()][0] ?? 'owner';
    requireScheduleEditor(role);
  }
  throw new ValidationError({ organisationId: 'choose the organisation the building belongs to' });
}

export async function createBuilding(w: WriteContext, body: BuildingCreateBody) {
  const organisationId = organisationFor(w.actor, body.organisationId);
  const role = w.actor.roles.get(organisationId)!;
  requireScheduleEditor(role);
  const id = body.id ?? uuidv7();
  if (w.sync && w.sync.buildingId !== id) throw new ValidationError({ buildingId: 'must be the new building id' });
  await refuseDuplicateId(w.em, Building, id);
  const version = w.versions.created(id);
  const building = w.em.create(Building, { id, organisationId, version: String(version), fieldMeta: {} });
  stampNew(building, { name: body.name, address: body.address, notes: body.notes }, w, version);
  await w.em.insert(Building, building);
  return { building: buildingDto(building, role, 0) };
}

export async function patchBuilding(w: WriteContext, id: string, patch: BuildingPatchBody) {
  const found = await writableBuilding(w, id, 'Building');
  if (found.building.deletedAt && !w.sync) throw new NotFoundError('Building');
  requireScheduleEditor(found.role);
  const { version, row: building } = await lockAndReload(w, id, found.building, () =>
    w.em.findOneByOrFail(Building, { id }),
  );
  const target: Target = { entity: 'building', buildingId: id };
  const drafts: ConflictDraft[] = [];
  if (building.deletedAt) {
    drafts.push(editedAfterDelete(building, patch, w, target));
  } else {
    // version is the building's counter: the bump already set it, the merge must not undo it
    drafts.push(...commitMerge(building, planMerge(building, patch, w, version), w, version, target));
    await updateRows(w.em, Building, [building]);
  }
  await insertConflicts(w.em, drafts);
  return { building: buildingDto(building, found.role, (await panelCounts(w.em, [id])).get(id) ?? 0) };
}

/** Tombstones the building with every panel and circuit in it. */
export async function deleteBuilding(w: WriteContext, id: string) {
  const found = await writableBuilding(w, id, 'Building');
  if (found.building.deletedAt && !w.sync) throw new NotFoundError('Building');
  requireAdmin(found.role, 'delete a building');
  const { version, row: building } = await lockAndReload(w, id, found.building, () =>
    w.em.findOneByOrFail(Building, { id }),
  );
  if (building.deletedAt) return { ok: true, version };
  const target: Target = { entity: 'building', buildingId: id };
  const drafts: ConflictDraft[] = [];
  if (tombstone(building, w, version, target, drafts)) {
    await cascadeTombstone(w, Circuit, { buildingId: id }, version, { entity: 'circuit', buildingId: id }, drafts);
    await cascadeTombstone(w, Panel, { buildingId: id }, version, { entity: 'panel', buildingId: id }, drafts);
  }
  await updateRows(w.em, Building, [building]);
  await insertConflicts(w.em, drafts);
  return { ok: true, version };
}

/** Brings a tombstoned building back with the panels and circuits its delete took with it. */
export async function restoreBuilding(w: WriteContext, id: string) {
  const found = await writableBuilding(w, id, 'Building');
  requireAdmin(found.role, 'restore a building');
  const { version, row: building } = await lockAndReload(w, id, found.building, () =>
    w.em.findOneByOrFail(Building, { id }),
  );
  const drafts: ConflictDraft[] = [];
  const { restored, undone } = untombstone(building, w, version, { entity: 'building', buildingId: id }, drafts);
  if (restored) {
    await updateRows(w.em, Building, [building]);
    await cascadeRestore(w, 'panel', 'building_id', id, undone, version);
    await cascadeRestore(w, 'circuit', 'building_id', id, undone, version);
  }
  await insertConflicts(w.em, drafts);
  return { ok: true, version };
}

// ---------- panels ----------

async function writablePanel(w: WriteContext, id: string) {
  const panel = await w.em.findOne(Panel, { where: { id } });
  if (!panel) throw new NotFoundError('Panel');
  const { building, role } = await writableBuilding(w, panel.buildingId, 'Panel');
  if (!w.sync && (panel.deletedAt || building.deletedAt)) throw new NotFoundError('Panel');
  return { panel, building, role };
}

async function checkPanelLinks(
  em: EntityManager,
  buildingId: string,
  panelId: string,
  fedFromPanelId: string | null | undefined,
) {
  if (!fedFromPanelId) return;
  if (fedFromPanelId === panelId) throw new ValidationError({ fedFromPanelId: 'a panel cannot feed itself' });
  const parent = await em.findOne(Panel, { where: { id: fedFromPanelId, buildingId, ...live } });
  if (!parent) throw new ValidationError({ fedFromPanelId: 'no such panel in this building' });
}

export async function createPanel(w: WriteContext, buildingId: string, body: PanelCreateBody) {
  const { building, role } = w.sync
    ? await writableBuilding(w, buildingId, 'Building')
    : await visibleBuilding(w.em, w.actor, buildingId);
  requireScheduleEditor(role);
  if (building.deletedAt) throw parentDeleted('building');
  const version = await w.versions.of(buildingId);
  const id = body.id ?? uuidv7();
  await refuseDuplicateId(w.em, Panel, id);
  await checkPanelLinks(w.em, buildingId, id, body.fedFromPanelId);
  const { id: _id, ...fields } = body;
  const panel = w.em.create(Panel, { id, buildingId, fieldMeta: {} });
  stampNew(panel, fields, w, version);
  await w.em.insert(Panel, panel);
  return { panel: panelDto(panel) };
}

export async function patchPanel(w: WriteContext, id: string, patch: PanelPatchBody) {
  const found = await writablePanel(w, id);
  requireScheduleEditor(found.role);
  const { version, row: panel } = await lockAndReload(w, found.building.id, found.panel, () =>
    w.em.findOneByOrFail(Panel, { id }),
  );
  const target: Target = { entity: 'panel', buildingId: panel.buildingId };
  const drafts: ConflictDraft[] = [];
  if (panel.deletedAt) {
    drafts.push(editedAfterDelete(panel, patch, w, target));
  } else {
    const plan = planMerge(panel, patch, w, version);
    const changed = new Set(plan.applied);
    const next = plan.candidate;
    if (changed.has('fedFromPanelId')) await checkPanelLinks(w.em, panel.buildingId, id, next.fedFromPanelId);
    if (changed.has('spaces') || changed.has('system')) {
      const circuits = await w.em.find(Circuit, { where: { panelId: id, ...live } });
      const { problems } = panelLayout({ system: next.system, spaces: next.spaces }, circuits);
      if (problems.length > 0) {
        const field = changed.has('spaces') ? 'spaces' : 'system';
        throw new ValidationError({ [field]: `existing circuits would not fit: ${problems[0].message}` });
      }
    }
    drafts.push(...commitMerge(panel, plan, w, version, target));
    await updateRows(w.em, Panel, [panel]);
  }
  await insertConflicts(w.em, drafts);
  return { panel: panelDto(panel) };
}

/** Tombstones the panel and its circuits. */
export async function deletePanel(w: WriteContext, id: string) {
  const found = await writablePanel(w, id);
  requireScheduleEditor(found.role);
  const { version, row: panel } = await lockAndReload(w, found.building.id, found.panel, () =>
    w.em.findOneByOrFail(Panel, { id }),
  );
  if (panel.deletedAt) return { ok: true, version };
  const buildingId = panel.buildingId;
  const drafts: ConflictDraft[] = [];
  if (tombstone(panel, w, version, { entity: 'panel', buildingId }, drafts)) {
    await cascadeTombstone(w, Circuit, { panelId: id }, version, { entity: 'circuit', buildingId }, drafts);
  }
  await updateRows(w.em, Panel, [panel]);
  await insertConflicts(w.em, drafts);
  return { ok: true, version };
}

/** Brings a tombstoned panel back with the circuits its delete took with it. */
export async function restorePanel(w: WriteContext, id: string) {
  const found = await writablePanel(w, id);
  requireScheduleEditor(found.role);
  if (found.building.deletedAt) throw parentDeleted('building');
  const { version, row: panel } = await lockAndReload(w, found.building.id, found.panel, () =>
    w.em.findOneByOrFail(Panel, { id }),
  );
  const drafts: ConflictDraft[] = [];
  const { restored, undone } = untombstone(panel, w, version, { entity: 'panel', buildingId: panel.buildingId }, drafts);
  if (restored) {
    await updateRows(w.em, Panel, [panel]);
    await cascadeRestore(w, 'circuit', 'panel_id', id, undone, version);
  }
  await insertConflicts(w.em, drafts);
  return { ok: true, version };
}

// ---------- circuits ----------

type CircuitShape = Pick<Circuit, 'id' | 'position' | 'poles' | 'status' | 'ratingA' | 'feedsPanelId'>;

/**
 * What is wrong with a circuit as it would be stored, checking only rules the changed fields can
 * break. `siblings` are the panel's live circuits (needed when position or poles change);
 * `fedPanel` the panel named by feedsPanelId (needed when it changes).
 */
function circuitProblems(
  panel: Panel | null,
  candidate: CircuitShape,
  changed: ReadonlySet<string>,
  siblings: readonly Circuit[],
  fedPanel: Panel | null | undefined,
): Record<string, string> {
  const fields: Record<string, string> = {};
  if (changed.has('status') || changed.has('ratingA')) Object.assign(fields, circuitRuleErrors(candidate));
  const layout = changed.has('position') || changed.has('poles') || changed.has('feedsPanelId');
  if (layout && !panel) throw new Error('circuitProblems: the panel is needed to check position, poles or feed');
  if (!panel) return fields;
  if (changed.has('position') || changed.has('poles')) {
    if (candidate.poles === 3 && SYSTEM_INFO[panel.system].phases === 1) {
      fields.poles = 'a 3-pole breaker needs a three-phase panel';
    }
    const layout = panelLayout({ system: panel.system, spaces: panel.spaces }, [candidate]);
    for (const problem of layout.problems) {
      const field = problem.code === 'bad-poles' || problem.code === 'same-phase' ? 'poles' : 'position';
      fields[field] ??= problem.message;
    }
    const taken = new Map<number, Circuit>();
    for (const other of siblings) {
      if (other.id === candidate.id || other.deletedAt) continue;
      for (const position of occupiedPositions(other.position, other.poles)) taken.set(position, other);
    }
    const clash = occupiedPositions(candidate.position, candidate.poles).find((p) => taken.has(p));
    if (clash !== undefined) {
      const other = taken.get(clash)!;
      fields.position ??= `position ${clash} is taken by the breaker at ${other.position}${
        other.description ? ` (${other.description})` : ''
      }`;
    }
  }
  if (changed.has('feedsPanelId') && candidate.feedsPanelId) {
    const ok = fedPanel && !fedPanel.deletedAt && fedPanel.buildingId === panel.buildingId && fedPanel.id !== panel.id;
    if (!ok) fields.feedsPanelId = 'no such other panel in this building';
  }
  return fields;
}

const ALL_CIRCUIT_FIELDS = new Set(['position', 'poles', 'status', 'ratingA', 'feedsPanelId']);

/**
 * A circuit's time-current band is a live band of its own building's organisation: another
 * organisation's band would judge its trip tests and print in its report.
 */
function bandProblem(bandId: string | null, band: CurveBand | null | undefined, organisationId: string): Record<string, string> {
  if (!bandId) return {};
  const ok = band && !band.deletedAt && band.organisationId === organisationId;
  return ok ? {} : { bandId: 'no such band in your library' };
}

async function bandsById(em: EntityManager, ids: (string | null | undefined)[]): Promise<Map<string, CurveBand>> {
  const wanted = [...new Set(ids.filter((id): id is string => !!id))];
  const bands = wanted.length ? await em.find(CurveBand, { where: { id: In(wanted) } }) : [];
  return new Map(bands.map((b) => [b.id, b]));
}

async function writableCircuit(w: WriteContext, id: string) {
  const circuit = await w.em.findOne(Circuit, { where: { id } });
  if (!circuit) throw new NotFoundError('Circuit');
  const { building, role } = await writableBuilding(w, circuit.buildingId, 'Circuit');
  if (!w.sync && circuit.deletedAt) throw new NotFoundError('Circuit');
  return { circuit, building, role };
}

async function feedTarget(em: EntityManager, id: string | null | undefined) {
  return id ? em.findOne(Panel, { where: { id } }) : null;
}

export async function createCircuit(w: WriteContext, panelId: string, body: CircuitCreateBody) {
  const { panel: found, building, role } = w.sync
    ? await writablePanel(w, panelId)
    : await visiblePanel(w.em, w.actor, panelId);
  requireScheduleEditor(role);
  if (found.deletedAt) throw parentDeleted('panel');
  const { version, row: panel } = await lockAndReload(w, building.id, found, () =>
    w.em.findOneByOrFail(Panel, { id: panelId }),
  );
  const id = body.id ?? uuidv7();
  await refuseDuplicateId(w.em, Circuit, id);
  const { id: _id, ...fields } = body;
  const siblings = await w.em.find(Circuit, { where: { panelId, ...live } });
  const fed = await feedTarget(w.em, fields.feedsPanelId);
  const bands = await bandsById(w.em, [fields.bandId]);
  const problems = {
    ...circuitProblems(panel, { id, ...fields }, ALL_CIRCUIT_FIELDS, siblings, fed),
    ...bandProblem(fields.bandId, bands.get(fields.bandId ?? ''), building.organisationId),
  };
  if (Object.keys(problems).length > 0) throw new ValidationError(problems);
  const circuit = w.em.create(Circuit, { id, panelId, buildingId: panel.buildingId, fieldMeta: {} });
  stampNew(circuit, fields, w, version);
  await w.em.insert(Circuit, circuit);
  return { circuit: circuitDto(circuit) };
}

/** One circuit patch of a batch; every item of a batch shares the em, actor and VersionBook. */
export interface CircuitPatchItem {
  w: WriteContext;
  id: string;
  patch: CircuitPatchBody;
}

export type ItemOutcome<T> = { ok: true; row: T; version: number } | { ok: false; error: AppError };

/** A planned batch: every outcome is known (conflict ids included) before `persist` finishes it. */
export interface CircuitPatchPlan<T = Circuit> {
  outcomes: ItemOutcome<T>[];
  persist(): Promise<void>;
}

/**
 * Plan many circuit patches: the same rules as one patch, in order (a later item sees the earlier
 * ones), with a constant number of statements for the whole batch. Rows are read with a few
 * `ANY($1)` queries under the buildings' locks, merged and validated in memory; `persist` writes
 * them back with one UPDATE … FROM jsonb_to_recordset of the changed columns and one conflict
 * insert. A rejected item changes nothing.
 */
export async function planCircuitPatches(items: readonly CircuitPatchItem[]): Promise<CircuitPatchPlan> {
  if (items.length === 0) return { outcomes: [], persist: async () => {} };
  const { em, actor, versions } = items[0].w;
  const ids = [...new Set(items.map((i) => i.id))];

  const read = () => selectRows(em, Circuit, 'id = ANY($1::uuid[])', [ids]);
  let circuits = await read();
  const buildingIds = [...new Set(circuits.map((c) => c.buildingId))];
  const known = buildingIds.map((id) => versions.home(id));
  const buildings = known.every((b) => b)
    ? (known as { id: string; organisationId: string }[])
    : await em.find(Building, { where: { id: In(buildingIds) } });
  const roleOf = new Map(buildings.map((b) => [b.id, roleForBuilding(actor, b)]));
  const editable = buildings
    .filter((b) => EDITORS.includes(roleOf.get(b.id) as Role))
    .map((b) => b.id)
    .sort();
  // a push locked its buildings before reading; a REST call locks now and reads again, since a
  // row read before the lock may have changed before it was taken (building ids never change)
  const unlocked = editable.filter((b) => !versions.holds(b));
  for (const b of editable) await versions.of(b);
  if (unlocked.length > 0) circuits = await read();
  const rows = new Map(circuits.map((c) => [c.id, c]));

  // panels, siblings and fed panels only when a patch can break a rule that needs them
  const needs = (i: CircuitPatchItem, fields: string[]) => fields.some((f) => f in i.patch);
  const layoutItems = items.filter((i) => needs(i, ['position', 'poles', 'feedsPanelId']));
  const panelIds = [...new Set(layoutItems.map((i) => rows.get(i.id)?.panelId).filter((p): p is string => !!p))];
  const panels = new Map(
    (panelIds.length ? await em.find(Panel, { where: { id: In(panelIds) } }) : []).map((p) => [p.id, p]),
  );
  const moving = [
    ...new Set(
      items
        .filter((i) => needs(i, ['position', 'poles']))
        .map((i) => rows.get(i.id)?.panelId)
        .filter((p): p is string => !!p),
    ),
  ];
  const siblings = new Map<string, Circuit[]>();
  if (moving.length > 0) {
    for (const c of await em.find(Circuit, { where: { panelId: In(moving), ...live } })) {
      // the batch's own rows stand in for their copies, so a move earlier in the batch is seen
      const row = rows.get(c.id) ?? c;
      siblings.set(c.panelId, [...(siblings.get(c.panelId) ?? []), row]);
    }
  }
  const feedIds = [...new Set(items.map((i) => i.patch.feedsPanelId).filter((p): p is string => !!p))];
  const fedPanels = new Map(
    (feedIds.length ? await em.find(Panel, { where: { id: In(feedIds) } }) : []).map((p) => [p.id, p]),
  );

  const bands = await bandsById(em, items.map((i) => i.patch.bandId));
  const organisationOf = new Map(buildings.map((b) => [b.id, b.organisationId]));

  const outcomes: ItemOutcome<Circuit>[] = [];
  const dirty = new Map<Circuit, Set<string>>();
  const drafts: ConflictDraft[] = [];
  for (const { w, id, patch } of items) {
    try {
      const circuit = rows.get(id);
      const role = circuit ? roleOf.get(circuit.buildingId) : null;
      if (!circuit || !role || (w.sync && w.sync.buildingId !== circuit.buildingId)) {
        throw new NotFoundError('Circuit');
      }
      requireScheduleEditor(role);
      const version = await versions.of(circuit.buildingId);
      const target: Target = { entity: 'circuit', buildingId: circuit.buildingId };
      if (circuit.deletedAt) {
        if (!w.sync) throw new NotFoundError('Circuit');
        drafts.push(editedAfterDelete(circuit, patch, w, target));
        outcomes.push({ ok: true, row: circuit, version });
        continue;
      }
      const plan = planMerge(circuit, completeGroups(patch, circuit as never), w, version);
      if (plan.applied.length > 0) {
        const problems = circuitProblems(
          panels.get(circuit.panelId) ?? null,
          plan.candidate,
          new Set(plan.applied),
          siblings.get(circuit.panelId) ?? [],
          fedPanels.get(plan.candidate.feedsPanelId ?? ''),
        );
        if (plan.applied.includes('bandId')) {
          const bandId = plan.candidate.bandId;
          Object.assign(problems, bandProblem(bandId, bands.get(bandId ?? ''), organisationOf.get(circuit.buildingId)!));
        }
        if (Object.keys(problems).length > 0) throw new ValidationError(problems);
      }
      drafts.push(...commitMerge(circuit, plan, w, version, target));
      const changed = dirty.get(circuit) ?? new Set<string>();
      for (const f of plan.applied) changed.add(f);
      dirty.set(circuit, changed);
      outcomes.push({ ok: true, row: circuit, version });
    } catch (error) {
      if (!(error instanceof AppError)) throw error;
      outcomes.push({ ok: false, error });
    }
  }
  reportConflicts(drafts);
  return {
    outcomes,
    async persist() {
      await updateChanged(em, Circuit, [...dirty].map(([row, fields]) => ({ row, fields: [...fields] })));
      await insertConflicts(em, drafts);
    },
  };
}

/**
 * Circuit fields that no rule ties to another field or row (zod has checked each value): a patch
 * of only these needs no reads to be validated, so it can be merged inside one statement.
 */
const FREE_CIRCUIT_FIELDS: ReadonlySet<string> = new Set([
  'breakerType',
  'description',
  'loadKind',
  'loadVA',
  'continuous',
  'conductorSize',
  'conductorMaterial',
  'insulationTempC',
  'terminationTempC',
  'lengthFt',
  'handleLock',
  'notes',
]);

/**
 * Whether mergeCircuitPatchesSetwise can take a batch: sync patches of free fields only, one per
 * circuit, from one device, each naming a building this push has locked where the actor edits schedules.
 */
export function canMergeSetwise(items: readonly CircuitPatchItem[]): boolean {
  if (items.length === 0) return false;
  const ids = new Set<string>();
  const { device, actor } = items[0].w;
  for (const { w, id, patch } of items) {
    if (!w.sync || w.device !== device || w.actor !== actor) return false;
    // locked by this push, and the actor edits schedules there (a push locks for every role)
    const home = w.versions.home(w.sync.buildingId);
    if (!home || !EDITORS.includes(actor.roles.get(home.organisationId) as Role)) return false;
    if (ids.has(id)) return false;
    ids.add(id);
    if (!Object.keys(patch).every((f) => FREE_CIRCUIT_FIELDS.has(f))) return false;
  }
  return true;
}

interface SetwiseDecision {
  k: number;
  f: string;
  found: boolean;
  deleted_at: Date | null;
  stored: FieldStamp | null;
  deletion: FieldStamp | null;
  row_updated_at: string | null;
  row_updated_by: string | null;
  old: unknown;
  wins: boolean;
}

/**
 * The last-writer-wins merge of a batch of free-field circuit patches as ONE statement: the writes
 * travel as a jsonb recordset, each is compared with the stored field's stamp in SQL (text order
 * under COLLATE "C", as in JavaScript), the winners are written with their stamps, and the
 * decisions that may hold a conflict (or a missing or deleted row) come back with the stored stamp
 * and the old value. The same rule in shared/merge.ts then turns those into outcomes and conflicts
 * (and must agree with SQL on who won, or the batch fails and is replayed one by one). The rows
 * are written before `persist`, which only adds the conflicts; a caller that cannot keep the
 * result rolls back its savepoint.
 */
export async function mergeCircuitPatchesSetwise(
  items: readonly CircuitPatchItem[],
): Promise<CircuitPatchPlan<null>> {
  const { em, actor, device, versions } = items[0].w;
  const meta = em.connection.getMetadata(Circuit);
  const fields = [...new Set(items.flatMap((i) => Object.keys(i.patch)))];
  if (fields.length === 0) {
    const outcomes = items.map(({ w }) => ({ ok: true as const, row: null, version: versions.peek(w.sync!.buildingId)! }));
    return { outcomes, persist: async () => {} };
  }
  const columns = fields.map((f) => {
    const column = meta.findColumnWithPropertyName(f);
    if (!column || typeof column.type !== 'string') throw new Error(`no typed column for ${f}`);
    return column;
  });
  // parameters: $1 writes, $2 circuit ids, $3 device, $4 user, then one per field name
  const name = (i: number) => `$${5 + i}::text`;
  const pick = columns.map((c) => `"${c.databaseName}"`).join(', ');
  const whens = columns.map((c, i) => `WHEN ${name(i)} THEN to_jsonb(cur."${c.databaseName}")`);
  const oldValue = `CASE w.f ${whens.join(' ')} END`;
  const assign = columns
    .map(
      (c, i) =>
        `"${c.databaseName}" = CASE WHEN a.vals ? ${name(i)}
                                THEN (a.vals ->> ${name(i)})::${c.type} ELSE t."${c.databaseName}" END`,
    )
    .join(',\n           ');
  const sql = `
    WITH w AS (
      SELECT * FROM jsonb_to_recordset($1::jsonb)
                 AS w(k int, id uuid, b uuid, f text, v jsonb, h text, ver bigint, bv bigint)
    ), cur AS (
      SELECT id, building_id, deleted_at, updated_at, updated_by, field_meta, ${pick}
        FROM circuit WHERE id = ANY($2::uuid[])
    ), d AS (
      SELECT w.k, w.f, w.id, w.h, w.ver, w.v, w.bv,
             cur.id IS NOT NULL AND cur.building_id = w.b AS found,
             cur.deleted_at, cur.updated_at AS row_updated_at, cur.updated_by AS row_updated_by,
             m.stored,
             CASE WHEN cur.deleted_at IS NOT NULL THEN cur.field_meta -> 'deletedAt' END AS deletion,
             ${oldValue} AS old,
             m.stored IS NULL OR (w.h COLLATE "C") > ((m.stored ->> 'hlc') COLLATE "C") AS wins
        FROM w LEFT JOIN cur ON cur.id = w.id
        -- read the compressed field_meta once per write, not once per use
        LEFT JOIN LATERAL (SELECT cur.field_meta -> w.f AS stored) AS m ON true
    ), a AS (
      SELECT id, max(ver) AS ver,
             jsonb_object_agg(f, v) FILTER (WHERE wins) AS vals,
             jsonb_object_agg(f, jsonb_build_object('hlc', h, 'version', ver, 'device', $3::text, 'user', $4::text))
               FILTER (WHERE wins) AS stamps,
             max(h COLLATE "C") FILTER (WHERE wins) AS last_hlc
        FROM d WHERE found AND deleted_at IS NULL GROUP BY id
    ), written AS (
      UPDATE circuit AS t
         SET ${assign},
             field_meta = t.field_meta || COALESCE(a.stamps, '{}'::jsonb),
             version = a.ver,
             updated_at = CASE WHEN a.last_hlc > (t.updated_at COLLATE "C") THEN a.last_hlc ELSE t.updated_at END,
             updated_by = CASE WHEN a.last_hlc IS NULL THEN t.updated_by ELSE $4::uuid END
        FROM a WHERE t.id = a.id
      RETURNING t.id
    )
    -- only the decisions that need a second look: a missing or deleted row, or a stored stamp from
    -- another device that this write either overwrote unseen or lost to (shared/merge.ts decides)
    SELECT k, f, found, deleted_at, stored, deletion, row_updated_at, row_updated_by, old, wins FROM d
     WHERE NOT found OR deleted_at IS NOT NULL
        OR (stored IS NOT NULL AND stored ->> 'device' <> $3::text
            AND ((wins AND (stored ->> 'version')::bigint > bv) OR (NOT wins AND h <> stored ->> 'hlc')))`;
  const writes = items.flatMap((item, k) =>
    Object.entries(item.patch as Record<string, unknown>)
      .filter(([, v]) => v !== undefined)
      .map(([f, v]) => ({
        k,
        id: item.id,
        b: item.w.sync!.buildingId,
        f,
        v,
        h: item.w.hlc,
        ver: versions.peek(item.w.sync!.buildingId),
        bv: item.w.sync!.baseVersion,
      })),
  );
  const decisions: SetwiseDecision[] = await em.query(sql, [
    JSON.stringify(writes),
    items.map((i) => i.id),
    device,
    actor.userId,
    ...fields,
  ]);

  const byItem = new Map<number, SetwiseDecision[]>();
  for (const d of decisions) byItem.set(d.k, [...(byItem.get(d.k) ?? []), d]);
  const drafts: ConflictDraft[] = [];
  const outcomes: ItemOutcome<null>[] = items.map(({ w, id, patch }, k) => {
    const rows = byItem.get(k) ?? [];
    const version = versions.peek(w.sync!.buildingId)!;
    const target: Target = { entity: 'circuit', buildingId: w.sync!.buildingId };
    // no decision came back: every field was merged without anything to review
    if (rows.length === 0) return { ok: true, row: null, version };
    if (!rows[0].found) return { ok: false, error: new NotFoundError('Circuit') };
    if (rows[0].deleted_at) {
      const tombstoned = {
        id,
        deletedAt: rows[0].deleted_at,
        updatedAt: rows[0].row_updated_at ?? '',
        updatedBy: rows[0].row_updated_by,
        fieldMeta: rows[0].deletion ? { deletedAt: rows[0].deletion } : {},
      } as SyncColumns;
      drafts.push(editedAfterDelete(tombstoned, patch, w, target));
      return { ok: true, row: null, version };
    }
    for (const d of rows) {
      const value = (patch as Record<string, unknown>)[d.f];
      const [decision] = decideWrite(
        d.stored ? { [d.f]: d.stored } : {},
        { hlc: w.hlc, device: w.device, fields: { [d.f]: value }, baseVersion: w.sync!.baseVersion },
        { [d.f]: d.old },
      );
      if ((decision.outcome === 'apply') !== d.wins) {
        throw new Error(`set-wise merge disagrees with shared/merge.ts on ${id}.${d.f}`);
      }
      if (decision.conflict) {
        drafts.push(concurrentDraft(decision, { [d.f]: d.old }, { [d.f]: value }, w, target, id));
      }
    }
    return { ok: true, row: null, version };
  });
  reportConflicts(drafts);
  return { outcomes, persist: () => insertConflicts(em, drafts) };
}

/** Plan and persist a batch of circuit patches (see planCircuitPatches). */
export async function patchCircuits(items: readonly CircuitPatchItem[]): Promise<ItemOutcome<Circuit>[]> {
  const plan = await planCircuitPatches(items);
  await plan.persist();
  return plan.outcomes;
}

export async function patchCircuit(w: WriteContext, id: string, patch: CircuitPatchBody) {
  const [outcome] = await patchCircuits([{ w, id, patch }]);
  if (!outcome.ok) throw outcome.error;
  return { circuit: circuitDto(outcome.row) };
}

export async function deleteCircuit(w: WriteContext, id: string) {
  const found = await writableCircuit(w, id);
  requireScheduleEditor(found.role);
  const { version, row: circuit } = await lockAndReload(w, found.building.id, found.circuit, () =>
    w.em.findOneByOrFail(Circuit, { id }),
  );
  if (circuit.deletedAt) return { ok: true, version };
  const drafts: ConflictDraft[] = [];
  tombstone(circuit, w, version, { entity: 'circuit', buildingId: circuit.buildingId }, drafts);
  await updateRows(w.em, Circuit, [circuit]);
  await insertConflicts(w.em, drafts);
  return { ok: true, version };
}

/** Brings a tombstoned circuit back, if its panel is live and its positions are still free. */
export async function restoreCircuit(w: WriteContext, id: string) {
  const found = await writableCircuit(w, id);
  requireScheduleEditor(found.role);
  const { version, row: circuit } = await lockAndReload(w, found.building.id, found.circuit, () =>
    w.em.findOneByOrFail(Circuit, { id }),
  );
  if (!circuit.deletedAt) return { ok: true, version };
  const panel = await w.em.findOneByOrFail(Panel, { id: circuit.panelId });
  if (panel.deletedAt) throw parentDeleted('panel');
  const siblings = await w.em.find(Circuit, { where: { panelId: panel.id, ...live } });
  const problems = circuitProblems(panel, circuit, new Set(['position']), siblings, null);
  if (Object.keys(problems).length > 0) throw new ValidationError(problems);
  const drafts: ConflictDraft[] = [];
  const { restored } = untombstone(circuit, w, version, { entity: 'circuit', buildingId: circuit.buildingId }, drafts);
  if (restored) await updateRows(w.em, Circuit, [circuit]);
  await insertConflicts(w.em, drafts);
  return { ok: true, version };
}

// ---------- conflicts ----------

/** Record how a conflict was resolved (last writer wins if two devices resolve it). */
export async function resolveConflict(w: WriteContext, id: string, resolution: Resolution) {
  const found = await w.em.findOne(ConflictLog, { where: { id } });
  if (!found) throw new NotFoundError('Conflict');
  const { role } = await writableBuilding(w, found.buildingId, 'Conflict');
  requireScheduleEditor(role);
  const { version, row: conflict } = await lockAndReload(w, found.buildingId, found, () =>
    w.em.findOneByOrFail(ConflictLog, { id }),
  );
  commitMerge(conflict, planMerge(conflict, { resolution }, w, version), w, version, null);
  await updateRows(w.em, ConflictLog, [conflict]);
  return { ok: true, version };
}
