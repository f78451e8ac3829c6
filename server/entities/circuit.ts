import { Column, Entity, Index } from 'typeorm';
import type {
  BreakerType,
  CircuitStatus,
  ConductorMaterial,
  ConductorSize,
  InsulationTempC,
  LoadKind,
} from '../../shared/domain';
import { SyncColumns } from './sync-columns';

@Entity('circuit')
@Index('ix_circuit_panel_position', ['panelId', 'position'])
@Index('ix_circuit_building_version', ['buildingId', 'version'])
export class Circuit extends SyncColumns {
  @Column('uuid', { name: 'panel_id' })
  panelId: string;

  /** denormalised so a building's rows can be pulled by version without a join */
  @Column('uuid', { name: 'building_id' })
  buildingId: string;

  /** starting position; a 2-pole at n occupies n and n+2 */
  @Column('integer')
  position: number;

  @Column('smallint')
  poles: 1 | 2 | 3;

  @Column('integer', { name: 'rating_a', nullable: true })
  ratingA: number | null;

  @Column('text', { name: 'breaker_type' })
  breakerType: BreakerType;

  @Column('text', { default: '' })
  description: string;

  @Column('text', { name: 'load_kind' })
  loadKind: LoadKind;

  @Column('double precision', { name: 'load_va', nullable: true })
  loadVA: number | null;

  @Column('boolean', { default: false })
  continuous: boolean;

  @Column('text', { name: 'conductor_size', nullable: true })
  conductorSize: ConductorSize | null;

  @Column('text', { name: 'conductor_material', nullable: true })
  conductorMaterial: ConductorMaterial | null;

  @Column('smallint', { name: 'insulation_temp_c', nullable: true })
  insulationTempC: InsulationTempC | null;

  /** this breaker's termination rating when it differs from the panel's; null = the panel's */
  @Column('smallint', { name: 'termination_temp_c', nullable: true })
  terminationTempC: InsulationTempC | null;

  @Column('double precision', { name: 'length_ft', nullable: true })
  lengthFt: number | null;

  @Column('text')
  status: CircuitStatus;

  @Column('uuid', { name: 'feeds_panel_id', nullable: true })
  feedsPanelId: string | null;

  @Column('boolean', { name: 'handle_lock', default: false })
  handleLock: boolean;

  @Column('text', { default: '' })
  notes: string;

  /** the time-current band (organisation library) its trip tests are judged against */
  @Column('uuid', { name: 'band_id', nullable: true })
  bandId: string | null;

  /** the breaker's interrupting rating, kA (NEC 110.9) */
  @Column('double precision', { name: 'interrupting_ka', nullable: true })
  interruptingKA: number | null;

  @Column('text', { name: 'breaker_make', default: '' })
  breakerMake: string;

  @Column('text', { name: 'catalogue_number', default: '' })
  catalogueNumber: string;

  /** ambient where the conductors run, °C (NEC Table 310.15(B)(1)); null = 30 °C */
  @Column('double precision', { name: 'ambient_c', nullable: true })
  ambientC: number | null;

  /** current-carrying conductors together (NEC Table 310.15(C)(1)); null = 3 or fewer */
  @Column('smallint', { name: 'current_carrying', nullable: true })
  currentCarrying: number | null;

  /** traced at the panel on this date by this person of the organisation */
  @Column('date', { name: 'verified_on', nullable: true })
  verifiedOn: string | null;

  @Column('uuid', { name: 'verified_by', nullable: true })
  verifiedBy: string | null;
}
