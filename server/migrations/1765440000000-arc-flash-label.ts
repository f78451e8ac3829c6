import type { MigrationInterface, QueryRunner } from 'typeorm';

/**
 * A panel's arc-flash label (shared/arc-flash.ts), a synced row of its building. The checks repeat
 * the contract's so a row written past the push (a script, a hand fix) still reads as a label:
 * one of incident energy and PPE category (NFPA 70E 130.5(H)), figures above 0.
 */
export class ArcFlashLabel1765440000000 implements MigrationInterface {
  name = 'ArcFlashLabel1765440000000';

  public async up(q: QueryRunner): Promise<void> {
    await q.query(`
      CREATE TABLE arc_flash_label (
        id uuid PRIMARY KEY,
        building_id uuid NOT NULL CONSTRAINT fk_arc_flash_label_building REFERENCES building(id),
        panel_id uuid NOT NULL CONSTRAINT fk_arc_flash_label_panel REFERENCES panel(id),
        study_date text NOT NULL,
        incident_energy_cal_cm2 double precision CONSTRAINT ck_arc_flash_label_energy CHECK (incident_energy_cal_cm2 >= 0),
        ppe_category integer CONSTRAINT ck_arc_flash_label_ppe CHECK (ppe_category BETWEEN 1 AND 4),
        boundary_in double precision NOT NULL CONSTRAINT ck_arc_flash_label_boundary CHECK (boundary_in > 0),
        working_distance_in double precision NOT NULL CONSTRAINT ck_arc_flash_label_distance CHECK (working_distance_in > 0),
        nominal_v double precision NOT NULL CONSTRAINT ck_arc_flash_label_voltage CHECK (nominal_v > 0),
        study_by text NOT NULL,
        updated_at text NOT NULL,
        updated_by uuid,
        deleted_at timestamptz,
        version bigint NOT NULL DEFAULT 0,
        field_meta jsonb NOT NULL DEFAULT '{}'::jsonb,
        CONSTRAINT ck_arc_flash_label_one_of CHECK ((incident_energy_cal_cm2 IS NULL) <> (ppe_category IS NULL))
      );
      CREATE INDEX ix_arc_flash_label_building_version ON arc_flash_label (building_id, version);
      CREATE INDEX ix_arc_flash_label_panel ON arc_flash_label (panel_id);
    `);
  }

  public async down(q: QueryRunner): Promise<void> {
    await q.query(`DROP TABLE arc_flash_label;`);
  }
}
