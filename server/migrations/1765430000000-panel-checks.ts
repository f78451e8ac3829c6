import type { MigrationInterface, QueryRunner } from 'typeorm';

/**
 * Fields the panel checks of issue 13 record (items 7–11, 13): a panel's available fault current
 * with its date and source (NEC 110.24), series rating (240.86), feeder rating and measured peak
 * demand (220.87), and its clamp readings per phase; a circuit's breaker identity and interrupting
 * rating (110.9), ambient and conductor count (310.15(B)(1), (C)(1)) and who verified it at the
 * panel; a thermal reading's camera settings; photos of a circuit or a panel. Measured values are
 * double precision (see 1765410000000). Existing rows get null / empty: "not recorded".
 */
export class PanelChecks1765430000000 implements MigrationInterface {
  name = 'PanelChecks1765430000000';

  public async up(q: QueryRunner): Promise<void> {
    await q.query(`
      ALTER TABLE panel
        ADD COLUMN available_fault_ka double precision,
        ADD COLUMN available_fault_on date,
        ADD COLUMN available_fault_source text
          CONSTRAINT ck_panel_available_fault_source CHECK (available_fault_source IN ('label', 'utility', 'engineer')),
        ADD COLUMN series_rated boolean NOT NULL DEFAULT false,
        ADD COLUMN series_rating_note text NOT NULL DEFAULT '',
        ADD COLUMN feeder_rating_a integer,
        ADD COLUMN peak_demand double precision,
        ADD COLUMN peak_demand_unit text CONSTRAINT ck_panel_peak_demand_unit CHECK (peak_demand_unit IN ('A', 'kVA')),
        ADD COLUMN peak_demand_basis text CONSTRAINT ck_panel_peak_demand_basis CHECK (peak_demand_basis IN ('year', '30-day')),
        ADD COLUMN peak_demand_on date,
        ADD COLUMN measured_a double precision,
        ADD COLUMN measured_b double precision,
        ADD COLUMN measured_c double precision,
        ADD COLUMN measured_n double precision,
        ADD COLUMN measured_on date;
      ALTER TABLE circuit
        ADD COLUMN interrupting_ka double precision,
        ADD COLUMN breaker_make text NOT NULL DEFAULT '',
        ADD COLUMN catalogue_number text NOT NULL DEFAULT '',
        ADD COLUMN ambient_c double precision,
        ADD COLUMN current_carrying smallint,
        ADD COLUMN verified_on date,
        ADD COLUMN verified_by uuid;
      ALTER TABLE reading
        ADD COLUMN emissivity double precision,
        ADD COLUMN reflected_c double precision,
        ADD COLUMN distance_m double precision,
        ADD COLUMN camera text NOT NULL DEFAULT '';
      ALTER TABLE photo DROP CONSTRAINT ck_photo_parent_kind;
      ALTER TABLE photo ADD CONSTRAINT ck_photo_parent_kind CHECK (parent_kind IN ('reading', 'deficiency', 'circuit', 'panel'));
      ALTER TABLE photo DROP CONSTRAINT ck_photo_purpose;
      ALTER TABLE photo ADD CONSTRAINT ck_photo_purpose CHECK (purpose IN ('thermal', 'visible', 'finding', 'repair', 'equipment'));
    `);
  }

  public async down(q: QueryRunner): Promise<void> {
    await q.query(`
      DELETE FROM photo WHERE parent_kind IN ('circuit', 'panel') OR purpose = 'equipment';
      ALTER TABLE photo DROP CONSTRAINT ck_photo_purpose;
      ALTER TABLE photo ADD CONSTRAINT ck_photo_purpose CHECK (purpose IN ('thermal', 'visible', 'finding', 'repair'));
      ALTER TABLE photo DROP CONSTRAINT ck_photo_parent_kind;
      ALTER TABLE photo ADD CONSTRAINT ck_photo_parent_kind CHECK (parent_kind IN ('reading', 'deficiency'));
      ALTER TABLE reading DROP COLUMN emissivity, DROP COLUMN reflected_c, DROP COLUMN distance_m, DROP COLUMN camera;
      ALTER TABLE circuit DROP COLUMN interrupting_ka, DROP COLUMN breaker_make, DROP COLUMN catalogue_number,
        DROP COLUMN ambient_c, DROP COLUMN current_carrying, DROP COLUMN verified_on, DROP COLUMN verified_by;
      ALTER TABLE panel DROP COLUMN available_fault_ka, DROP COLUMN available_fault_on, DROP COLUMN available_fault_source,
        DROP COLUMN series_rated, DROP COLUMN series_rating_note, DROP COLUMN feeder_rating_a, DROP COLUMN peak_demand,
        DROP COLUMN peak_demand_unit, DROP COLUMN peak_demand_basis, DROP COLUMN peak_demand_on, DROP COLUMN measured_a,
        DROP COLUMN measured_b, DROP COLUMN measured_c, DROP COLUMN measured_n, DROP COLUMN measured_on;
    `);
  }
}
