import pg from 'pg';
import type { EntityManager } from 'typeorm';
import { PostgresDriver } from 'typeorm/driver/postgres/PostgresDriver.js';

/**
 * A frequent read as a named prepared statement: PostgreSQL parses and plans it once per pooled
 * connection instead of at every request (the panel read's JSON-building statement took longer to
 * plan than to run). Inside a transaction (a manager with its own query runner) it runs as usual.
 * One `name` must always stand for the same `text`.
 */
export async function queryPrepared<Row extends pg.QueryResultRow>(
  em: EntityManager,
  name: string,
  text: string,
  values: unknown[],
): Promise<Row[]> {
  const driver = em.connection.driver;
  const pool: unknown = driver instanceof PostgresDriver ? driver.master : undefined;
  if (em.queryRunner || !(pool instanceof pg.Pool)) return em.query(text, values);
  // through TypeORM's query log like every other statement (it logs only when asked to)
  em.connection.logger.logQuery(text, values);
  const result = await pool.query<Row>({ name, text, values });
  return result.rows;
}
