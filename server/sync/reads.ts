import { In, type EntityManager } from 'typeorm';
import type { Role } from '../../shared/domain';
import { roleForBuilding, type Actor } from '../auth/access';
import { Building, Panel } from '../entities';
import { buildingDto, panelDto } from '../services/serialise';
import { live, visibleBuilding } from './access';

/** The register's REST reads: buildings, one building with its panels. */

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

// the panel read is server/services/panel-read.ts: one statement builds its JSON
