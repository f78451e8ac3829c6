import { Column, Entity, Index } from 'typeorm';
import type { DemandBasisKind, DemandUnit, EquipmentCondition, FaultSource, InsulationTempC, PanelKind, PanelSystem } from '../../shared/domain';
import { SyncColumns } from './sync-columns';

@Entity('panel')
@Index('ix_panel_building_version', ['buildingId', 'version'])
export class Panel extends SyncColumns {
  @Column('uuid', { name: 'building_id' })
  buildingId: string;

  @Column('text')
  tag: string;

  @Column('text', { default: '' })
  location: string;

  @Column('text')
  kind: PanelKind;

  @Column('text')
  system: PanelSystem;

  @Column('integer', { name: 'bus_rating_a' })
  busRatingA: number;

  /** null = main lugs only */
  @Column('integer', { name: 'main_rating_a', nullable: true })
  mainRatingA: number | null;

  @Column('double precision', { name: 'short_circuit_ka', nullable: true })
  shortCircuitKA: number | null;

  /** maximum available fault current, kA, recorded (NEC 110.24 label, utility, engineer), never computed */
  @Column('double precision', { name: 'available_fault_ka', nullable: true })
  availableFaultKA: number | null;

  @Column('date', { name: 'available_fault_on', nullable: true })
  availableFaultOn: string | null;

  @Column('text', { name: 'available_fault_source', nullable: true })
  availableFaultSource: FaultSource | null;

  /** marked as part of a tested series combination (NEC 240.86) */
  @Column('boolean', { name: 'series_rated', default: false })
  seriesRated: boolean;

  @Column('text', { name: 'series_rating_note', default: '' })
  seriesRatingNote: string;

  @Column('integer', { name: 'feeder_rating_a', nullable: true })
  feederRatingA: number | null;

  /** highest measured demand (NEC 220.87) in its unit, over its period, ending on its date */
  @Column('double precision', { name: 'peak_demand', nullable: true })
  peakDemand: number | null;

  @Column('text', { name: 'peak_demand_unit', nullable: true })
  peakDemandUnit: DemandUnit | null;

  @Column('text', { name: 'peak_demand_basis', nullable: true })
  peakDemandBasis: DemandBasisKind | null;

  @Column('date', { name: 'peak_demand_on', nullable: true })
  peakDemandOn: string | null;

  /** clamp readings per phase and neutral, A, taken on measuredOn */
  @Column('double precision', { name: 'measured_a', nullable: true })
  measuredA: number | null;

  @Column('double precision', { name: 'measured_b', nullable: true })
  measuredB: number | null;

  @Column('double precision', { name: 'measured_c', nullable: true })
  measuredC: number | null;

  @Column('double precision', { name: 'measured_n', nullable: true })
  measuredN: number | null;

  @Column('date', { name: 'measured_on', nullable: true })
  measuredOn: string | null;

  /** the temperature its terminations are listed and marked for; null = not known (NEC 110.14(C)(1)) */
  @Column('smallint', { name: 'termination_temp_c', nullable: true })
  terminationTempC: InsulationTempC | null;

  @Column('integer')
  spaces: number;

  @Column('uuid', { name: 'fed_from_panel_id', nullable: true })
  fedFromPanelId: string | null;

  @Column('integer', { name: 'fed_from_position', nullable: true })
  fedFromPosition: number | null;

  @Column('text', { default: '' })
  maker: string;

  @Column('text', { default: '' })
  model: string;

  @Column('date', { name: 'installed_on', nullable: true })
  installedOn: string | null;

  /** NFPA 70B (2023) equipment condition 1–3 */
  @Column('smallint', { default: 1 })
  condition: EquipmentCondition;
}
