import type { EntityManager, EntityTarget, ObjectLiteral } from 'typeorm';
import type { ColumnMetadata } from 'typeorm/metadata/ColumnMetadata';

// PostgreSQL parses one big jsonb parameter fast; chunks keep a cascade over a huge building from
// building one string of tens of megabytes
const CHUNK_ROWS = 1000;

function sqlType(column: ColumnMetadata): string {
  // every column of ours names its type (tsx emits no decorator metadata, see TOOLCHAIN.md)
  if (typeof column.type !== 'string') throw new Error(`column ${column.propertyName} has no explicit type`);
  return column.type;
}

/**
 * Write the whole of many loaded rows of one entity with one `UPDATE … FROM jsonb_to_recordset($1)`
 * per chunk: the values travel as one bound jsonb parameter, the column list comes from the entity
 * metadata. About 50× faster than one `save` per row (TOOLCHAIN.md, bulk upsert notes).
 */
export async function updateRows<T extends ObjectLiteral>(
  em: EntityManager,
  target: EntityTarget<T>,
  rows: readonly T[],
): Promise<void> {
  if (rows.length === 0) return;
  const meta = em.connection.getMetadata(target);
  const [primary] = meta.primaryColumns;
  const columns = meta.columns.filter((c) => !c.isPrimary && !c.isCreateDate);
  const all = [primary, ...columns];
  const recordset = all.map((c) => `"${c.databaseName}" ${sqlType(c)}`).join(', ');
  const assignments = columns.map((c) => `"${c.databaseName}" = v."${c.databaseName}"`).join(', ');
  const sql = `UPDATE "${meta.tableName}" AS t SET ${assignments}
                 FROM jsonb_to_recordset($1::jsonb) AS v(${recordset})
                WHERE t."${primary.databaseName}" = v."${primary.databaseName}"`;
  for (let i = 0; i < rows.length; i += CHUNK_ROWS) {
    const payload = rows
      .slice(i, i + CHUNK_ROWS)
      .map((row) => Object.fromEntries(all.map((c) => [c.databaseName, c.getEntityValue(row) ?? null])));
    await em.query(sql, [JSON.stringify(payload)]);
  }
}

/** A loaded row and the fields a write changed in it. */
export interface RowChange<T> {
  row: T;
  fields: readonly string[];
}

// written with every change: the row's last stamp, writer and version
const SYNC_PROPERTIES = ['updatedAt', 'updatedBy', 'version'];

/**
 * Like updateRows, but sends only the columns some row of the batch changed (plus the sync
 * columns), and only the changed fields' entries of field_meta, merged in SQL with `||`. Right
 * only under the building lock the caller holds, which keeps the rows as they were loaded; it
 * cuts the statement for a batch of one-field patches to a tenth of the whole-row size.
 */
export async function updateChanged<T extends ObjectLiteral & { fieldMeta: Record<string, unknown> }>(
  em: EntityManager,
  target: EntityTarget<T>,
  changes: readonly RowChange<T>[],
): Promise<void> {
  if (changes.length === 0) return;
  const meta = em.connection.getMetadata(target);
  const [primary] = meta.primaryColumns;
  const wanted = new Set([...SYNC_PROPERTIES, ...changes.flatMap((c) => c.fields)]);
  const columns = meta.columns.filter((c) => !c.isPrimary && wanted.has(c.propertyName));
  const fieldMeta = meta.findColumnWithPropertyName('fieldMeta')!;
  const all = [primary, ...columns, fieldMeta];
  const recordset = all.map((c) => `"${c.databaseName}" ${sqlType(c)}`).join(', ');
  const assignments = [
    ...columns.map((c) => `"${c.databaseName}" = v."${c.databaseName}"`),
    `"${fieldMeta.databaseName}" = t."${fieldMeta.databaseName}" || v."${fieldMeta.databaseName}"`,
  ].join(', ');
  const sql = `UPDATE "${meta.tableName}" AS t SET ${assignments}
                 FROM jsonb_to_recordset($1::jsonb) AS v(${recordset})
                WHERE t."${primary.databaseName}" = v."${primary.databaseName}"`;
  for (let i = 0; i < changes.length; i += CHUNK_ROWS) {
    const payload = changes.slice(i, i + CHUNK_ROWS).map(({ row, fields }) => {
      const out: Record<string, unknown> = {};
      for (const c of [primary, ...columns]) out[c.databaseName] = c.getEntityValue(row) ?? null;
      out[fieldMeta.databaseName] = Object.fromEntries(fields.map((f) => [f, row.fieldMeta[f]]));
      return out;
    });
    await em.query(sql, [JSON.stringify(payload)]);
  }
}

// pg already returns the JavaScript values TypeORM would hydrate for every column type we use,
// except these (a `date` arrives as a Date; TypeORM hands the entity 'YYYY-MM-DD')
const NEEDS_HYDRATION = new Set(['date', 'time', 'simple-json', 'simple-array']);

/**
 * Read rows of one entity with a raw `SELECT "column" AS "property" … WHERE <where>` (bound
 * parameters only): the rows come back shaped like entities, without TypeORM's per-query alias
 * and transformer work — several times faster than `find` for thousands of rows. Plain objects,
 * not class instances (our entities have no methods).
 */
export async function selectRows<T extends ObjectLiteral>(
  em: EntityManager,
  target: EntityTarget<T>,
  where: string,
  parameters: unknown[],
  options: { without?: readonly string[] } = {},
): Promise<T[]> {
  const meta = em.connection.getMetadata(target);
  const columns = meta.columns.filter((c) => !options.without?.includes(c.propertyName));
  const list = columns.map((c) => `"${c.databaseName}" AS "${c.propertyName}"`).join(', ');
  const rows: T[] = await em.query(`SELECT ${list} FROM "${meta.tableName}" WHERE ${where}`, parameters);
  const driver = em.connection.driver;
  const hydrate = columns.filter((c) => typeof c.type === 'string' && NEEDS_HYDRATION.has(c.type));
  for (const row of rows) {
    for (const c of hydrate) {
      (row as Record<string, unknown>)[c.propertyName] = driver.prepareHydratedValue(row[c.propertyName], c);
    }
  }
  return rows;
}
