import type { EntityManager, EntityTarget, ObjectLiteral } from 'typeorm';
import type { Building as BuildingDto, Circuit as CircuitDto, Panel as PanelDto } from '../../shared/schemas';
import { roleForBuilding, type Actor } from '../auth/access';
import { queryPrepared } from '../db-prepared';
import { Building, Circuit, Panel } from '../entities';
import { NotFoundError } from '../http/errors';
import { JsonText } from '../http/handle';

/**
 * `GET /api/panels/:id` in one statement. Opening a schedule online is the most frequent read
 * there is; PostgreSQL builds the panel, its building, the building's panel count and the
 * circuits as JSON in one round trip, where four selects used to be waited on and mapped field by
 * field. The answer is the same as the DTOs of ./serialise.ts give (tests/api/panel-read.test.ts
 * compares the two for every demo panel). The panel and its circuits come back as JSON text and go
 * out as they are: parsing them only to serialise them again was a tenth of the request's CPU.
 */
export interface PanelRead {
  panel: PanelDto;
  building: BuildingDto;
  circuits: CircuitDto[];
}

/** Columns every DTO leaves out: the per-field stamps are the server's business. */
const NEVER_SENT = ['fieldMeta'];

/**
 * `json_build_object('id', t."id", …)` over an entity's columns, as the DTOs name them: the
 * property names, timestamps as ISO text with milliseconds (JavaScript's toISOString), every
 * other type as PostgreSQL's JSON gives it (numbers, booleans, text, `YYYY-MM-DD` dates).
 */
function jsonObject(em: EntityManager, target: EntityTarget<ObjectLiteral>, alias: string, without: readonly string[]) {
  const columns = em.connection
    .getMetadata(target)
    .columns.filter((c) => !NEVER_SENT.includes(c.propertyName) && !without.includes(c.propertyName));
  const pairs = columns.map((c) => {
    const column = `${alias}."${c.databaseName}"`;
    const value =
      c.type === 'timestamptz' || c.type === 'timestamp with time zone'
        ? `to_char(${column} AT TIME ZONE 'UTC', 'YYYY-MM-DD"T"HH24:MI:SS.MS"Z"')`
        : column;
    return `'${c.propertyName}', ${value}`;
  });
  return `json_build_object(${pairs.join(', ')})`;
}

const statements = new WeakMap<object, string>();

function statement(em: EntityManager): string {
  const cached = statements.get(em.connection);
  if (cached) return cached;
  const sql = `
    WITH p AS (SELECT * FROM panel WHERE id = $1 AND deleted_at IS NULL),
         b AS (SELECT * FROM building WHERE id = (SELECT building_id FROM p) AND deleted_at IS NULL)
    SELECT
      (SELECT ${jsonObject(em, Panel, 'p', [])}::text FROM p) AS panel,
      (SELECT ${jsonObject(em, Building, 'b', [])} FROM b) AS building,
      (SELECT count(*)::int FROM panel x WHERE x.building_id = (SELECT id FROM b) AND x.deleted_at IS NULL) AS "panelCount",
      (SELECT coalesce(json_agg(${jsonObject(em, Circuit, 'c', ['buildingId'])} ORDER BY c.position), '[]'::json)::text
         FROM circuit c WHERE c.panel_id = $1 AND c.deleted_at IS NULL AND EXISTS (SELECT 1 FROM b)) AS circuits`;
  statements.set(em.connection, sql);
  return sql;
}

type BuildingRow = Omit<BuildingDto, 'role' | 'panelCount'>;

interface Row {
  panel: string | null;
  building: BuildingRow | null;
  panelCount: number;
  circuits: string;
}

/** The panel read as the JSON text of a {@link PanelRead}. */
export async function readPanel(em: EntityManager, actor: Actor, id: string): Promise<JsonText<PanelRead>> {
  const [row] = await queryPrepared<Row>(em, 'panel-read', statement(em), [id]);
  const role = row.panel && row.building ? roleForBuilding(actor, row.building) : null;
  // another organisation's panel answers exactly as a missing one
  if (!row.panel || !row.building || !role) throw new NotFoundError('Panel');
  const building: BuildingDto = { ...row.building, role, panelCount: row.panelCount };
  return new JsonText(`{"panel":${row.panel},"building":${JSON.stringify(building)},"circuits":${row.circuits}}`);
}
