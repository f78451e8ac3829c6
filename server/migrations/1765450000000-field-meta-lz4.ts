import type { MigrationInterface, QueryRunner } from 'typeorm';

/**
 * Every synced row's field_meta (a stamp per field) is a few kilobytes of JSON, so PostgreSQL
 * compresses it, and every merge that writes a stamp compresses it again. lz4 does that several
 * times faster than the default pglz (PostgreSQL 14+, built in by Debian's packages); rows keep
 * their old compression until they are next written.
 */
export class FieldMetaLz41765450000000 implements MigrationInterface {
  name = 'FieldMetaLz41765450000000';

  public async up(q: QueryRunner): Promise<void> {
    await this.compress(q, 'lz4');
  }

  public async down(q: QueryRunner): Promise<void> {
    await this.compress(q, 'pglz');
  }

  private async compress(q: QueryRunner, method: 'lz4' | 'pglz'): Promise<void> {
    const tables: { table_name: string }[] = await q.query(
      `SELECT table_name FROM information_schema.columns
        WHERE table_schema = current_schema() AND column_name = 'field_meta' ORDER BY table_name`,
    );
    for (const { table_name } of tables) {
      // names from the catalogue, never from input
      await q.query(`ALTER TABLE "${table_name}" ALTER COLUMN field_meta SET COMPRESSION ${method}`);
    }
  }
}
