import type { MigrationInterface, QueryRunner } from 'typeorm';

/**
 * Measured values were `real` (float4, about 7 significant digits): a length of 363.000362 ft came
 * back as 363.00037. `double precision` holds every value a JavaScript number (float8) can, so
 * what a device sends is what it reads back. Widening float4 → float8 keeps every stored value.
 */
const EXACT_COLUMNS: Record<string, string[]> = {
  panel: ['short_circuit_ka'],
  circuit: ['load_va', 'length_ft'],
  inspection: ['ambient_c', 'load_pct'],
  reading: [
    'temperature_c',
    'reference_c',
    'load_a',
    'reference_load_a',
    'specified',
    'as_found_value',
    'as_left',
    'test_current_a',
    'trip_time_s',
  ],
  trip_event: ['load_a'],
  curve_band: ['instantaneous_multiple', 'instantaneous_tolerance_pct'],
};

function alter(type: string): string {
  return Object.entries(EXACT_COLUMNS)
    .map(([table, columns]) => `ALTER TABLE ${table} ${columns.map((c) => `ALTER COLUMN ${c} TYPE ${type}`).join(', ')};`)
    .join('\n');
}

export class ExactNumbers1765410000000 implements MigrationInterface {
  name = 'ExactNumbers1765410000000';

  public async up(q: QueryRunner): Promise<void> {
    await q.query(alter('double precision'));
  }

  public async down(q: QueryRunner): Promise<void> {
    await q.query(alter('real'));
  }
}
