import type { MigrationInterface, QueryRunner } from 'typeorm';

/** Invitations and password-reset links (only token hashes are stored). */
export class Access1765300000000 implements MigrationInterface {
  name = 'Access1765300000000';

  public async up(q: QueryRunner): Promise<void> {
    await q.query(`
      CREATE TABLE invitation (
        id uuid PRIMARY KEY,
        organisation_id uuid NOT NULL CONSTRAINT fk_invitation_organisation REFERENCES organisation(id),
        email text NOT NULL,
        role text NOT NULL CONSTRAINT ck_invitation_role CHECK (role IN ('admin', 'electrician', 'inspector', 'owner')),
        building_ids uuid[] NOT NULL DEFAULT '{}',
        invited_by uuid NOT NULL CONSTRAINT fk_invitation_invited_by REFERENCES app_user(id),
        token_hash text NOT NULL,
        expires_at timestamptz NOT NULL,
        used_at timestamptz,
        created_at timestamptz NOT NULL DEFAULT now()
      );
      CREATE UNIQUE INDEX uq_invitation_token_hash ON invitation (token_hash);
      CREATE INDEX ix_invitation_organisation ON invitation (organisation_id);

      CREATE TABLE one_time_token (
        id uuid PRIMARY KEY,
        user_id uuid NOT NULL CONSTRAINT fk_one_time_token_user REFERENCES app_user(id) ON DELETE CASCADE,
        purpose text NOT NULL CONSTRAINT ck_one_time_token_purpose CHECK (purpose IN ('password_reset')),
        token_hash text NOT NULL,
        expires_at timestamptz NOT NULL,
        used_at timestamptz,
        created_at timestamptz NOT NULL DEFAULT now()
      );
      CREATE UNIQUE INDEX uq_one_time_token_hash ON one_time_token (token_hash);
      CREATE INDEX ix_one_time_token_user ON one_time_token (user_id);
    `);
  }

  public async down(q: QueryRunner): Promise<void> {
    await q.query(`DROP TABLE one_time_token; DROP TABLE invitation;`);
  }
}
