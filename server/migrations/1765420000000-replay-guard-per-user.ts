import type { MigrationInterface, QueryRunner } from 'typeorm';

/**
 * The replay guard was keyed by (device_id, mutation_id): another account sending someone's
 * device id and mutation id first took the key (the real mutation was then answered `duplicate`
 * with the other account's result), and could read a stored result by replaying the pair. Keyed
 * by the user as well, each account only ever meets its own records. Still one index (the key).
 */
export class ReplayGuardPerUser1765420000000 implements MigrationInterface {
  name = 'ReplayGuardPerUser1765420000000';

  public async up(q: QueryRunner): Promise<void> {
    await q.query(`
      ALTER TABLE processed_mutation DROP CONSTRAINT pk_processed_mutation;
      ALTER TABLE processed_mutation ADD CONSTRAINT pk_processed_mutation PRIMARY KEY (user_id, device_id, mutation_id);
    `);
  }

  public async down(q: QueryRunner): Promise<void> {
    // the older key cannot hold two accounts' records of one pair: keep the first of each
    await q.query(`
      DELETE FROM processed_mutation p USING processed_mutation q
       WHERE p.device_id = q.device_id AND p.mutation_id = q.mutation_id AND p.ctid > q.ctid;
      ALTER TABLE processed_mutation DROP CONSTRAINT pk_processed_mutation;
      ALTER TABLE processed_mutation ADD CONSTRAINT pk_processed_mutation PRIMARY KEY (device_id, mutation_id);
    `);
  }
}
