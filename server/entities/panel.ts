import { Column, Entity, Index } from 'typeorm';
import type { EquipmentCondition, InsulationTempC, PanelKind, PanelSystem } from '../../shared/domain';
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
