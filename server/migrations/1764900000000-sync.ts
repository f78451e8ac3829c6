import type { MigrationInterface, QueryRunner } from 'typeorm';

/**
 * Offline sync (SYNC.md): the idempotency record of pushed mutations, and the conflict log, which is
 * a synced row like any other so every device of the building can show it under "needs review".
 */
export class Sync1764900000000 implements MigrationInterface {
  name = 'Sync1764900000000';

  public async up(q: QueryRunner): Promise<void> {
    await q.query(`
      CREATE TABLE processed_mutation (
        device_id text NOT NULL,
        mutation_id uuid NOT NULL,
        user_id uuid NOT NULL
          CONSTRAINT fk_processed_mutation_user REFERENCES app_user(id) ON DELETE CASCADE,
        -- the answer given the first time, replayed as 'duplicate'; null only inside the push
        result jsonb,
        created_at timestamptz NOT NULL DEFAULT now(),
        CONSTRAINT pk_processed_mutation PRIMARY KEY (device_id, mutation_id)
      );
      -- pruning old records (well past any device's offline spell) goes by age
      CREATE INDEX ix_processed_mutation_created ON processed_mutation (created_at);

      CREATE TABLE conflict_log (
        id uuid PRIMARY KEY,
        building_id uuid NOT NULL CONSTRAINT fk_conflict_log_building REFERENCES building(id),
        entity text NOT NULL
          CONSTRAINT ck_conflict_log_entity CHECK (entity IN ('building', 'panel', 'circuit')),
        entity_id uuid NOT NULL,
        field text NOT NULL,
        winner_value jsonb,
        loser_value jsonb,
        winner_hlc text NOT NULL,
        loser_hlc text NOT NULL,
        winner_user uuid CONSTRAINT fk_conflict_log_winner_user REFERENCES app_user(id) ON DELETE SET NULL,
        loser_user uuid CONSTRAINT fk_conflict_log_loser_user REFERENCES app_user(id) ON DELETE SET NULL,
        loser_device text NOT NULL,
        mutation_id uuid,
        kind text NOT NULL
          CONSTRAINT ck_conflict_log_kind CHECK (kind IN ('concurrent', 'edited_after_delete')),
        resolution text
          CONSTRAINT ck_conflict_log_resolution CHECK (resolution IN ('kept_theirs', 'restored_mine')),
        updated_at text NOT NULL,
        updated_by uuid,
        deleted_at timestamptz,
        version bigint NOT NULL DEFAULT 0,
        field_meta jsonb NOT NULL DEFAULT '{}'::jsonb
      );
      CREATE INDEX ix_conflict_log_building_version ON conflict_log (building_id, version);
      CREATE INDEX ix_conflict_log_entity ON conflict_log (entity_id);
    `);
  }

  public async down(q: QueryRunner): Promise<void> {
    await q.query(`
      DROP TABLE conflict_log;
      DROP TABLE processed_mutation;
    `);
  }
}
