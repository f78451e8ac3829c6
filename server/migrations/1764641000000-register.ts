import type { MigrationInterface, QueryRunner } from 'typeorm';

/** The register: organisations, users and roles, buildings → panels → circuits, and sessions. */
export class Register1764641000000 implements MigrationInterface {
  name = 'Register1764641000000';

  public async up(q: QueryRunner): Promise<void> {
    await q.query(`
      CREATE TABLE organisation (
        id uuid PRIMARY KEY,
        name text NOT NULL,
        created_at timestamptz NOT NULL DEFAULT now()
      );
      CREATE TABLE app_user (
        id uuid PRIMARY KEY,
        email text NOT NULL,
        name text NOT NULL,
        password_hash text NOT NULL,
        created_at timestamptz NOT NULL DEFAULT now()
      );
      CREATE UNIQUE INDEX uq_app_user_email ON app_user (email);
      CREATE TABLE membership (
        id uuid PRIMARY KEY,
        user_id uuid NOT NULL CONSTRAINT fk_membership_user REFERENCES app_user(id) ON DELETE CASCADE,
        organisation_id uuid NOT NULL
          CONSTRAINT fk_membership_organisation REFERENCES organisation(id) ON DELETE CASCADE,
        role text NOT NULL CONSTRAINT ck_membership_role
          CHECK (role IN ('admin', 'electrician', 'inspector', 'owner'))
      );
      CREATE UNIQUE INDEX uq_membership_user_org ON membership (user_id, organisation_id);

      CREATE TABLE building (
        id uuid PRIMARY KEY,
        organisation_id uuid NOT NULL
          CONSTRAINT fk_building_organisation REFERENCES organisation(id),
        name text NOT NULL,
        address text NOT NULL DEFAULT '',
        notes text NOT NULL DEFAULT '',
        updated_at text NOT NULL,
        updated_by uuid,
        deleted_at timestamptz,
        version bigint NOT NULL DEFAULT 0,
        field_meta jsonb NOT NULL DEFAULT '{}'::jsonb
      );
      CREATE INDEX ix_building_organisation ON building (organisation_id);

      CREATE TABLE owner_grant (
        id uuid PRIMARY KEY,
        user_id uuid NOT NULL CONSTRAINT fk_owner_grant_user REFERENCES app_user(id) ON DELETE CASCADE,
        building_id uuid NOT NULL
          CONSTRAINT fk_owner_grant_building REFERENCES building(id) ON DELETE CASCADE
      );
      CREATE UNIQUE INDEX uq_owner_grant_user_building ON owner_grant (user_id, building_id);

      CREATE TABLE panel (
        id uuid PRIMARY KEY,
        building_id uuid NOT NULL CONSTRAINT fk_panel_building REFERENCES building(id),
        tag text NOT NULL,
        location text NOT NULL DEFAULT '',
        kind text NOT NULL,
        system text NOT NULL,
        bus_rating_a integer NOT NULL,
        main_rating_a integer,
        short_circuit_ka real,
        spaces integer NOT NULL,
        fed_from_panel_id uuid CONSTRAINT fk_panel_fed_from REFERENCES panel(id),
        fed_from_position integer,
        maker text NOT NULL DEFAULT '',
        model text NOT NULL DEFAULT '',
        installed_on date,
        condition smallint NOT NULL DEFAULT 1,
        updated_at text NOT NULL,
        updated_by uuid,
        deleted_at timestamptz,
        version bigint NOT NULL DEFAULT 0,
        field_meta jsonb NOT NULL DEFAULT '{}'::jsonb
      );
      CREATE INDEX ix_panel_building_version ON panel (building_id, version);

      CREATE TABLE circuit (
        id uuid PRIMARY KEY,
        panel_id uuid NOT NULL CONSTRAINT fk_circuit_panel REFERENCES panel(id),
        building_id uuid NOT NULL CONSTRAINT fk_circuit_building REFERENCES building(id),
        position integer NOT NULL,
        poles smallint NOT NULL,
        rating_a integer,
        breaker_type text NOT NULL,
        description text NOT NULL DEFAULT '',
        load_kind text NOT NULL,
        load_va real,
        continuous boolean NOT NULL DEFAULT false,
        conductor_size text,
        conductor_material text,
        insulation_temp_c smallint,
        length_ft real,
        status text NOT NULL,
        feeds_panel_id uuid CONSTRAINT fk_circuit_feeds_panel REFERENCES panel(id),
        handle_lock boolean NOT NULL DEFAULT false,
        notes text NOT NULL DEFAULT '',
        updated_at text NOT NULL,
        updated_by uuid,
        deleted_at timestamptz,
        version bigint NOT NULL DEFAULT 0,
        field_meta jsonb NOT NULL DEFAULT '{}'::jsonb
      );
      CREATE INDEX ix_circuit_panel_position ON circuit (panel_id, position);
      CREATE INDEX ix_circuit_building_version ON circuit (building_id, version);

      -- express-session store (connect-pg-simple's table)
      CREATE TABLE session (
        sid varchar NOT NULL PRIMARY KEY,
        sess json NOT NULL,
        expire timestamp(6) NOT NULL
      );
      CREATE INDEX ix_session_expire ON session (expire);
    `);
  }

  public async down(q: QueryRunner): Promise<void> {
    await q.query(`
      DROP TABLE session;
      DROP TABLE circuit;
      DROP TABLE panel;
      DROP TABLE owner_grant;
      DROP TABLE building;
      DROP TABLE membership;
      DROP TABLE app_user;
      DROP TABLE organisation;
    `);
  }
}
