import { Column, Entity, Index } from 'typeorm';
import type { ReadingFields } from '../../shared/records';
import { SyncColumns } from './sync-columns';

/** One measurement inside an inspection: thermal, torque, trip test or a visual finding. */
@Entity('reading')
@Index('ix_reading_building_version', ['buildingId', 'version'])
@Index('ix_reading_inspection', ['inspectionId'])
export class Reading extends SyncColumns {
  @Column('uuid', { name: 'building_id' })
  buildingId: string;

  @Column('uuid', { name: 'inspection_id' })
  inspectionId: string;

  @Column('uuid', { name: 'panel_id' })
  panelId: string;

  @Column('text')
  kind: ReadingFields['kind'];

  @Column('uuid', { name: 'circuit_id', nullable: true })
  circuitId: string | null;

  @Column('text', { default: '' })
  notes: string;

  @Column('text', { nullable: true })
  component: ReadingFields['component'];

  @Column('text', { nullable: true })
  phase: ReadingFields['phase'];

  @Column('double precision', { name: 'temperature_c', nullable: true })
  temperatureC: number | null;

  @Column('double precision', { name: 'reference_c', nullable: true })
  referenceC: number | null;

  @Column('text', { name: 'reference_basis', nullable: true })
  referenceBasis: ReadingFields['referenceBasis'];

  @Column('double precision', { name: 'load_a', nullable: true })
  loadA: number | null;

  @Column('double precision', { name: 'reference_load_a', nullable: true })
  referenceLoadA: number | null;

  /** taken during a test pulse of seconds: not thermal steady state */
  @Column('boolean', { name: 'during_test_pulse', default: false })
  duringTestPulse: boolean;

  @Column('double precision', { nullable: true })
  emissivity: number | null;

  @Column('double precision', { name: 'reflected_c', nullable: true })
  reflectedC: number | null;

  @Column('double precision', { name: 'distance_m', nullable: true })
  distanceM: number | null;

  @Column('text', { default: '' })
  camera: string;

  @Column('text', { default: '' })
  fastener: string;

  @Column('double precision', { nullable: true })
  specified: number | null;

  @Column('text', { nullable: true })
  unit: ReadingFields['unit'];

  @Column('text', { name: 'spec_source', nullable: true })
  specSource: ReadingFields['specSource'];

  @Column('text', { name: 'conductor_size', nullable: true })
  conductorSize: ReadingFields['conductorSize'];

  @Column('text', { nullable: true })
  screw: ReadingFields['screw'];

  /** slot length (slotted smaller than No. 10) or socket size across flats */
  @Column('text', { name: 'screw_size', nullable: true })
  screwSize: ReadingFields['screwSize'];

  @Column('text', { name: 'as_found', nullable: true })
  asFound: ReadingFields['asFound'];

  @Column('double precision', { name: 'as_found_value', nullable: true })
  asFoundValue: number | null;

  @Column('double precision', { name: 'as_left', nullable: true })
  asLeft: number | null;

  @Column('double precision', { name: 'test_current_a', nullable: true })
  testCurrentA: number | null;

  @Column('boolean', { nullable: true })
  tripped: boolean | null;

  @Column('double precision', { name: 'trip_time_s', nullable: true })
  tripTimeS: number | null;

  @Column('uuid', { name: 'band_id', nullable: true })
  bandId: string | null;

  @Column('text', { name: 'check_item', nullable: true })
  check: ReadingFields['check'];
}
