import type { MigrationInterface, QueryRunner } from 'typeorm';

/**
 * Fields the judgements of issue 13 need: the termination rating of a panel and a circuit's
 * override (NEC 110.14(C)); a thermal reading taken during a test pulse; the slot length or socket
 * size of a torque reading's screw (UL 486A-486B Tables I.2 and I.3). Existing panels get null:
 * "not known", which 110.14(C)(1) treats as 60 °C for circuits of 100 A or less.
 */
export class Judgements1765413000000 implements MigrationInterface {
  name = 'Judgements1765413000000';

  public async up(q: QueryRunner): Promise<void> {
    await q.query(`
      ALTER TABLE panel ADD COLUMN termination_temp_c smallint
        CONSTRAINT ck_panel_termination_temp_c CHECK (termination_temp_c IN (60, 75, 90));
      ALTER TABLE circuit ADD COLUMN termination_temp_c smallint
        CONSTRAINT ck_circuit_termination_temp_c CHECK (termination_temp_c IN (60, 75, 90));
      ALTER TABLE reading ADD COLUMN during_test_pulse boolean NOT NULL DEFAULT false;
      ALTER TABLE reading ADD COLUMN screw_size text;
    `);
  }

  public async down(q: QueryRunner): Promise<void> {
    await q.query(`
      ALTER TABLE reading DROP COLUMN screw_size;
      ALTER TABLE reading DROP COLUMN during_test_pulse;
      ALTER TABLE circuit DROP COLUMN termination_temp_c;
      ALTER TABLE panel DROP COLUMN termination_temp_c;
    `);
  }
}
