import type { EntityManager, EntityTarget, ObjectLiteral } from 'typeorm';
import type { ColumnMetadata } from 'typeorm/metadata/ColumnMetadata';

// chunks keep a cascade over a huge building from building parameters of tens of megabytes
const CHUNK_ROWS = 1000;

function sqlType(column: ColumnMetadata): string {
  // every column of ours names its type (tsx emits no decorator metadata, see TOOLCHAIN.md)
  if (typeof column.type !== 'string') throw new Error(`column ${column.propertyName} has no explicit type`);
  return column.type;
}

/**
 * One column of a set-wise write: its values travel as ONE typed array parameter to `unnest`
 * (jsonb as text, parsed once in SQL), so PostgreSQL parses no per-row JSON records.
 */
interface ArrayColumn {
  column: ColumnMetadata;
  /** the array's SQL type */
  param: string;
  /** how unnest's output column is read back as the column's type */
  read: (name: string) => string;
  values: unknown[];
}

function arrayColumn(column: ColumnMetadata, values: unknown[]): ArrayColumn {
  const type = sqlType(column);
  if (type === 'jsonb') {
    return {
      column,
      param: 'text[]',
      read: (name) => `${name}::jsonb`,
      values: values.map((v) => (v === null || v === undefined ? null : JSON.stringify(v))),
    };
  }
  return { column, param: `${type}[]`, read: (name) => name, values: values.map((v) => v ?? null) };
}

/** `unnest($1::uuid[], $2::text[], …) AS v("id", "name", …)` and its parameters, numbered from `first`. */
function unnestOf(columns: readonly ArrayColumn[], first = 1): { from: string; parameters: unknown[] } {
  const arrays = columns.map((c, i) => `$${first + i}::${c.param}`).join(', ');
  const names = columns.map((c) => `"${c.column.databaseName}"`).join(', ');
  return { from: `unnest(${arrays}) AS v(${names})`, parameters: columns.map((c) => c.values) };
}

const value = (row: ObjectLiteral, c: ColumnMetadata): unknown => c.getEntityValue(row);

/**
 * Insert many rows of one entity with one `INSERT … SELECT FROM unnest(typed arrays)` per chunk.
 * A column no row sets is left to its default; otherwise an unset value is NULL.
 */
export async function insertRows<T extends ObjectLiteral>(
  em: EntityManager,
  target: EntityTarget<T>,
  rows: readonly T[],
): Promise<void> {
  if (rows.length === 0) return;
  const meta = em.connection.getMetadata(target);
  for (let i = 0; i < rows.length; i += CHUNK_ROWS) {
    const chunk = rows.slice(i, i + CHUNK_ROWS);
    const columns = meta.columns
      .filter((c) => chunk.some((row) => value(row, c) !== undefined))
      .map((c) => arrayColumn(c, chunk.map((row) => value(row, c))));
    const { from, parameters } = unnestOf(columns);
    const list = columns.map((c) => `"${c.column.databaseName}"`).join(', ');
    const read = columns.map((c) => c.read(`v."${c.column.databaseName}"`)).join(', ');
    await em.query(`INSERT INTO "${meta.tableName}" (${list}) SELECT ${read} FROM ${from}`, parameters);
  }
}

/**
 * Write the whole of many loaded rows of one entity with one `UPDATE … FROM unnest(typed arrays)`
 * per chunk; the column list comes from the entity metadata. About 50× faster than one `save`
 * per row (TOOLCHAIN.md, bulk upsert notes).
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
  for (let i = 0; i < rows.length; i += CHUNK_ROWS) {
    const chunk = rows.slice(i, i + CHUNK_ROWS);
    const arrays = [primary, ...columns].map((c) => arrayColumn(c, chunk.map((row) => value(row, c))));
    const { from, parameters } = unnestOf(arrays);
    const assignments = arrays
      .slice(1)
      .map((c) => `"${c.column.databaseName}" = ${c.read(`v."${c.column.databaseName}"`)}`)
      .join(', ');
    await em.query(
      `UPDATE "${meta.tableName}" AS t SET ${assignments} FROM ${from}
        WHERE t."${primary.databaseName}" = v."${primary.databaseName}"`,
      parameters,
    );
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
  for (let i = 0; i < changes.length; i += CHUNK_ROWS) {
    const chunk = changes.slice(i, i + CHUNK_ROWS);
    const arrays = [
      ...[primary, ...columns].map((c) => arrayColumn(c, chunk.map(({ row }) => value(row, c)))),
      arrayColumn(
        fieldMeta,
        chunk.map(({ row, fields }) => Object.fromEntries(fields.map((f) => [f, row.fieldMeta[f]]))),
      ),
    ];
    const { from, parameters } = unnestOf(arrays);
    const metaColumn = `"${fieldMeta.databaseName}"`;
    const assignments = [
      ...arrays.slice(1, -1).map((c) => `"${c.column.databaseName}" = ${c.read(`v."${c.column.databaseName}"`)}`),
      `${metaColumn} = t.${metaColumn} || v.${metaColumn}::jsonb`,
    ].join(', ');
    await em.query(
      `UPDATE "${meta.tableName}" AS t SET ${assignments} FROM ${from}
        WHERE t."${primary.databaseName}" = v."${primary.databaseName}"`,
      parameters,
    );
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
