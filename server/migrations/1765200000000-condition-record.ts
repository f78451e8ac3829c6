import type { MigrationInterface, QueryRunner } from 'typeorm';

const SYNC_COLUMNS = `
        updated_at text NOT NULL,
        updated_by uuid,
        deleted_at timestamptz,
        version bigint NOT NULL DEFAULT 0,
        field_meta jsonb NOT NULL DEFAULT '{}'::jsonb`;

/**
 * The condition record: inspections, readings, deficiencies with their history, recorded trips,
 * photos (rows only; bytes are in object storage), the organisation's time-current bands, the
 * organisation's settings and a circuit's band.
 */
export class ConditionRecord1765200000000 implements MigrationInterface {
  name = 'ConditionRecord1765200000000';

  public async up(q: QueryRunner): Promise<void> {
    await q.query(`
      ALTER TABLE organisation ADD COLUMN settings jsonb NOT NULL DEFAULT '{}'::jsonb;
      ALTER TABLE conflict_log DROP CONSTRAINT ck_conflict_log_entity;
      ALTER TABLE conflict_log ADD CONSTRAINT ck_conflict_log_entity CHECK (entity IN
        ('building', 'panel', 'circuit', 'inspection', 'reading', 'deficiency', 'trip', 'photo'));

      CREATE TABLE curve_band (
        id uuid PRIMARY KEY,
        organisation_id uuid NOT NULL CONSTRAINT fk_curve_band_organisation REFERENCES organisation(id),
        label text NOT NULL,
        rating_a integer NOT NULL,
        source text NOT NULL DEFAULT '',
        points jsonb NOT NULL,
        instantaneous_multiple real,
        instantaneous_tolerance_pct real,
        updated_at timestamptz NOT NULL,
        deleted_at timestamptz
      );
      CREATE INDEX ix_curve_band_organisation ON curve_band (organisation_id);

      ALTER TABLE circuit ADD COLUMN band_id uuid CONSTRAINT fk_circuit_band REFERENCES curve_band(id);

      CREATE TABLE inspection (
        id uuid PRIMARY KEY,
        building_id uuid NOT NULL CONSTRAINT fk_inspection_building REFERENCES building(id),
        kind text NOT NULL CONSTRAINT ck_inspection_kind
          CHECK (kind IN ('thermal-survey', 'torque-audit', 'trip-test', 'visual', 'full-maintenance')),
        panel_ids jsonb NOT NULL,
        performed_on text NOT NULL,
        ambient_c real,
        load_pct real,
        notes text NOT NULL DEFAULT '',
        inspector_id uuid CONSTRAINT fk_inspection_inspector REFERENCES app_user(id) ON DELETE SET NULL,
        inspector_name text NOT NULL DEFAULT '',
        signed_at timestamptz,
        signed_by uuid CONSTRAINT fk_inspection_signed_by REFERENCES app_user(id) ON DELETE SET NULL,
        signed_by_name text,${SYNC_COLUMNS}
      );
      CREATE INDEX ix_inspection_building_version ON inspection (building_id, version);

      CREATE TABLE reading (
        id uuid PRIMARY KEY,
        building_id uuid NOT NULL CONSTRAINT fk_reading_building REFERENCES building(id),
        inspection_id uuid NOT NULL CONSTRAINT fk_reading_inspection REFERENCES inspection(id),
        panel_id uuid NOT NULL CONSTRAINT fk_reading_panel REFERENCES panel(id),
        kind text NOT NULL CONSTRAINT ck_reading_kind CHECK (kind IN ('thermal', 'torque', 'trip', 'visual')),
        circuit_id uuid CONSTRAINT fk_reading_circuit REFERENCES circuit(id),
        notes text NOT NULL DEFAULT '',
        component text,
        phase text,
        temperature_c real,
        reference_c real,
        reference_basis text,
        load_a real,
        reference_load_a real,
        fastener text NOT NULL DEFAULT '',
        specified real,
        unit text,
        spec_source text,
        conductor_size text,
        screw text,
        as_found text,
        as_found_value real,
        as_left real,
        test_current_a real,
        tripped boolean,
        trip_time_s real,
        band_id uuid CONSTRAINT fk_reading_band REFERENCES curve_band(id),
        check_item text,${SYNC_COLUMNS}
      );
      CREATE INDEX ix_reading_building_version ON reading (building_id, version);
      CREATE INDEX ix_reading_inspection ON reading (inspection_id);

      CREATE TABLE deficiency (
        id uuid PRIMARY KEY,
        building_id uuid NOT NULL CONSTRAINT fk_deficiency_building REFERENCES building(id),
        panel_id uuid CONSTRAINT fk_deficiency_panel REFERENCES panel(id),
        circuit_id uuid CONSTRAINT fk_deficiency_circuit REFERENCES circuit(id),
        inspection_id uuid CONSTRAINT fk_deficiency_inspection REFERENCES inspection(id),
        reading_id uuid CONSTRAINT fk_deficiency_reading REFERENCES reading(id),
        source text NOT NULL CONSTRAINT ck_deficiency_source CHECK (source IN ('reading', 'checklist', 'manual')),
        check_item text,
        title text NOT NULL,
        description text NOT NULL DEFAULT '',
        priority smallint NOT NULL CONSTRAINT ck_deficiency_priority CHECK (priority BETWEEN 1 AND 4),
        priority_reason text NOT NULL DEFAULT '',
        due_on text NOT NULL,
        status text NOT NULL CONSTRAINT ck_deficiency_status
          CHECK (status IN ('open', 'scheduled', 'repaired', 'verified', 'deferred')),
        assignee_id uuid CONSTRAINT fk_deficiency_assignee REFERENCES app_user(id) ON DELETE SET NULL,
        repair_note text NOT NULL DEFAULT '',
        defer_reason text NOT NULL DEFAULT '',
        review_on text,
        accepted_at text,
        raised_by uuid CONSTRAINT fk_deficiency_raised_by REFERENCES app_user(id) ON DELETE SET NULL,
        raised_by_name text NOT NULL DEFAULT '',${SYNC_COLUMNS}
      );
      CREATE INDEX ix_deficiency_building_version ON deficiency (building_id, version);
      CREATE INDEX ix_deficiency_building_status ON deficiency (building_id, status);

      CREATE TABLE deficiency_entry (
        id uuid PRIMARY KEY,
        building_id uuid NOT NULL CONSTRAINT fk_deficiency_entry_building REFERENCES building(id),
        deficiency_id uuid NOT NULL CONSTRAINT fk_deficiency_entry_deficiency REFERENCES deficiency(id),
        kind text NOT NULL CONSTRAINT ck_deficiency_entry_kind CHECK (kind IN ('comment', 'change')),
        text text NOT NULL DEFAULT '',
        changes jsonb NOT NULL DEFAULT '{}'::jsonb,
        user_id uuid CONSTRAINT fk_deficiency_entry_user REFERENCES app_user(id) ON DELETE SET NULL,
        user_name text NOT NULL DEFAULT '',
        at timestamptz NOT NULL,${SYNC_COLUMNS}
      );
      CREATE INDEX ix_deficiency_entry_building_version ON deficiency_entry (building_id, version);
      CREATE INDEX ix_deficiency_entry_deficiency ON deficiency_entry (deficiency_id);

      CREATE TABLE trip_event (
        id uuid PRIMARY KEY,
        building_id uuid NOT NULL CONSTRAINT fk_trip_event_building REFERENCES building(id),
        panel_id uuid NOT NULL CONSTRAINT fk_trip_event_panel REFERENCES panel(id),
        circuit_id uuid NOT NULL CONSTRAINT fk_trip_event_circuit REFERENCES circuit(id),
        occurred_at timestamptz NOT NULL,
        load_a real,
        circumstances text NOT NULL DEFAULT '',${SYNC_COLUMNS}
      );
      CREATE INDEX ix_trip_event_building_version ON trip_event (building_id, version);
      CREATE INDEX ix_trip_event_circuit ON trip_event (circuit_id);

      CREATE TABLE photo (
        id uuid PRIMARY KEY,
        building_id uuid NOT NULL CONSTRAINT fk_photo_building REFERENCES building(id),
        parent_kind text NOT NULL CONSTRAINT ck_photo_parent_kind CHECK (parent_kind IN ('reading', 'deficiency')),
        parent_id uuid NOT NULL,
        purpose text NOT NULL CONSTRAINT ck_photo_purpose CHECK (purpose IN ('thermal', 'visible', 'finding', 'repair')),
        sha256 text NOT NULL,
        bytes integer NOT NULL,
        content_type text NOT NULL,
        width integer,
        height integer,
        taken_at timestamptz NOT NULL,
        caption text NOT NULL DEFAULT '',
        uploaded boolean NOT NULL DEFAULT false,${SYNC_COLUMNS}
      );
      CREATE INDEX ix_photo_building_version ON photo (building_id, version);
      CREATE INDEX ix_photo_parent ON photo (parent_id);
    `);
  }

  public async down(q: QueryRunner): Promise<void> {
    await q.query(`
      DROP TABLE photo;
      DROP TABLE trip_event;
      DROP TABLE deficiency_entry;
      DROP TABLE deficiency;
      DROP TABLE reading;
      DROP TABLE inspection;
      ALTER TABLE circuit DROP COLUMN band_id;
      DROP TABLE curve_band;
      ALTER TABLE organisation DROP COLUMN settings;
      DELETE FROM conflict_log WHERE entity NOT IN ('building', 'panel', 'circuit');
      ALTER TABLE conflict_log DROP CONSTRAINT ck_conflict_log_entity;
      ALTER TABLE conflict_log ADD CONSTRAINT ck_conflict_log_entity
        CHECK (entity IN ('building', 'panel', 'circuit'));
    `);
  }
}
