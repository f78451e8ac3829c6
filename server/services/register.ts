import { In, IsNull, type EntityManager } from 'typeorm';
import { uuidv7 } from 'uuidv7';
import { occupiedPositions, panelLayout } from '../../shared/calc';
import { SYSTEM_INFO, type Role } from '../../shared/domain';
import {
  circuitRuleErrors,
  type BuildingCreateBody,
  type BuildingPatchBody,
  type CircuitCreateBody,
  type CircuitPatchBody,
  type PanelCreateBody,
  type PanelPatchBody,
} from '../../shared/schemas';
import { requireAdmin, requireScheduleEditor, roleForBuilding, type Actor } from '../auth/access';
import { Building, Circuit, Panel } from '../entities';
import type { SyncColumns } from '../entities/sync-columns';
import { AppError, NotFoundError, ValidationError } from '../http/errors';
import { buildingDto, circuitDto, panelDto } from './serialise';

/**
 * The register's one service layer. REST routes call it now; the sync push calls the same
 * functions inside its own transaction and savepoints, so both paths obey the same rules.
 */
export interface WriteContext {
  em: EntityManager;
  actor: Actor;
  /** HLC stamp of this write */
  hlc: string;
  /** device that made the write ('server' for REST calls) */
  device: string;
}

const live = { deletedAt: IsNull() };

// ---------- visibility ----------

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

async function visibleCircuit(em: EntityManager, actor: Actor, id: string) {
  const circuit = await em.findOne(Circuit, { where: { id, ...live } });
  if (!circuit) throw new NotFoundError('Circuit');
  try {
    return { circuit, ...(await visiblePanel(em, actor, circuit.panelId)) };
  } catch {
    throw new NotFoundError('Circuit');
  }
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

async function panelCounts(em: EntityManager, buildingIds: string[]) {
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

export async function getPanel(em: EntityManager, actor: Actor, id: string) {
  const { panel, building, role } = await visiblePanel(em, actor, id);
  const [circuits, panelCount] = await Promise.all([
    em.find(Circuit, { where: { panelId: id, ...live }, order: { position: 'ASC' } }),
    panelCounts(em, [building.id]),
  ]);
  return {
    panel: panelDto(panel),
    building: buildingDto(building, role, panelCount.get(building.id) ?? 0),
    circuits: circuits.map(circuitDto),
  };
}

// ---------- write helpers ----------

/**
 * Bump the building's version and return it. The row lock this takes orders concurrent writes to
 * one building, so a pull cursor never passes a row that commits later with a lower version.
 */
async function bumpVersion(em: EntityManager, buildingId: string): Promise<number> {
  // TypeORM answers an UPDATE … RETURNING on PostgreSQL as [rows, affectedCount]
  const [rows]: [{ version: string }[], number] = await em.query(
    'UPDATE building SET version = version + 1 WHERE id = $1 RETURNING version',
    [buildingId],
  );
  return Number(rows[0].version);
}

/** Set fields on a row and stamp each one for per-field last-writer-wins. */
function applyFields<T extends SyncColumns>(
  row: T,
  fields: Partial<T>,
  w: WriteContext,
  version: number,
): T {
  const meta = { ...(row.fieldMeta ?? {}) };
  for (const [key, value] of Object.entries(fields)) {
    if (value === undefined) continue;
    (row as Record<string, unknown>)[key] = value;
    meta[key] = { hlc: w.hlc, version, device: w.device };
  }
  row.fieldMeta = meta;
  row.updatedAt = w.hlc;
  row.updatedBy = w.actor.userId;
  row.version = String(version);
  return row;
}

async function refuseDuplicateId(em: EntityManager, entity: typeof Building | typeof Panel | typeof Circuit, id: string) {
  if (await em.exists(entity, { where: { id } })) {
    throw new AppError(409, 'exists', 'A row with this id already exists');
  }
}

// ---------- buildings ----------

function organisationFor(actor: Actor, requested: string | undefined): string {
  const editable = [...actor.roles].filter(([, role]) => role === 'admin' || role === 'electrician');
  if (requested) {
    if (!actor.roles.has(requested)) throw new ValidationError({ organisationId: 'not one of your organisations' });
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
  await refuseDuplicateId(w.em, Building, id);
  const building = w.em.create(Building, { id, organisationId, version: '1', fieldMeta: {} });
  applyFields(building, { name: body.name, address: body.address, notes: body.notes }, w, 1);
  await w.em.insert(Building, building);
  return { building: buildingDto(building, role, 0) };
}

export async function patchBuilding(w: WriteContext, id: string, patch: BuildingPatchBody) {
  const { building, role } = await visibleBuilding(w.em, w.actor, id);
  requireScheduleEditor(role);
  const version = await bumpVersion(w.em, id);
  applyFields(building, patch, w, version);
  await w.em.save(Building, building);
  return { building: buildingDto(building, role, (await panelCounts(w.em, [id])).get(id) ?? 0) };
}

/** Tombstones the building with every panel and circuit in it. */
export async function deleteBuilding(w: WriteContext, id: string) {
  const { building, role } = await visibleBuilding(w.em, w.actor, id);
  requireAdmin(role, 'delete a building');
  const version = await bumpVersion(w.em, id);
  for (const table of ['circuit', 'panel']) {
    await w.em.query(
      `UPDATE ${table} SET deleted_at = now(), version = $2, updated_at = $3, updated_by = $4
        WHERE building_id = $1 AND deleted_at IS NULL`,
      [id, version, w.hlc, w.actor.userId],
    );
  }
  applyFields(building, { deletedAt: new Date() }, w, version);
  await w.em.save(Building, building);
  return { ok: true, version };
}

// ---------- panels ----------

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
  const { role } = await visibleBuilding(w.em, w.actor, buildingId);
  requireScheduleEditor(role);
  const id = body.id ?? uuidv7();
  await refuseDuplicateId(w.em, Panel, id);
  await checkPanelLinks(w.em, buildingId, id, body.fedFromPanelId);
  const version = await bumpVersion(w.em, buildingId);
  const { id: _id, ...fields } = body;
  const panel = w.em.create(Panel, { id, buildingId, fieldMeta: {} });
  applyFields(panel, fields as Partial<Panel>, w, version);
  await w.em.insert(Panel, panel);
  return { panel: panelDto(panel) };
}

export async function patchPanel(w: WriteContext, id: string, patch: PanelPatchBody) {
  const { panel, role } = await visiblePanel(w.em, w.actor, id);
  requireScheduleEditor(role);
  await checkPanelLinks(w.em, panel.buildingId, id, patch.fedFromPanelId);
  if (patch.spaces !== undefined || patch.system !== undefined) {
    const next = { system: patch.system ?? panel.system, spaces: patch.spaces ?? panel.spaces };
    const circuits = await w.em.find(Circuit, { where: { panelId: id, ...live } });
    const { problems } = panelLayout(next, circuits);
    if (problems.length > 0) {
      const field = patch.spaces !== undefined ? 'spaces' : 'system';
      throw new ValidationError({ [field]: `existing circuits would not fit: ${problems[0].message}` });
    }
  }
  const version = await bumpVersion(w.em, panel.buildingId);
  applyFields(panel, patch as Partial<Panel>, w, version);
  await w.em.save(Panel, panel);
  return { panel: panelDto(panel) };
}

/** Tombstones the panel and its circuits. */
export async function deletePanel(w: WriteContext, id: string) {
  const { panel, role } = await visiblePanel(w.em, w.actor, id);
  requireScheduleEditor(role);
  const version = await bumpVersion(w.em, panel.buildingId);
  await w.em.query(
    `UPDATE circuit SET deleted_at = now(), version = $2, updated_at = $3, updated_by = $4
      WHERE panel_id = $1 AND deleted_at IS NULL`,
    [id, version, w.hlc, w.actor.userId],
  );
  applyFields(panel, { deletedAt: new Date() }, w, version);
  await w.em.save(Panel, panel);
  return { ok: true, version };
}

// ---------- circuits ----------

/** Position, poles, phases and feeder link of a circuit as it would be stored. */
async function checkCircuit(
  em: EntityManager,
  panel: Panel,
  candidate: Pick<Circuit, 'id' | 'position' | 'poles' | 'status' | 'ratingA' | 'feedsPanelId'>,
) {
  const fields = circuitRuleErrors(candidate);
  if (candidate.poles === 3 && SYSTEM_INFO[panel.system].phases === 1) {
    fields.poles = 'a 3-pole breaker needs a three-phase panel';
  }
  const layout = panelLayout({ system: panel.system, spaces: panel.spaces }, [candidate]);
  for (const problem of layout.problems) {
    const field = problem.code === 'bad-poles' || problem.code === 'same-phase' ? 'poles' : 'position';
    fields[field] ??= problem.message;
  }
  const others = await em.find(Circuit, { where: { panelId: panel.id, ...live } });
  const taken = new Map<number, Circuit>();
  for (const other of others) {
    if (other.id === candidate.id) continue;
    for (const position of occupiedPositions(other.position, other.poles)) taken.set(position, other);
  }
  const clash = occupiedPositions(candidate.position, candidate.poles).find((p) => taken.has(p));
  if (clash !== undefined) {
    const other = taken.get(clash)!;
    fields.position ??= `position ${clash} is taken by the breaker at ${other.position}${
      other.description ? ` (${other.description})` : ''
    }`;
  }
  if (candidate.feedsPanelId) {
    const fed = await em.findOne(Panel, {
      where: { id: candidate.feedsPanelId, buildingId: panel.buildingId, ...live },
    });
    if (!fed || fed.id === panel.id) fields.feedsPanelId = 'no such other panel in this building';
  }
  if (Object.keys(fields).length > 0) throw new ValidationError(fields);
}

export async function createCircuit(w: WriteContext, panelId: string, body: CircuitCreateBody) {
  const { panel, role } = await visiblePanel(w.em, w.actor, panelId);
  requireScheduleEditor(role);
  const id = body.id ?? uuidv7();
  await refuseDuplicateId(w.em, Circuit, id);
  const { id: _id, ...fields } = body;
  await checkCircuit(w.em, panel, { id, ...fields });
  const version = await bumpVersion(w.em, panel.buildingId);
  const circuit = w.em.create(Circuit, { id, panelId, buildingId: panel.buildingId, fieldMeta: {} });
  applyFields(circuit, fields as Partial<Circuit>, w, version);
  await w.em.insert(Circuit, circuit);
  return { circuit: circuitDto(circuit) };
}

export async function patchCircuit(w: WriteContext, id: string, patch: CircuitPatchBody) {
  const { circuit, panel, role } = await visibleCircuit(w.em, w.actor, id);
  requireScheduleEditor(role);
  await checkCircuit(w.em, panel, { ...circuit, ...(patch as Partial<Circuit>) });
  const version = await bumpVersion(w.em, panel.buildingId);
  applyFields(circuit, patch as Partial<Circuit>, w, version);
  await w.em.save(Circuit, circuit);
  return { circuit: circuitDto(circuit) };
}

export async function deleteCircuit(w: WriteContext, id: string) {
  const { circuit, panel, role } = await visibleCircuit(w.em, w.actor, id);
  requireScheduleEditor(role);
  const version = await bumpVersion(w.em, panel.buildingId);
  applyFields(circuit, { deletedAt: new Date() }, w, version);
  await w.em.save(Circuit, circuit);
  return { ok: true, version };
}
