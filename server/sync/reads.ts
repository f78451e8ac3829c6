import { In, type EntityManager } from 'typeorm';
import type { Role } from '../../shared/domain';
import { roleForBuilding, type Actor } from '../auth/access';
import { Building, Circuit, Panel } from '../entities';
import { NotFoundError } from '../http/errors';
import { selectRows } from '../services/bulk';
import { buildingDto, circuitDto, panelDto } from '../services/serialise';
import { live, visibleBuilding } from './access';

/** The register's REST reads: buildings, one building with its panels, one panel with its circuits. */

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

/** Columns a read sends: field_meta (the per-field stamps) is larger than the row and never leaves the server. */
const SENT = { without: ['fieldMeta'] } as const;

/**
 * The panel screen's read, the most frequent one: four independent statements at once (none waits
 * for another), raw selects of the sent columns only; visibility is checked before anything is
 * answered, so rows read for a panel the actor may not see are dropped unsent.
 */
export async function getPanel(em: EntityManager, actor: Actor, id: string) {
  const ofPanel = '(SELECT building_id FROM panel WHERE id = $1)';
  const [[panel], [building], circuits, [count]] = await Promise.all([
    selectRows(em, Panel, 'id = $1 AND deleted_at IS NULL', [id], SENT),
    selectRows(em, Building, `id = ${ofPanel} AND deleted_at IS NULL`, [id], SENT),
    selectRows(em, Circuit, 'panel_id = $1 AND deleted_at IS NULL ORDER BY position', [id], SENT),
    em.query(`SELECT count(*) AS n FROM panel WHERE building_id = ${ofPanel} AND deleted_at IS NULL`, [id]) as Promise<{ n: string }[]>,
  ]);
  const role = panel && building ? roleForBuilding(actor, building) : null;
  if (!role) throw new NotFoundError('Panel');
  return {
    panel: panelDto(panel),
    building: buildingDto(building, role, Number(count.n)),
    circuits: circuits.map(circuitDto),
  };
}

